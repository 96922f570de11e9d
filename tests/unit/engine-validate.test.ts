import { describe, expect, it } from "vitest";
import { demoDevices, demoZones } from "@/db/seed/demo-site";
import { demoRuleGraph, demoScenes } from "@/lib/rules/demo-graph";
import { chainEdges, type RuleGraphInput } from "@/lib/rules/graph";
import { validateGraph, type SiteContext } from "@/lib/rules/validate";

const d = (key: string) => `larch-lane-dev-${key}`;
const z = (key: string) => `larch-lane-zone-${key}`;
const site: SiteContext = { devices: demoDevices.map((x) => ({ id: x.id, kind: x.kind, zoneId: x.zoneId ?? null, name: x.name })), zones: demoZones.map((x) => ({ id: x.id, name: x.name })), scenes: demoScenes };
type N = RuleGraphInput["nodes"][number];

const press: N = { id: "t", kind: "trigger", type: "rocker-press", params: { device: d("rocker-shop-door"), button: 1 } };
const note: N = { id: "a", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "x" } };
const problems = (nodes: N[], edges: RuleGraphInput["edges"] = []) => validateGraph({ nodes, edges }, site);
const messages = (nodes: N[], edges: RuleGraphInput["edges"] = []) => problems(nodes, edges).map((p) => `${p.severity} ${p.nodeId ?? "-"}: ${p.message}`);

describe("validation", () => {
  it("passes the demo Rule set without a word", () => {
    expect(validateGraph(demoRuleGraph, site)).toEqual([]);
  });

  it("reports field problems against the node they belong to", () => {
    expect(problems([{ id: "bad", kind: "trigger", type: "vacancy", params: { device: d("sensor-path"), minutes: 0 } }])).toEqual([{ nodeId: "bad", severity: "error", message: "Enter minutes as a whole number from 1 to 240." }]);
  });

  it("finds loose nodes, unreachable actions, dead-end gates and broken connections", () => {
    const gate: N = { id: "g", kind: "gate", type: "site-mode-is", params: { modes: ["closed"] } };
    expect(messages([press, note])).toEqual(["warning t: This trigger is not connected to anything.", "warning a: This action is not connected to anything."]);
    expect(messages([press, gate, note], [...chainEdges("g", "a"), { id: "e2", source: "t", target: "nowhere" }])).toEqual([
      "error t: A connection leads to a node that is no longer on the Canvas; remove it.",
      "warning t: This trigger leads to no gate or action, so nothing happens when it fires.",
      "warning g: No trigger leads to this gate, so it is never checked.",
      "error a: No trigger reaches this action, so it never runs.",
    ]);
    expect(messages([press, gate, note], chainEdges("t", "g"))).toContain("warning g: This gate leads to no action.");
  });

  it("refuses connections into a trigger, out of an action, and gate circles", () => {
    const g1: N = { id: "g1", kind: "gate", type: "days-of-week", params: { days: ["mon"] } };
    const g2: N = { id: "g2", kind: "gate", type: "site-mode-is", params: { modes: ["open"] } };
    const m = messages([press, g1, g2, note], [...chainEdges("t", "g1", "g2", "g1"), ...chainEdges("g2", "a", "g1"), { id: "back", source: "g1", target: "t" }]);
    expect(m).toContain("error t: A trigger starts a path; nothing can lead into it.");
    expect(m).toContain("error a: An action ends a path; connect it from a trigger or gate, not onward.");
    expect(m).toContain("error g1: These gates lead round in a circle; a path must run from a trigger to an action.");
  });

  it("catches a timer that restarts itself, and site modes that flip each other", () => {
    const timer: N[] = [
      { id: "t-fired", kind: "trigger", type: "timer-fired", params: { name: "x" } },
      { id: "a-start", kind: "action", type: "start-timer", params: { name: "x", minutes: 5 } },
    ];
    expect(messages(timer, chainEdges("t-fired", "a-start"))).toEqual(["warning a-start: This action sets off its own trigger again (through a timer), so it repeats for ever. Add a gate or cancel the timer if that is not meant."]);
    const flip: N[] = [
      { id: "t-open", kind: "trigger", type: "site-mode-changed", params: { mode: "open" } },
      { id: "a-closed", kind: "action", type: "set-site-mode", params: { mode: "closed" } },
      { id: "t-closed", kind: "trigger", type: "site-mode-changed", params: { mode: "closed" } },
      { id: "a-open", kind: "action", type: "set-site-mode", params: { mode: "open" } },
    ];
    expect(problems(flip, [...chainEdges("t-open", "a-closed"), ...chainEdges("t-closed", "a-open")])).toEqual([
      { nodeId: "a-open", severity: "error", message: "These paths change the site mode back and forth without end. Break the circle." },
    ]);
    // Setting the mode a mode trigger just saw changes nothing, so it is not a loop.
    expect(problems(flip.slice(0, 2), chainEdges("t-open", "a-closed"))).toEqual([]);
  });

  it("warns when two paths on one trigger drive the same target differently, unless their gates exclude each other", () => {
    const nodes: N[] = [
      press,
      { id: "a1", kind: "action", type: "set-level", params: { target: { zone: z("shop") }, level: 100 } },
      { id: "g-open", kind: "gate", type: "site-mode-is", params: { modes: ["open"] } },
      { id: "a2", kind: "action", type: "set-level", params: { target: { device: d("dl-shop-2") }, level: 20 } },
    ];
    expect(messages(nodes, [...chainEdges("t", "a1"), ...chainEdges("t", "g-open", "a2")])).toEqual([
      "warning a2: On the same trigger, two paths set Shop downlight 2 differently (100 % and 20 %); if both pass, the later one wins.",
    ]);
    const exclusive: N[] = [...nodes, { id: "g-closed", kind: "gate", type: "site-mode-is", params: { modes: ["closed"] } }];
    expect(messages(exclusive, [...chainEdges("t", "g-closed", "a1"), ...chainEdges("t", "g-open", "a2")])).toEqual([]);
  });

  it("checks devices against what their kind reports and accepts", () => {
    expect(messages([{ id: "t", kind: "trigger", type: "door-handle-turn", params: { device: d("sensor-path") } }, note], chainEdges("t", "a"))).toEqual([
      "error t: Front path motion sensor (solar motion + light-level sensor) cannot report door-handle turns.",
    ]);
    expect(messages([press, { id: "a", kind: "action", type: "relay-on", params: { device: d("dl-shop-1") } }], chainEdges("t", "a"))).toEqual(["error a: Shop downlight 1 (mesh luminaire) cannot take relay on/off."]);
    expect(messages([press, { id: "a", kind: "action", type: "set-level", params: { target: { device: d("fan-workshop") }, level: 5 } }], chainEdges("t", "a"))).toEqual([
      "error a: Workshop fan relay (relay (fan or other load)) cannot take a light level.",
    ]);
    expect(messages([{ ...press, params: { device: "ghost", button: 1 } } as N, note], chainEdges("t", "a"))).toEqual(['error t: The device "ghost" is not on this site.']);
    expect(messages([press, { id: "a", kind: "action", type: "toggle-zone", params: { zone: z("back") } }], chainEdges("t", "a"))).toEqual(["warning a: Back door has no luminaires, so this does nothing."]);
    expect(messages([press, { id: "a", kind: "action", type: "latch-emergency", params: { scene: 77 } }], chainEdges("t", "a"))).toEqual(["error a: Scene 77 is not set up on this site."]);
    expect(messages([press, { id: "g", kind: "gate", type: "zone-occupied", params: { zone: z("shop") } }, note], chainEdges("t", "g", "a"))).toEqual(["warning g: Shop floor has no motion sensor, so it always counts as vacant."]);
  });

  it("flags thresholds outside the sensor's range (lux 0–200000, °C −40–85, %RH 0–100)", () => {
    // Ranges: common practice for indoor sensors, no source.
    const t = (type: string, params: Record<string, unknown>) => messages([{ id: "t", kind: "trigger", type, params } as N, note], chainEdges("t", "a"));
    expect(t("light-level-above", { device: d("lux-window"), lux: 250_000 })).toEqual(["error t: 250000 lx is outside what the sensor measures (0 to 200000 lx), so this never trips."]);
    expect(t("temperature-above", { device: d("climate-workshop"), celsius: 90 })).toEqual(["error t: 90 °C is outside what the sensor measures (-40 to 85 °C), so this never trips."]);
    expect(t("humidity-below", { device: d("climate-workshop"), percent: -5 })).toEqual(["error t: -5 %RH is outside what the sensor measures (0 to 100 %RH), so this never trips."]);
    expect(t("humidity-below", { device: d("climate-workshop"), percent: 99, hysteresis: 5 })).toEqual([
      "warning t: With a margin of 5 %RH the reading must reach 104 %RH before this can trip again, which the sensor cannot measure.",
    ]);
    expect(t("temperature-below", { device: d("climate-workshop"), celsius: 10 })).toEqual([]);
  });

  it("warns about a time window that starts when it ends", () => {
    const g: N = { id: "g", kind: "gate", type: "time-window", params: { from: { kind: "fixed", time: "08:00" }, to: { kind: "fixed", time: "08:00" } } };
    expect(messages([press, g, note], chainEdges("t", "g", "a"))).toEqual(["warning g: The window starts and ends at the same time, so it never lets anything through."]);
  });

  it("reports two nodes with one id", () => {
    expect(messages([press, { ...note, id: "t" }], chainEdges("t", "t"))).toContain('error t: Two nodes share the id "t"; give each its own.');
  });
});
