import { DEVICE_KIND_INFO, type DeviceKind } from "@/lib/catalogue/device-kinds";
import type { ActionType, GateType, RuleNode, TriggerType } from "./graph";
import { TRIGGER_REPORT } from "./trigger-key";

/**
 * The Canvas palette: which node kinds a site can actually use, given its
 * devices, zones and scenes, and a complete starting node for each, so a node
 * dropped on the Canvas is valid data from the first moment and only its
 * connections (or the person's choices) are left to do.
 */
export type PaletteSite = {
  devices: { id: string; name: string; kind: DeviceKind; zoneId: string | null; buttons?: number }[];
  zones: { id: string; name: string }[];
  scenes: { number: number; name: string }[];
  people: { id: string; name: string; role: string }[];
};

export type NodeKind = RuleNode["kind"];
export type NodeType = TriggerType | GateType | ActionType;
export type PaletteEntry = { kind: NodeKind; type: NodeType; label: string; hint: string };

export const TRIGGER_LABELS: Record<TriggerType, { label: string; hint: string }> = {
  "rocker-press": { label: "Rocker press", hint: "a button of a rocker switch is pressed" },
  "rocker-release": { label: "Rocker release", hint: "a rocker button is let go" },
  "rocker-long-press": { label: "Rocker hold", hint: "a rocker button is held down" },
  "call-button-press": { label: "Call button", hint: "someone presses a call button" },
  "door-handle-turn": { label: "Handle turned", hint: "a kinetic door handle is turned" },
  "motion-detected": { label: "Motion", hint: "a sensor sees movement" },
  vacancy: { label: "No motion for…", hint: "a sensor sees nobody for some minutes" },
  "light-level-below": { label: "Light level below", hint: "daylight falls below a level" },
  "light-level-above": { label: "Light level above", hint: "daylight rises above a level" },
  "contact-opened": { label: "Door opened", hint: "a door or window contact opens" },
  "contact-closed": { label: "Door closed", hint: "a door or window contact closes" },
  "contact-left-open": { label: "Left open", hint: "a door or window stays open for some minutes" },
  "temperature-above": { label: "Warmer than", hint: "temperature rises above a value" },
  "temperature-below": { label: "Cooler than", hint: "temperature falls below a value" },
  "humidity-above": { label: "Damper than", hint: "relative humidity rises above a value" },
  "humidity-below": { label: "Drier than", hint: "relative humidity falls below a value" },
  "fire-alarm-active": { label: "Fire alarm on", hint: "the fire-alarm input goes active" },
  "fire-alarm-cleared": { label: "Fire alarm cleared", hint: "the fire-alarm input clears" },
  "time-of-day": { label: "At a time", hint: "a clock time, or sunrise/sunset" },
  "site-mode-changed": { label: "Site mode changes", hint: "the site mode becomes a given one" },
  "timer-fired": { label: "Timer runs out", hint: "a named timer started by an action ends" },
};

export const GATE_LABELS: Record<GateType, { label: string; hint: string }> = {
  "time-window": { label: "Between times", hint: "only between two times of day" },
  "days-of-week": { label: "On days", hint: "only on some days of the week" },
  "light-level-below": { label: "Darker than", hint: "only while a light sensor reads below a level" },
  "zone-occupied": { label: "Zone occupied", hint: "only while someone is in a zone" },
  "zone-vacant": { label: "Zone vacant", hint: "only while a zone is empty" },
  "site-mode-is": { label: "Site mode is", hint: "only in some site modes" },
  "emergency-not-active": { label: "No emergency", hint: "only while no emergency is latched" },
};

export const ACTION_LABELS: Record<ActionType, { label: string; hint: string }> = {
  "recall-scene": { label: "Recall scene", hint: "recall one of the site's scenes" },
  "set-level": { label: "Set level", hint: "set a zone or a luminaire to a level" },
  "toggle-zone": { label: "Toggle zone", hint: "off when lit, otherwise on" },
  "relay-on": { label: "Relay on", hint: "switch a relay (fan or other load) on" },
  "relay-off": { label: "Relay off", hint: "switch a relay off" },
  "relay-on-for": { label: "Relay on for…", hint: "switch a relay on for some minutes" },
  notice: { label: "Notice", hint: "send people a notice (push, in-app, e-mail)" },
  "start-timer": { label: "Start timer", hint: "start a named timer" },
  "cancel-timer": { label: "Cancel timer", hint: "stop a named timer" },
  "latch-emergency": { label: "Latch emergency", hint: "emergency scene, latched until cleared" },
  "clear-emergency": { label: "Clear emergency", hint: "release a latched emergency" },
  "set-site-mode": { label: "Set site mode", hint: "change the site mode (open, closed …)" },
  "hold-zone": { label: "Hold zone", hint: "keep a zone as it is for some minutes" },
};

export function typeLabel(kind: NodeKind, type: string): string {
  const table: Record<string, { label: string }> = kind === "trigger" ? TRIGGER_LABELS : kind === "gate" ? GATE_LABELS : ACTION_LABELS;
  return table[type]?.label ?? type;
}

/** What a device must report (triggers, light gate) or accept (actions) to fill a node's `device` field. */
export function deviceNeed(kind: NodeKind, type: string): { reports?: string; accepts?: string } | null {
  if (kind === "trigger") {
    const report = TRIGGER_REPORT[type as TriggerType];
    return report ? { reports: report } : null;
  }
  if (kind === "gate") return type === "light-level-below" ? { reports: "light-level" } : null;
  if (type === "relay-on" || type === "relay-off" || type === "relay-on-for") return { accepts: "relay" };
  if (type === "set-level") return { accepts: "level" };
  return null;
}

/** The site's devices that fit a node's device field, in the site's order. */
export function devicesFor(site: PaletteSite, kind: NodeKind, type: string) {
  const need = deviceNeed(kind, type);
  if (!need) return [];
  return site.devices.filter((d) => {
    const info = DEVICE_KIND_INFO[d.kind];
    // A call button reports "press" like a rocker, but rocker triggers need buttons to choose from.
    if (type.startsWith("rocker-") && d.kind !== "kinetic-rocker") return false;
    if (type === "call-button-press" && d.kind !== "kinetic-call-button") return false;
    return need.reports ? info.reports.includes(need.reports) : info.accepts.includes(need.accepts!);
  });
}

const litZones = (site: PaletteSite) => site.zones.filter((z) => site.devices.some((d) => d.zoneId === z.id && DEVICE_KIND_INFO[d.kind].accepts.includes("level")));

/** Every node kind this site can use, grouped Trigger → Gate → Action, in a stable order. */
export function paletteFor(site: PaletteSite): PaletteEntry[] {
  const out: PaletteEntry[] = [];
  for (const [type, { label, hint }] of Object.entries(TRIGGER_LABELS) as [TriggerType, { label: string; hint: string }][]) {
    if (TRIGGER_REPORT[type] && devicesFor(site, "trigger", type).length === 0) continue;
    out.push({ kind: "trigger", type, label, hint });
  }
  for (const [type, { label, hint }] of Object.entries(GATE_LABELS) as [GateType, { label: string; hint: string }][]) {
    if (type === "light-level-below" && devicesFor(site, "gate", type).length === 0) continue;
    if ((type === "zone-occupied" || type === "zone-vacant") && site.zones.length === 0) continue;
    out.push({ kind: "gate", type, label, hint });
  }
  for (const [type, { label, hint }] of Object.entries(ACTION_LABELS) as [ActionType, { label: string; hint: string }][]) {
    if ((type === "recall-scene" || type === "latch-emergency") && site.scenes.length === 0) continue;
    if ((type === "toggle-zone" || type === "hold-zone") && litZones(site).length === 0) continue;
    if (type === "set-level" && litZones(site).length === 0 && devicesFor(site, "action", type).length === 0) continue;
    if (type.startsWith("relay-") && devicesFor(site, "action", type).length === 0) continue;
    out.push({ kind: "action", type, label, hint });
  }
  return out;
}

/**
 * A complete node of the given type with sensible first choices (the first
 * fitting device, zone or scene; common thresholds). Null when the site has
 * nothing the node could point at.
 */
export function newNode(site: PaletteSite, kind: NodeKind, type: NodeType, id: string, position: { x: number; y: number }): RuleNode | null {
  const device = devicesFor(site, kind, type)[0]?.id;
  const zone = (kind === "action" ? litZones(site)[0] : site.zones[0])?.id;
  const scene = site.scenes[0]?.number;
  const params = defaultParams(kind, type, { device, zone, scene });
  if (params === null) return null;
  return { id, kind, type, params, position } as RuleNode;
}

function defaultParams(kind: NodeKind, type: string, pick: { device?: string; zone?: string; scene?: number }): Record<string, unknown> | null {
  const { device, zone, scene } = pick;
  const needs = (v: unknown) => v === undefined;
  if (kind === "trigger") {
    if (TRIGGER_REPORT[type as TriggerType] && needs(device)) return null;
    switch (type) {
      case "rocker-press":
      case "rocker-release":
      case "rocker-long-press":
        return { device, button: 1 };
      case "vacancy":
        return { device, minutes: 5 };
      case "contact-left-open":
        return { device, minutes: 10 };
      case "light-level-below":
      case "light-level-above":
        return { device, lux: 200, hysteresisLux: 20 };
      case "temperature-above":
      case "temperature-below":
        return { device, celsius: type === "temperature-above" ? 28 : 18, hysteresis: 0.5 };
      case "humidity-above":
      case "humidity-below":
        return { device, percent: type === "humidity-above" ? 65 : 35, hysteresis: 2 };
      case "time-of-day":
        return { at: { kind: "fixed", time: "07:00" } };
      case "site-mode-changed":
        return { mode: "closed" };
      case "timer-fired":
        return { name: "timer" };
      default:
        return { device };
    }
  }
  if (kind === "gate") {
    switch (type) {
      case "time-window":
        return { from: { kind: "sunset", offsetMinutes: 0 }, to: { kind: "fixed", time: "06:00" } };
      case "days-of-week":
        return { days: ["mon", "tue", "wed", "thu", "fri"] };
      case "light-level-below":
        return needs(device) ? null : { device, lux: 50 };
      case "zone-occupied":
      case "zone-vacant":
        return needs(zone) ? null : { zone };
      case "site-mode-is":
        return { modes: ["closed"] };
      default:
        return {};
    }
  }
  switch (type) {
    case "recall-scene":
      return needs(scene) ? null : { scene };
    case "latch-emergency":
      return needs(scene) ? null : { scene, othersOff: true };
    case "set-level":
      if (zone) return { target: { zone }, level: 100 };
      return needs(device) ? null : { target: { device }, level: 100 };
    case "toggle-zone":
      return needs(zone) ? null : { zone, level: 100 };
    case "hold-zone":
      return needs(zone) ? null : { zone, minutes: 30 };
    case "relay-on":
    case "relay-off":
      return needs(device) ? null : { device };
    case "relay-on-for":
      return needs(device) ? null : { device, minutes: 15 };
    case "notice":
      return { to: { role: "manager" }, channels: ["push", "in-app"], text: "{device} at {time}." };
    case "start-timer":
      return { name: "timer", minutes: 10 };
    case "cancel-timer":
      return { name: "timer" };
    case "set-site-mode":
      return { mode: "closed" };
    default:
      return {};
  }
}
