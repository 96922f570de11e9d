import { describe, expect, it } from "vitest";
import { demoDevices, demoSite, demoZones } from "@/db/seed/demo-site";
import { createReplayEngine } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import { compileGraph } from "@/lib/rules/compile";
import { demoScenes } from "@/lib/rules/demo-graph";
import { chainEdges, parseRuleGraph, type RuleGraphInput } from "@/lib/rules/graph";

type GateInput = Extract<RuleGraphInput["nodes"][number], { kind: "gate" }> extends infer G ? (G extends unknown ? Omit<G, "kind"> : never) : never;
const dev = (key: string) => `larch-lane-dev-${key}`;
const site = toSiteInput({ site: demoSite, devices: demoDevices, zones: demoZones, scenes: demoScenes });
const MIN = 60_000;
/** Local wall time on Thursday 2024-06-20 at the demo site (WET, +1 in summer) → epoch ms. */
const local = (hh: number, mm = 0, dayOffset = 0) => Date.UTC(2024, 5, 20 + dayOffset, hh - 1, mm);

/** Rocker press → the gates in order → a notice; returns a press function reporting whether the rule passed and its gate trace. */
function gated(gates: GateInput[], extraNodes: RuleGraphInput["nodes"] = [], extraEdges: RuleGraphInput["edges"] = []) {
  const ids = gates.map((g) => g.id);
  const graph = parseRuleGraph({
    nodes: [
      { id: "t", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-shop-door"), button: 1 } },
      ...gates.map((g) => ({ ...g, kind: "gate" as const })),
      { id: "a", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "passed" } },
      ...extraNodes,
    ],
    edges: [...chainEdges("t", ...ids, "a"), ...extraEdges],
  });
  const engine = createReplayEngine({ ...site, rules: compileGraph(graph) });
  let n = 0;
  const press = (at: number) => {
    const step = engine.ingest({ id: `p${n++}`, siteId: "larch-lane", at, device: dev("rocker-shop-door"), kind: "press", value: 1 });
    const rule = step.trace.find((t) => t.rules.some((r) => r.ruleId.startsWith("t")))!.rules.find((r) => r.ruleId.startsWith("t"))!;
    return { passed: step.notices.length === 1, rule };
  };
  const send = (at: number, device: string, kind: string, value: number | boolean | string) => engine.ingest({ id: `s${n++}`, siteId: "larch-lane", at, device: dev(device), kind, value });
  return { engine, press, send };
}

describe("gates", () => {
  it("time window crossing midnight: from ≤ now < to", () => {
    const g = gated([{ id: "g", type: "time-window", params: { from: { kind: "fixed", time: "22:00" }, to: { kind: "fixed", time: "06:00" } } }]);
    const at23 = g.press(local(23));
    expect(at23.passed).toBe(true);
    expect(at23.rule.gates[0]).toMatchObject({ nodeId: "g", type: "time-window", passed: true });
    expect((at23.rule.gates[0].facts.clock as { minute: number }).minute).toBe(23 * 60);
    expect(g.press(local(5, 59, 1)).passed).toBe(true);
    expect(g.press(local(6, 0, 1)).passed).toBe(false);
    expect(g.press(local(12, 0, 1)).passed).toBe(false);
    expect(g.press(local(22, 0, 1)).passed).toBe(true);
  });

  it("time window with sun-relative ends reads today's sun times", () => {
    const g = gated([{ id: "g", type: "time-window", params: { from: { kind: "sunset", offsetMinutes: -30 }, to: { kind: "sunrise", offsetMinutes: 30 } } }]);
    const noon = g.press(local(12));
    expect(noon.passed).toBe(false);
    const clock = noon.rule.gates[0].facts.clock as { sunrise: number; sunset: number };
    // Common practice, no source: midsummer at 51.2 N 2.1 W, sunrise ≈ 05:00 and sunset ≈ 21:30 summer time.
    expect(clock.sunrise).toBeGreaterThan(4 * 60 + 45);
    expect(clock.sunrise).toBeLessThan(5 * 60 + 15);
    expect(clock.sunset).toBeGreaterThan(21 * 60 + 15);
    expect(g.press(local(23)).passed).toBe(true);
    expect(g.press(local(3, 0, 1)).passed).toBe(true);
  });

  it("days of week use the site's local date", () => {
    const g = gated([{ id: "g", type: "days-of-week", params: { days: ["mon", "tue", "wed", "thu", "fri"] } }]);
    const thu = g.press(local(12));
    expect(thu.passed).toBe(true);
    expect(thu.rule.gates[0].facts).toEqual({ weekday: "thu" });
    expect(g.press(local(12, 0, 2)).passed).toBe(false); // Saturday
    // 00:30 on Saturday local is still Friday 23:30 UTC: local wins.
    expect(g.press(local(0, 30, 2)).passed).toBe(false);
  });

  it("light level below: an unknown reading does not pass", () => {
    const g = gated([{ id: "g", type: "light-level-below", params: { device: dev("lux-window"), lux: 50 } }]);
    const unknown = g.press(local(9));
    expect(unknown.passed).toBe(false);
    expect(unknown.rule.gates[0].facts).toEqual({ "lux:larch-lane-dev-lux-window": null });
    g.send(local(9, 1), "lux-window", "light-level", 10);
    expect(g.press(local(9, 2)).passed).toBe(true);
    g.send(local(9, 3), "lux-window", "light-level", 50);
    expect(g.press(local(9, 4)).passed).toBe(false);
  });

  it("zone occupied and vacant follow motion and the occupancy time", () => {
    const occ = gated([{ id: "g", type: "zone-occupied", params: { zone: "larch-lane-zone-path" } }]);
    expect(occ.press(local(9)).passed).toBe(false);
    occ.send(local(9, 1), "sensor-path", "motion", true);
    expect(occ.press(local(9, 2)).passed).toBe(true);
    // Default occupancy time: 15 min after the last motion.
    expect(occ.press(local(9, 17)).passed).toBe(false);
    const vac = gated([{ id: "g", type: "zone-vacant", params: { zone: "larch-lane-zone-path" } }]);
    vac.send(local(9, 1), "sensor-path", "motion", true);
    expect(vac.press(local(9, 2)).passed).toBe(false);
    expect(vac.press(local(9, 20)).passed).toBe(true);
  });

  it("site mode is one of the listed modes", () => {
    const g = gated([{ id: "g", type: "site-mode-is", params: { modes: ["closed", "away"] } }]);
    const open = g.press(local(9));
    expect(open.passed).toBe(false);
    expect(open.rule.gates[0].facts).toEqual({ "site-mode": "open" });
  });

  it("emergency not active fails while an emergency is latched", () => {
    const g = gated(
      [{ id: "g", type: "emergency-not-active" }],
      [
        { id: "t-fire", kind: "trigger", type: "fire-alarm-active", params: { device: dev("fire-input") } },
        { id: "a-latch", kind: "action", type: "latch-emergency", params: { scene: 9 } },
      ],
      chainEdges("t-fire", "a-latch"),
    );
    expect(g.press(local(9)).passed).toBe(true);
    g.send(local(9, 1), "fire-input", "fire-alarm", true);
    const during = g.press(local(9, 2));
    expect(during.passed).toBe(false);
    expect(during.rule.gates[0].facts).toEqual({ "emergency-active": true });
  });

  it("chained gates must all pass, and the trace reports each one", () => {
    const g = gated([
      { id: "g1", type: "days-of-week", params: { days: ["thu"] } },
      { id: "g2", type: "site-mode-is", params: { modes: ["closed"] } },
    ]);
    const r = g.press(local(9));
    expect(r.passed).toBe(false);
    expect(r.rule.gates.map((x) => [x.nodeId, x.passed])).toEqual([
      ["g1", true],
      ["g2", false],
    ]);
  });

  it("a gate reads facts at the moment of the trigger, after earlier readings", () => {
    const g = gated([{ id: "g", type: "light-level-below", params: { device: dev("sensor-path"), lux: 20 } }]);
    g.send(local(22), "sensor-path", "light-level", 3);
    expect(g.press(local(22) + MIN).rule.gates[0].facts["lux:larch-lane-dev-sensor-path"]).toBe(3);
  });
});
