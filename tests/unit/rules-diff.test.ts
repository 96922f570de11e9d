import { describe, expect, it } from "vitest";
import { demoRuleGraph } from "@/lib/rules/demo-graph";
import { diffGraphs, diffSentences } from "@/lib/rules/diff";
import { chainEdges, parseRuleGraph, type RuleGraph } from "@/lib/rules/graph";
import { NO_NAMES } from "@/lib/rules/sentence";

const clone = (g: RuleGraph): RuleGraph => structuredClone(g);

describe("Rule set diff in sentences", () => {
  it("finds nothing between a graph and itself, even with nodes moved", () => {
    const moved = clone(demoRuleGraph);
    moved.nodes.forEach((n, i) => (n.position = { x: i * 10, y: 5 }));
    const d = diffGraphs(demoRuleGraph, moved, NO_NAMES);
    expect(d.added).toEqual([]);
    expect(d.removed).toEqual([]);
    expect(d.changed).toEqual([]);
    expect(d.unchanged).toBeGreaterThan(20);
  });

  it("reports an added rule, a removed rule and a changed parameter", () => {
    const next = clone(demoRuleGraph);
    // Changed: the back door now waits 15 minutes.
    const back = next.nodes.find((n) => n.id === "t-back-open")!;
    (back.params as { minutes: number }).minutes = 15;
    // Removed: the counter call button no longer notifies anyone.
    next.edges = next.edges.filter((e) => e.source !== "t-counter-call");
    // Added: a new rocker rule.
    next.nodes.push({ id: "t-new", kind: "trigger", type: "rocker-press", params: { device: "larch-lane-dev-rocker-flat", button: 3 }, position: undefined });
    next.edges.push(...chainEdges("t-new", "a-clear"));
    const d = diffGraphs(demoRuleGraph, next, NO_NAMES);
    expect(d.added).toEqual(["When button 3 of device “larch-lane-dev-rocker-flat” (not on this site) is pressed, clear the emergency"]);
    expect(d.removed).toHaveLength(1);
    expect(d.removed[0]).toMatch(/^When device “larch-lane-dev-call-counter” .* is pressed, notify the managers/);
    expect(d.changed).toHaveLength(1);
    expect(d.changed[0].before).toContain("left open for 10 min");
    expect(d.changed[0].after).toContain("left open for 15 min");
    expect(diffSentences(d).map((s) => s.split(":")[0])).toEqual(["Added", "Removed", "Changed"]);
  });

  it("says a change happened even when the sentence reads the same (hysteresis)", () => {
    const next = clone(demoRuleGraph);
    (next.nodes.find((n) => n.id === "t-workshop-hot")!.params as { hysteresis: number }).hysteresis = 2;
    const d = diffGraphs(demoRuleGraph, next, NO_NAMES);
    expect(d.changed).toHaveLength(1);
    expect(d.changed[0].after).toMatch(/settings such as hysteresis or fade changed/);
  });

  it("treats a copy with new ids that replaces the original as unchanged", () => {
    const g = parseRuleGraph({
      nodes: [
        { id: "t", kind: "trigger", type: "call-button-press", params: { device: "d" } },
        { id: "a", kind: "action", type: "clear-emergency", params: {} },
      ],
      edges: chainEdges("t", "a"),
    });
    const copy = parseRuleGraph({ nodes: g.nodes.map((n) => ({ ...n, id: `${n.id}-copy` })), edges: chainEdges("t-copy", "a-copy") });
    expect(diffGraphs(g, copy, NO_NAMES)).toEqual({ added: [], removed: [], changed: [], unchanged: 1 });
    // From nothing (no active version) everything is added.
    expect(diffGraphs({ nodes: [], edges: [] }, g, NO_NAMES).added).toHaveLength(1);
  });
});
