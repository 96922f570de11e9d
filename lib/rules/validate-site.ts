import { SENSOR_RANGES } from "@/lib/catalogue/sensor-ranges";
import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import type { RuleGraph } from "./graph";
import { TRIGGER_REPORT } from "./trigger-key";
import type { Problem, SiteContext } from "./validate";

/** What each kind of sensor can measure: beyond it the threshold never trips (common practice for indoor sensors, no source). */

const REPORT_WORDS: Record<string, string> = {
  press: "button presses",
  release: "button releases",
  "long-press": "long presses",
  turn: "door-handle turns",
  motion: "motion",
  "light-level": "light levels",
  contact: "door or window contact changes",
  temperature: "temperature",
  humidity: "humidity",
  "fire-alarm": "fire-alarm signals",
};

const ACCEPT_WORDS: Record<string, string> = { level: "a light level", relay: "relay on/off" };

/** Checks the graph against the site: devices exist and can do what is asked, thresholds are measurable. */
export function validateAgainstSite(graph: RuleGraph, site: SiteContext): Problem[] {
  const problems: Problem[] = [];
  const devices = new Map(site.devices.map((d) => [d.id, d]));
  const zones = new Map(site.zones.map((z) => [z.id, z]));
  const name = (id: string) => devices.get(id)?.name ?? id;
  const add = (nodeId: string, severity: Problem["severity"], message: string) => problems.push({ nodeId, severity, message });

  const needReport = (nodeId: string, deviceId: string, report: string) => {
    const d = devices.get(deviceId);
    if (!d) return add(nodeId, "error", `The device "${deviceId}" is not on this site.`);
    const info = DEVICE_KIND_INFO[d.kind];
    if (!info.reports.includes(report)) add(nodeId, "error", `${name(deviceId)} (${info.label.toLowerCase()}) cannot report ${REPORT_WORDS[report] ?? report}.`);
  };
  const needAccept = (nodeId: string, deviceId: string, accept: string) => {
    const d = devices.get(deviceId);
    if (!d) return add(nodeId, "error", `The device "${deviceId}" is not on this site.`);
    const info = DEVICE_KIND_INFO[d.kind];
    if (!info.accepts.includes(accept)) add(nodeId, "error", `${name(deviceId)} (${info.label.toLowerCase()}) cannot take ${ACCEPT_WORDS[accept] ?? accept}.`);
  };
  const needZone = (nodeId: string, zoneId: string, needLights: boolean) => {
    if (!zones.has(zoneId)) return add(nodeId, "error", `The zone "${zoneId}" is not on this site.`);
    const lit = site.devices.some((d) => d.zoneId === zoneId && DEVICE_KIND_INFO[d.kind].accepts.includes("level"));
    if (needLights && !lit) add(nodeId, "warning", `${zones.get(zoneId)?.name ?? zoneId} has no luminaires, so this does nothing.`);
  };
  const inRange = (nodeId: string, value: number, range: (typeof SENSOR_RANGES)[keyof typeof SENSOR_RANGES], margin = 0, side: "above" | "below" = "below") => {
    if (value < range.min || value > range.max) {
      return add(nodeId, "error", `${value} ${range.unit} is outside what the sensor measures (${range.min} to ${range.max} ${range.unit}), so this never trips.`);
    }
    const rearm = side === "below" ? value + margin : value - margin;
    if (rearm < range.min || rearm > range.max) add(nodeId, "warning", `With a margin of ${margin} ${range.unit} the reading must reach ${rearm} ${range.unit} before this can trip again, which the sensor cannot measure.`);
  };

  for (const n of graph.nodes) {
    if (n.kind === "trigger") {
      const report = TRIGGER_REPORT[n.type];
      if (report && "device" in n.params) needReport(n.id, n.params.device, report);
      const side = n.type.endsWith("-above") ? "above" : "below";
      if (n.type === "light-level-below" || n.type === "light-level-above") inRange(n.id, n.params.lux, SENSOR_RANGES.lux, n.params.hysteresisLux, side);
      if (n.type === "temperature-above" || n.type === "temperature-below") inRange(n.id, n.params.celsius, SENSOR_RANGES.celsius, n.params.hysteresis, side);
      if (n.type === "humidity-above" || n.type === "humidity-below") inRange(n.id, n.params.percent, SENSOR_RANGES.percent, n.params.hysteresis, side);
    } else if (n.kind === "gate") {
      if (n.type === "light-level-below") {
        needReport(n.id, n.params.device, "light-level");
        inRange(n.id, n.params.lux, SENSOR_RANGES.lux);
      }
      if (n.type === "zone-occupied" || n.type === "zone-vacant") {
        needZone(n.id, n.params.zone, false);
        const sensed = site.devices.some((d) => d.zoneId === n.params.zone && DEVICE_KIND_INFO[d.kind].reports.includes("motion"));
        if (zones.has(n.params.zone) && !sensed) add(n.id, "warning", `${zones.get(n.params.zone)?.name ?? n.params.zone} has no motion sensor, so it always counts as vacant.`);
      }
      if (n.type === "time-window" && JSON.stringify(n.params.from) === JSON.stringify(n.params.to)) {
        add(n.id, "warning", "The window starts and ends at the same time, so it never lets anything through.");
      }
    } else {
      const p = n.params as Record<string, unknown>;
      if (n.type === "set-level") {
        const t = n.params.target;
        if ("zone" in t) needZone(n.id, t.zone, true);
        else needAccept(n.id, t.device, "level");
      }
      if (n.type === "toggle-zone" || n.type === "hold-zone") needZone(n.id, n.params.zone, true);
      if (n.type === "relay-on" || n.type === "relay-off" || n.type === "relay-on-for") needAccept(n.id, n.params.device, "relay");
      if ((n.type === "recall-scene" || n.type === "latch-emergency") && site.scenes && !site.scenes.some((s) => s.number === p.scene)) {
        add(n.id, n.type === "latch-emergency" ? "error" : "warning", `Scene ${String(p.scene)} is not set up on this site.`);
      }
    }
  }
  return problems;
}
