import { describe, expect, it } from "vitest";
import { demoDevices, demoSite, demoZones } from "@/db/seed/demo-site";
import { createReplayEngine } from "@/lib/bus/engine";
import { deviceEventSchema } from "@/lib/bus/event";
import { toSiteInput } from "@/lib/bus/site-input";
import type { DeviceEvent, Step } from "@/lib/bus/types";
import { compileGraph } from "@/lib/rules/compile";
import { demoScenes } from "@/lib/rules/demo-graph";
import { chainEdges, parseRuleGraph, type RuleGraphInput } from "@/lib/rules/graph";

type TriggerInput = Extract<RuleGraphInput["nodes"][number], { kind: "trigger" }> extends infer T ? (T extends unknown ? Omit<T, "id" | "kind"> : never) : never;
const dev = (key: string) => `larch-lane-dev-${key}`;
const HANDLE = { id: dev("handle-back"), siteId: "larch-lane", name: "Back door handle", kind: "kinetic-door-handle" as const, zoneId: "larch-lane-zone-back", unicastAddress: 0x0100 };
const site = toSiteInput({ site: demoSite, devices: [...demoDevices, HANDLE], zones: demoZones, scenes: demoScenes });
// Thursday 2024-06-20, 08:00 in the demo site's zone (WET, summer time +1).
const T0 = Date.UTC(2024, 5, 20, 7, 0);
const MIN = 60_000;

/** One trigger straight to a notice, so firing is visible as a notice naming the rule. */
function engineFor(trigger: TriggerInput) {
  const graph = parseRuleGraph({
    nodes: [
      { id: "t", kind: "trigger", ...trigger },
      { id: "a", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "{device} in {zone} at {time}" } },
    ],
    edges: chainEdges("t", "a"),
  });
  const engine = createReplayEngine({ ...site, rules: compileGraph(graph) });
  let n = 0;
  const send = (minutes: number, device: string, kind: string, value: DeviceEvent["value"]) =>
    engine.ingest({ id: `e${n++}`, siteId: "larch-lane", at: T0 + minutes * MIN, device: dev(device), kind, value });
  return { engine, send };
}

const fired = (step: Step) => step.notices.length;

describe("triggers", () => {
  it("rocker press, release and long press match their button only", () => {
    const press = engineFor({ type: "rocker-press", params: { device: dev("rocker-shop-door"), button: 2 } });
    expect(fired(press.send(0, "rocker-shop-door", "press", 1))).toBe(0);
    expect(fired(press.send(1, "rocker-shop-door", "press", 2))).toBe(1);
    const release = engineFor({ type: "rocker-release", params: { device: dev("rocker-flat"), button: 1 } });
    expect(fired(release.send(0, "rocker-flat", "press", 1))).toBe(0);
    expect(fired(release.send(0.01, "rocker-flat", "release", 1))).toBe(1);
  });

  it("tells a long press from a short one by the hold, or takes the switch's own long-press report", () => {
    const long = engineFor({ type: "rocker-long-press", params: { device: dev("rocker-flat"), button: 4 } });
    long.send(0, "rocker-flat", "press", 4);
    expect(fired(long.send(500 / MIN, "rocker-flat", "release", 4))).toBe(0);
    long.send(1, "rocker-flat", "press", 4);
    expect(fired(long.send(1 + 1_500 / MIN, "rocker-flat", "release", 4))).toBe(1);
    expect(fired(long.send(2, "rocker-flat", "long-press", 4))).toBe(1);
  });

  it("call button and door handle", () => {
    expect(fired(engineFor({ type: "call-button-press", params: { device: dev("call-counter") } }).send(0, "call-counter", "press", null))).toBe(1);
    const handle = engineFor({ type: "door-handle-turn", params: { device: HANDLE.id } });
    const step = handle.send(0, "handle-back", "turn", null);
    expect(step.notices[0].text).toBe("Back door handle in Back door at 08:00");
  });

  it("motion detected fires on each motion report, not on a no-motion report", () => {
    const m = engineFor({ type: "motion-detected", params: { device: dev("sensor-path") } });
    expect(fired(m.send(0, "sensor-path", "motion", true))).toBe(1);
    expect(fired(m.send(1, "sensor-path", "motion", false))).toBe(0);
    expect(fired(m.send(2, "sensor-path", "motion", true))).toBe(1);
  });

  it("vacancy fires N minutes after the last motion, restarting on each motion", () => {
    const v = engineFor({ type: "vacancy", params: { device: dev("sensor-path"), minutes: 3 } });
    v.send(0, "sensor-path", "motion", true);
    v.send(2, "sensor-path", "motion", true);
    expect(fired(v.engine.advanceTo(T0 + 4.9 * MIN))).toBe(0);
    const step = v.engine.advanceTo(T0 + 6 * MIN);
    expect(fired(step)).toBe(1);
    expect(step.notices[0].at).toBe(T0 + 5 * MIN);
  });

  it("light level below fires once per crossing and re-arms only past the margin", () => {
    const l = engineFor({ type: "light-level-below", params: { device: dev("lux-window"), lux: 100, hysteresisLux: 20 } });
    const readings = [150, 90, 80, 110, 95, 125, 90];
    expect(readings.map((lux, i) => fired(l.send(i, "lux-window", "light-level", lux)))).toEqual([0, 1, 0, 0, 0, 0, 1]);
  });

  it("light level above mirrors it", () => {
    const l = engineFor({ type: "light-level-above", params: { device: dev("sensor-path"), lux: 500, hysteresisLux: 50 } });
    const readings = [510, 600, 460, 520, 450, 501];
    expect(readings.map((lux, i) => fired(l.send(i, "sensor-path", "light-level", lux)))).toEqual([1, 0, 0, 0, 0, 1]);
  });

  it("temperature and humidity thresholds with hysteresis", () => {
    const hot = engineFor({ type: "temperature-above", params: { device: dev("climate-workshop"), celsius: 28, hysteresis: 1 } });
    expect([27, 29, 28.5, 27.5, 29, 27, 29].map((c, i) => fired(hot.send(i, "climate-workshop", "temperature", c)))).toEqual([0, 1, 0, 0, 0, 0, 1]);
    const cold = engineFor({ type: "temperature-below", params: { device: dev("climate-case-a"), celsius: 16, hysteresis: 0.5 } });
    expect([18, 15.9, 16.2, 16.5, 15].map((c, i) => fired(cold.send(i, "climate-case-a", "temperature", c)))).toEqual([0, 1, 0, 0, 1]);
    const damp = engineFor({ type: "humidity-above", params: { device: dev("climate-workshop"), percent: 65, hysteresis: 3 } });
    expect([60, 66, 63, 62, 70].map((p, i) => fired(damp.send(i, "climate-workshop", "humidity", p)))).toEqual([0, 1, 0, 0, 1]);
    const dry = engineFor({ type: "humidity-below", params: { device: dev("climate-case-b"), percent: 40, hysteresis: 2 } });
    expect([45, 39, 41, 42, 38].map((p, i) => fired(dry.send(i, "climate-case-b", "humidity", p)))).toEqual([0, 1, 0, 0, 1]);
  });

  it("contact opened and closed fire on changes only", () => {
    const opened = engineFor({ type: "contact-opened", params: { device: dev("contact-back") } });
    expect(["open", "open", "closed", "open"].map((v, i) => fired(opened.send(i, "contact-back", "contact", v)))).toEqual([1, 0, 0, 1]);
    const closed = engineFor({ type: "contact-closed", params: { device: dev("contact-back") } });
    expect([true, false, false].map((v, i) => fired(closed.send(i, "contact-back", "contact", v)))).toEqual([0, 1, 0]);
  });

  it("contact left open fires N minutes after opening unless closed first", () => {
    const c = engineFor({ type: "contact-left-open", params: { device: dev("contact-back"), minutes: 10 } });
    c.send(0, "contact-back", "contact", "open");
    c.send(5, "contact-back", "contact", "closed");
    expect(fired(c.engine.advanceTo(T0 + 20 * MIN))).toBe(0);
    c.send(30, "contact-back", "contact", "open");
    const step = c.engine.advanceTo(T0 + 45 * MIN);
    expect(step.notices.map((n) => n.at)).toEqual([T0 + 40 * MIN]);
    expect(step.trace[0].trigger.type).toBe("contact-left-open");
  });

  it("fire alarm active and cleared follow the input's changes", () => {
    const active = engineFor({ type: "fire-alarm-active", params: { device: dev("fire-input") } });
    expect([true, true, false, "active"].map((v, i) => fired(active.send(i, "fire-input", "fire-alarm", v)))).toEqual([1, 0, 0, 1]);
    const cleared = engineFor({ type: "fire-alarm-cleared", params: { device: dev("fire-input") } });
    expect([true, false, false].map((v, i) => fired(cleared.send(i, "fire-input", "fire-alarm", v)))).toEqual([0, 1, 0]);
  });

  it("time of day fires daily at a fixed local time", () => {
    const t = engineFor({ type: "time-of-day", params: { at: { kind: "fixed", time: "18:00" } } });
    t.engine.advanceTo(T0);
    const step = t.engine.advanceTo(T0 + 2 * 24 * 60 * MIN);
    // WET in summer is UTC+1, so 18:00 local is 17:00 UTC.
    expect(step.notices.map((n) => n.at)).toEqual([Date.UTC(2024, 5, 20, 17), Date.UTC(2024, 5, 21, 17)]);
  });

  it("time of day follows sunset with an offset", () => {
    const t = engineFor({ type: "time-of-day", params: { at: { kind: "sunset", offsetMinutes: -30 } } });
    t.engine.advanceTo(T0);
    const step = t.engine.advanceTo(T0 + 24 * 60 * MIN);
    // Common practice, no source: at 51.2 N 2.1 W midsummer sunset is about 20:30 UTC, so the trigger is near 20:00 UTC.
    expect(step.notices).toHaveLength(1);
    expect(step.notices[0].at).toBeGreaterThan(Date.UTC(2024, 5, 20, 19, 45));
    expect(step.notices[0].at).toBeLessThan(Date.UTC(2024, 5, 20, 20, 15));
  });

  it("site mode changed fires for its mode, or for any change", () => {
    const graph = parseRuleGraph({
      nodes: [
        { id: "t-press", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-shop-door"), button: 3 } },
        { id: "a-mode", kind: "action", type: "set-site-mode", params: { mode: "away" } },
        { id: "t-away", kind: "trigger", type: "site-mode-changed", params: { mode: "away" } },
        { id: "t-closed", kind: "trigger", type: "site-mode-changed", params: { mode: "closed" } },
        { id: "t-any", kind: "trigger", type: "site-mode-changed", params: {} },
        { id: "a-note", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "mode" } },
      ],
      edges: [...chainEdges("t-press", "a-mode"), ...chainEdges("t-away", "a-note"), ...chainEdges("t-closed", "a-note"), ...chainEdges("t-any", "a-note")],
    });
    const engine = createReplayEngine({ ...site, rules: compileGraph(graph) });
    const step = engine.ingest({ id: "p", siteId: "larch-lane", at: T0, device: dev("rocker-shop-door"), kind: "press", value: 3 });
    expect(step.notices.map((n) => n.ruleId)).toEqual(["t-away", "t-any"]);
    expect(step.changes.find((c) => c.kind === "mode")).toMatchObject({ from: "open", to: "away" });
  });

  it("ignores reports a device kind cannot make, and unknown devices, saying why", () => {
    const m = engineFor({ type: "motion-detected", params: { device: dev("sensor-path") } });
    expect(m.send(0, "contact-back", "motion", true).trace[0].note).toMatch(/does not report "motion"/);
    expect(m.send(1, "no-such-thing", "motion", true).trace[0].note).toMatch(/No device/);
  });

  it("parses gateway events at the boundary, with plain messages", () => {
    expect(deviceEventSchema.parse({ id: "g-1", siteId: "larch-lane", at: T0, device: dev("lux-window"), kind: "light-level", value: 420 })).toMatchObject({ value: 420 });
    const bad = deviceEventSchema.safeParse({ id: "", siteId: "larch-lane", at: 1.5, device: dev("lux-window"), kind: "light-level", value: {} });
    expect(bad.error!.issues.map((i) => i.message)).toEqual(["Every event needs an id, so sending it twice is harmless.", "Times are whole milliseconds since 1970 (UTC).", "Invalid input"]);
  });
});
