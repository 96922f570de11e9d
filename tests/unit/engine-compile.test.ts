import { describe, expect, it } from "vitest";
import { compileGraph } from "@/lib/rules/compile";
import { demoRuleGraph } from "@/lib/rules/demo-graph";
import { chainEdges, parseRuleGraph } from "@/lib/rules/graph";
import { enumeratePaths } from "@/lib/rules/paths";
import { buildRuleIndex } from "@/lib/rules/rule-index";
import { triggerKeyOf } from "@/lib/rules/trigger-key";

const d = (key: string) => `larch-lane-dev-${key}`;

const graph = parseRuleGraph({
  nodes: [
    { id: "t", kind: "trigger", type: "motion-detected", params: { device: d("sensor-path") } },
    { id: "g1", kind: "gate", type: "site-mode-is", params: { modes: ["closed"] } },
    { id: "g2", kind: "gate", type: "light-level-below", params: { device: d("sensor-path"), lux: 20 } },
    { id: "a1", kind: "action", type: "notice", params: { to: { role: "occupant" }, channels: ["push"], text: "visitor" } },
    { id: "a2", kind: "action", type: "set-level", params: { target: { zone: "larch-lane-zone-path" }, level: 100 } },
    { id: "a3", kind: "action", type: "set-level", params: { target: { zone: "larch-lane-zone-flat" }, level: 30 } },
  ],
  edges: [...chainEdges("t", "g1", "a1"), ...chainEdges("g1", "g2", "a2"), ...chainEdges("g2", "a3"), ...chainEdges("t", "a3")],
});

describe("compiler", () => {
  it("finds every trigger → gates → action path", () => {
    expect(enumeratePaths(graph).map((p) => [p.trigger.id, ...p.gates.map((g) => g.id), p.action.id].join(" "))).toEqual(["t g1 a1", "t g1 g2 a2", "t g1 g2 a3", "t a3"]);
  });

  it("groups actions reached through the same gate chain into one rule", () => {
    const rules = compileGraph(graph);
    expect(rules.map((r) => [r.name, r.event.params.actions.map((a) => a.nodeId)])).toEqual([
      ["t>g1", ["a1"]],
      ["t>g1>g2", ["a2", "a3"]],
      ["t", ["a3"]],
    ]);
  });

  it("emits json-rules-engine rules: named flat-fact conditions, a path event, priority from the override level", () => {
    const [, chained] = compileGraph(graph);
    expect(chained).toMatchObject({
      name: "t>g1>g2",
      priority: 2,
      conditions: {
        all: [
          { name: "g1", fact: "site-mode", operator: "oneOf", value: ["closed"] },
          { name: "g2", fact: "lux:larch-lane-dev-sensor-path", operator: "below", value: 20 },
        ],
      },
      event: { type: "path", params: { ruleId: "t>g1>g2", triggerKey: "motion-detected|larch-lane-dev-sensor-path", level: "sensor" } },
    });
    // No JSONPath: every condition reads a whole fact.
    for (const c of chained.conditions.all) expect(c).not.toHaveProperty("path");
  });

  it("is stable: the same graph compiles to the same JSON, and the JSON survives storage", () => {
    const a = JSON.stringify(compileGraph(demoRuleGraph));
    expect(JSON.stringify(compileGraph(demoRuleGraph))).toBe(a);
    const stored = JSON.parse(a);
    expect(buildRuleIndex(stored).rules.map((r) => r.id)).toEqual(buildRuleIndex(compileGraph(demoRuleGraph)).rules.map((r) => r.id));
  });

  it("indexes rules by trigger key, highest override level first", () => {
    const index = buildRuleIndex(compileGraph(graph));
    expect([...index.groups.keys()]).toEqual(["motion-detected|larch-lane-dev-sensor-path"]);
    const group = index.groups.get("motion-detected|larch-lane-dev-sensor-path")!;
    expect(group.facts.map((f) => f.id)).toEqual(["lux:larch-lane-dev-sensor-path", "site-mode"]);
    const demo = buildRuleIndex(compileGraph(demoRuleGraph));
    expect(demo.groups.get("fire-alarm-active|larch-lane-dev-fire-input")!.rules[0].priority).toBe(4);
  });

  it("lists what the engine must watch: thresholds, vacancy, left-open and clock triggers", () => {
    const { watches } = buildRuleIndex(compileGraph(demoRuleGraph));
    expect(watches.thresholds.map((w) => `${w.measure} ${w.direction} ${w.threshold}±${w.hysteresis}`)).toEqual(["humidity above 60±3", "humidity above 65±3", "lux above 800±100", "lux below 400±100", "temperature above 28±1", "temperature below 26±1"]);
    expect(watches.vacancy).toEqual([{ key: "vacancy|larch-lane-dev-sensor-path|3", device: d("sensor-path"), minutes: 3 }]);
    expect(watches.leftOpen.map((w) => w.minutes)).toEqual([10]);
    expect(watches.schedules.map((w) => w.key)).toEqual(["time-of-day|fixed|09:00", "time-of-day|fixed|17:30"]);
  });

  it("gives each trigger a key naming what makes it distinct", () => {
    const keys = parseRuleGraph({
      nodes: [
        { id: "a", kind: "trigger", type: "rocker-press", params: { device: "r", button: 2 } },
        { id: "b", kind: "trigger", type: "light-level-below", params: { device: "l", lux: 200, hysteresisLux: 20 } },
        { id: "c", kind: "trigger", type: "time-of-day", params: { at: { kind: "sunset", offsetMinutes: -15 } } },
        { id: "e", kind: "trigger", type: "site-mode-changed", params: {} },
      ],
      edges: [],
    }).nodes.map((n) => (n.kind === "trigger" ? triggerKeyOf(n) : ""));
    expect(keys).toEqual(["rocker-press|r|2", "light-level-below|l|200|20", "time-of-day|sunset|-15", "site-mode-changed|*"]);
  });

  it("rule JSON given to json-rules-engine is not mutated by running it", async () => {
    const rules = compileGraph(demoRuleGraph);
    const before = JSON.stringify(rules);
    const index = buildRuleIndex(rules);
    const { evaluateWithRulesEngine } = await import("@/lib/rules/evaluate");
    for (const group of index.groups.values()) await evaluateWithRulesEngine(group, { "site-mode": "closed", "lux:larch-lane-dev-sensor-path": 3, weekday: "mon" });
    expect(JSON.stringify(rules)).toBe(before);
  });
});

describe("graph schema messages", () => {
  it("speaks to the person editing the Canvas", async () => {
    const { ruleGraphSchema } = await import("@/lib/rules/graph");
    const result = ruleGraphSchema.safeParse({
      nodes: [
        { id: "x", kind: "trigger", type: "rocker-press", params: { device: "", button: 7 } },
        { id: "y", kind: "gate", type: "time-window", params: { from: { kind: "fixed", time: "25:00" }, to: { kind: "sunrise" } } },
        { id: "z", kind: "action", type: "recall-scene", params: { scene: 0 } },
        { id: "w", kind: "action", type: "notice", params: { to: { role: "owner" }, channels: [], text: " " } },
        { id: "v", kind: "action", type: "teleport", params: {} },
      ],
      edges: [],
    });
    expect(result.success).toBe(false);
    expect(result.error!.issues.map((i) => i.message)).toEqual([
      "Choose a device.",
      "Choose which button: 1 to 4.",
      "Use a 24-hour time like 07:30.",
      "Scene numbers run from 1 to 65535 (0 is not allowed on the mesh).",
      "Choose a role or the people who get the notice.",
      "Pick at least one channel.",
      "Write the notice text.",
      "This action type is not one the engine knows.",
    ]);
  });

  it("fills defaults a Canvas may leave out", () => {
    const g = parseRuleGraph({
      nodes: [
        { id: "t", kind: "trigger", type: "temperature-above", params: { device: "c", celsius: 28 } },
        { id: "g", kind: "gate", type: "emergency-not-active" },
        { id: "a", kind: "action", type: "latch-emergency", params: { scene: 9 } },
      ],
      edges: [],
    });
    expect(g.nodes.map((n) => n.params)).toEqual([{ device: "c", celsius: 28, hysteresis: 0.5 }, {}, { scene: 9, othersOff: true }]);
  });
});
