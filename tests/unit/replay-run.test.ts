import { describe, expect, it } from "vitest";
import { demoDevices, demoSite, demoZones } from "@/db/seed/demo-site";
import { createReplayEngine } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import { compileGraph } from "@/lib/rules/compile";
import { demoRuleGraph, demoScenes } from "@/lib/rules/demo-graph";
import { parseRuleGraph } from "@/lib/rules/graph";
import { demoNightLog, NIGHT, NIGHT_WINDOW } from "@/lib/replay/demo-night";
import { createReplay, TIMELINE_CAP } from "@/lib/replay/run";

const input = toSiteInput({ site: demoSite, devices: demoDevices, zones: demoZones, scenes: demoScenes });
const active = compileGraph(demoRuleGraph);
const PATH_RULE = "t-path-motion>g-path-after-hours>g-path-dark";

/** The fix an integrator would make: path lights only between 06:00 and 23:00 (the notice still goes). */
function fixedGraph() {
  const g = structuredClone(demoRuleGraph);
  g.nodes.push({ id: "g-path-waking-hours", kind: "gate", type: "time-window", params: { from: { kind: "fixed", time: "06:00" }, to: { kind: "fixed", time: "23:00" } } } as (typeof g.nodes)[number]);
  g.edges = g.edges.filter((e) => !(e.source === "g-path-dark" && e.target === "a-path-on"));
  g.edges.push({ id: "e1", source: "g-path-dark", target: "g-path-waking-hours" }, { id: "e2", source: "g-path-waking-hours", target: "a-path-on" });
  return compileGraph(parseRuleGraph(g));
}

function replay(runs: { label: string; rules: ReturnType<typeof compileGraph> }[], filter?: { device?: string; zone?: string }) {
  const r = createReplay({ input, runs, window: NIGHT_WINDOW, filter });
  for (const e of demoNightLog()) r.feed(e);
  return r.finish();
}

describe("replay of a window", () => {
  it("runs without a trace and fills in the traces it keeps by running segments again: the same result as tracing every step", () => {
    const longer = (segment?: number, traced = false) => {
      const r = createReplay({ input, runs: [{ label: "A", rules: active }, { label: "B", rules: fixedGraph() }], window: NIGHT_WINDOW, segment, onStep: traced ? () => undefined : undefined });
      for (const e of demoNightLog()) r.feed(e);
      return r.finish();
    };
    const traced = JSON.stringify(longer(undefined, true));
    for (const segment of [1, 2, 3, 7, 10_000]) expect(JSON.stringify(longer(segment)), `segment ${segment}`).toBe(traced);
    // Not vacuous: there are traces to fill in, on the timeline and on the differences.
    const result = longer(3);
    expect(result.runs[0].timeline.filter((t) => t.trace.some((e) => e.rules.length > 0)).length).toBeGreaterThan(3);
    expect(result.compare!.differences.length).toBeGreaterThan(0);
    expect(result.compare!.differences.every((d) => d.traceA.length > 0 && d.traceB.length > 0)).toBe(true);
  });

  it("the same past the timeline's cap, where it stops saving states", () => {
    // 3,000 presses of the shop and flat rockers through a night: more matched steps than the timeline keeps.
    const presses = Array.from({ length: 3000 }, (_, i) => ({ id: `p${i}`, siteId: "larch-lane", at: NIGHT_WINDOW.from + 1000 + i * 7_000, device: i % 3 ? "larch-lane-dev-rocker-shop-door" : "larch-lane-dev-rocker-flat", kind: "press", value: 1 + (i % 2) }));
    const go = (segment?: number, traced = false) => {
      const r = createReplay({ input, runs: [{ label: "A", rules: active }], window: NIGHT_WINDOW, segment, onStep: traced ? () => undefined : undefined });
      for (const e of presses) r.feed(e);
      return r.finish();
    };
    const traced = go(undefined, true);
    expect(traced.runs[0].isTimelineCut).toBe(true);
    expect(JSON.stringify(go(500))).toBe(JSON.stringify(traced));
  });

  it("gives the same steps as the replay engine driven by hand (same input, same output)", () => {
    const steps: unknown[] = [];
    const r = createReplay({ input, runs: [{ label: "A", rules: active }], window: NIGHT_WINDOW, onStep: (_, __, step) => steps.push(step) });
    for (const e of demoNightLog()) r.feed(e);
    r.finish();
    const engine = createReplayEngine({ ...input, rules: active });
    const direct = [...demoNightLog().map((e) => engine.ingest(e)), engine.advanceTo(NIGHT_WINDOW.to)];
    expect(JSON.stringify(steps)).toBe(JSON.stringify(direct));
  });

  it("finds the rule that lit the front path at 03:12, with its gates and facts, in the timeline", () => {
    const result = replay([{ label: "active", rules: active }]);
    const entry = result.runs[0].timeline.find((t) => t.key === NIGHT.falseTriggerId)!;
    expect(entry.fired).toContain(PATH_RULE);
    expect(entry.effects.some((e) => /Path light 1 0 → 100 %/.test(e))).toBe(true);
    const rule = entry.trace.flatMap((t) => t.rules).find((r) => r.ruleId === PATH_RULE)!;
    expect(rule.gates.map((g) => [g.nodeId, g.passed])).toEqual([
      ["g-path-after-hours", true],
      ["g-path-dark", true],
    ]);
    expect(result.events).toBe(demoNightLog().length);
    // The path zone's series goes up to 100 % twice (18:06 and 03:12).
    const path = result.runs[0].series.zones.find((z) => z.id === "larch-lane-zone-path")!;
    expect(path.points.filter(([, v]) => v === 100).length).toBe(2);
    expect(result.runs[0].series.relays.map((r) => r.id)).toEqual(["larch-lane-dev-fan-workshop"]);
  });

  it("Compare: with a waking-hours gate only the 03:12 event decides differently; the path-off after it is marked as following from it", () => {
    const result = replay([
      { label: "active", rules: active },
      { label: "fixed", rules: fixedGraph() },
    ]);
    const c = result.compare!;
    expect(c.root).toBe(1);
    const roots = c.differences.filter((d) => !d.isKnockOn);
    expect(roots.map((d) => d.key)).toEqual([NIGHT.falseTriggerId]);
    expect(roots[0].onlyA.some((x) => /Path light 1 0 → 100 %/.test(x))).toBe(true);
    expect(roots[0].onlyB).toEqual([]);
    // The visitor at 18:06 lights the path under both: not a difference.
    expect(c.differences.some((d) => d.key === NIGHT.visitorId)).toBe(false);
    expect(c.differences.filter((d) => d.isKnockOn).every((d) => d.at > roots[0].at)).toBe(true);
    // Both traces are there to link to; B's names the new gate, failed at 03:12.
    const gateB = roots[0].traceB.flatMap((t) => t.rules).flatMap((r) => r.gates).find((g) => g.nodeId === "g-path-waking-hours");
    expect(gateB?.passed).toBe(false);
  });

  it("comparing a rule set with itself finds nothing", () => {
    const result = replay([
      { label: "A", rules: active },
      { label: "B", rules: active },
    ]);
    expect(result.compare).toEqual({ differences: [], isCut: false, root: 0, knockOn: 0 });
  });

  it("a device filter keeps only that device's lines in the timeline", () => {
    const result = replay([{ label: "A", rules: active }], { device: "larch-lane-dev-rocker-flat" });
    const keys = result.runs[0].timeline.map((t) => t.key);
    expect(keys.length).toBeGreaterThan(0);
    expect(keys.every((k) => k.startsWith("night-2"))).toBe(true);
  });

  it("keeps memory flat: the timeline stops at its cap and says so", () => {
    const r = createReplay({ input, runs: [{ label: "A", rules: active }], window: { from: 0, to: NIGHT_WINDOW.to + 86_400_000 * 30 } });
    let at = NIGHT_WINDOW.from;
    for (let i = 0; i < TIMELINE_CAP * 2 + 10; i++) {
      at += 60_000;
      r.feed({ id: `p${i}`, siteId: "larch-lane", at, device: "larch-lane-dev-rocker-workshop", kind: "press", value: 1 });
    }
    const result = r.finish();
    expect(result.runs[0].timeline.length).toBe(TIMELINE_CAP);
    expect(result.runs[0].isTimelineCut).toBe(true);
    expect(result.runs[0].series.zones.every((z) => z.points.length <= 4 * 300 + 1)).toBe(true);
  });
});
