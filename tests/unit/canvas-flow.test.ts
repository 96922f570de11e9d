import { describe, expect, it } from "vitest";
import { connectionProblem, copyNodes, fromFlow, keepMineAsCopy, toFlow } from "@/components/canvas/flow";
import { fieldSpecs, numberFromInput } from "@/components/canvas/param-fields";
import { chainEdges, parseRuleGraph, type RuleGraph, type RuleGraphInput } from "@/lib/rules/graph";

type N = RuleGraphInput["nodes"][number];
const t: N = { id: "t", kind: "trigger", type: "contact-left-open", params: { device: "d", minutes: 10 }, position: { x: 0, y: 0 } };
const g1: N = { id: "g1", kind: "gate", type: "site-mode-is", params: { modes: ["closed"] }, position: { x: 200, y: 0 } };
const g2: N = { id: "g2", kind: "gate", type: "days-of-week", params: { days: ["mon"] }, position: { x: 400, y: 0 } };
const a: N = { id: "a", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["push"], text: "Open" }, position: { x: 600, y: 0 } };
const base = parseRuleGraph({ nodes: [t, g1, g2, a], edges: chainEdges("t", "g1", "g2", "a") });

describe("Canvas connection checks", () => {
  it("lets a trigger feed gates and actions, and refuses the rest with a reason", () => {
    const loose: RuleGraph = { ...base, edges: [] };
    expect(connectionProblem(loose, "t", "g1")).toBeNull();
    expect(connectionProblem(loose, "t", "a")).toBeNull();
    expect(connectionProblem(loose, "a", "g1")).toMatch(/action ends a path/);
    expect(connectionProblem(loose, "g1", "t")).toMatch(/trigger starts a path/);
    expect(connectionProblem(loose, "g1", "g1")).toMatch(/itself/);
    expect(connectionProblem(base, "t", "g1")).toMatch(/already connected/);
    // g1 → g2 exists, so g2 → g1 would close a circle.
    expect(connectionProblem(base, "g2", "g1")).toMatch(/circle/);
  });
});

describe("Canvas graph round trip, copy and conflict copy", () => {
  it("keeps every node, edge and position through React Flow", () => {
    const flow = toFlow(base);
    expect(flow.nodes.map((n) => n.type)).toEqual(["trigger", "gate", "gate", "action"]);
    expect(fromFlow(flow.nodes, flow.edges)).toEqual(base);
  });

  it("copies nodes with fresh ids and only the connections between them", () => {
    const copy = copyNodes(base, new Set(["g1", "g2"]), new Set(base.nodes.map((n) => n.id)), 40);
    expect(copy.nodes.map((n) => n.id)).toEqual(["g1-copy", "g2-copy"]);
    expect(copy.nodes[0].position).toEqual({ x: 240, y: 40 });
    expect(copy.edges).toEqual([{ id: "e-g1-copy--g2-copy", source: "g1-copy", target: "g2-copy" }]);
  });

  it("keeps mine as a copy: their draft untouched, my added and changed nodes beside it", () => {
    // I changed the trigger to 15 min and added a second action; they changed the notice text.
    const mine = structuredClone(base);
    (mine.nodes[0].params as { minutes: number }).minutes = 15;
    mine.nodes.push({ id: "a2", kind: "action", type: "relay-on", params: { device: "fan" }, position: { x: 600, y: 100 } });
    mine.edges.push({ id: "e-g2--a2", source: "g2", target: "a2" });
    const theirs = structuredClone(base);
    (theirs.nodes[3].params as { text: string }).text = "Door open";

    const { graph, copiedIds } = keepMineAsCopy(base, mine, theirs);
    expect(copiedIds.sort()).toEqual(["a2", "t-copy"]);
    // Theirs is all there, unchanged (their notice text wins; my unchanged copy of it is not duplicated).
    expect(graph.nodes.slice(0, 4)).toEqual(theirs.nodes);
    expect(graph.nodes.find((n) => n.id === "t-copy")?.params).toEqual({ device: "d", minutes: 15 });
    // My changed trigger keeps its connection (to their g1); my new action hangs off their g2.
    expect(graph.edges).toEqual(expect.arrayContaining([...theirs.edges, { id: "e-t-copy--g1", source: "t-copy", target: "g1" }, { id: "e-g2--a2", source: "g2", target: "a2" }]));
    expect(graph.edges).toHaveLength(theirs.edges.length + 2);
  });
});

describe("inspector fields from the node schemas", () => {
  it("reads every parameter with a picker or input and a unit in its label", () => {
    expect(fieldSpecs("trigger", "contact-left-open").map((f) => [f.key, f.widget, f.label])).toEqual([
      ["device", "device", "Device"],
      ["minutes", "number", "Time (min)"],
    ]);
    const notice = fieldSpecs("action", "notice");
    expect(notice.map((f) => f.widget)).toEqual(["recipients", "channels", "text", "enum"]);
    expect(notice.find((f) => f.key === "kind")?.optional).toBe(true);
    expect(fieldSpecs("trigger", "temperature-above").find((f) => f.key === "hysteresis")).toMatchObject({ label: "Margin (°C)", optional: true, widget: "number" });
    expect(fieldSpecs("gate", "time-window").map((f) => f.widget)).toEqual(["time", "time"]);
    expect(fieldSpecs("action", "nope")).toEqual([]);
  });

  it("turns typed text into what the schema should judge", () => {
    expect(numberFromInput(" ")).toBeUndefined();
    expect(numberFromInput("12,5")).toBe(12.5);
    expect(numberFromInput("twelve")).toBe("twelve");
  });
});

describe("placing an added node", () => {
  it("takes the wanted spot when free, else the nearest free one below", async () => {
    const { freeSpot } = await import("@/components/canvas/flow");
    const size = { width: 200, height: 80 };
    expect(freeSpot([], { x: 10, y: 10 }, size)).toEqual({ x: 10, y: 10 });
    const taken = [{ position: { x: 0, y: 0 }, width: 200, height: 80 }];
    const p = freeSpot(taken, { x: 50, y: 20 }, size);
    expect(p.x).toBe(50);
    expect(p.y).toBeGreaterThanOrEqual(80 + 16);
  });
});
