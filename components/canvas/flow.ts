import type { Edge, Node } from "@xyflow/react";
import type { RuleEdge, RuleGraph, RuleNode } from "@/lib/rules/graph";
import { autoLayout } from "@/lib/rules/layout";

/**
 * The Canvas between the Rule set graph (lib/rules/graph.ts) and React Flow:
 * one React Flow node per rule node, typed by its kind, with the rule node as data.
 * Pure functions only, so undo, copy/paste and "keep mine as a copy" are testable.
 */
export type CanvasNodeData = { rule: RuleNode };
export type TriggerFlowNode = Node<CanvasNodeData, "trigger">;
export type GateFlowNode = Node<CanvasNodeData, "gate">;
export type ActionFlowNode = Node<CanvasNodeData, "action">;
export type FlowNode = TriggerFlowNode | GateFlowNode | ActionFlowNode;
export type FlowEdge = Edge;

/** Fixed node sizes keep auto-layout exact and text legible; gates are narrow by design. */
export const NODE_SIZE = { trigger: { width: 212, height: 84 }, gate: { width: 164, height: 84 }, action: { width: 212, height: 84 } } as const;

const round = (n: number) => Math.round(n);

export function edgeId(source: string, target: string) {
  return `e-${source}--${target}`;
}

export function toFlowNode(rule: RuleNode, index = 0, selected = false): FlowNode {
  const position = rule.position ?? { x: (index % 4) * 260, y: Math.floor(index / 4) * 120 };
  return { id: rule.id, type: rule.kind, position, data: { rule }, selected, ...NODE_SIZE[rule.kind] } as FlowNode;
}

export function toFlowEdge(e: RuleEdge, selected = false): FlowEdge {
  return { id: e.id, source: e.source, target: e.target, selected };
}

export function toFlow(graph: RuleGraph, selectedIds: ReadonlySet<string> = new Set()): { nodes: FlowNode[]; edges: FlowEdge[] } {
  return { nodes: graph.nodes.map((n, i) => toFlowNode(n, i, selectedIds.has(n.id))), edges: graph.edges.map((e) => toFlowEdge(e)) };
}

export function fromFlow(nodes: FlowNode[], edges: FlowEdge[]): RuleGraph {
  return {
    nodes: nodes.map((n) => ({ ...n.data.rule, position: { x: round(n.position.x), y: round(n.position.y) } }) as RuleNode),
    edges: edges.map((e) => ({ id: e.id, source: e.source, target: e.target })),
  };
}

/** A fresh id that is not in `taken`. */
export function freshId(base: string, taken: ReadonlySet<string>): string {
  const stem = base.replace(/-copy\d*$/, "").slice(0, 60);
  for (let i = 1; ; i++) {
    const id = `${stem}-copy${i === 1 ? "" : i}`;
    if (!taken.has(id)) return id;
  }
}

export function newNodeId(kind: string, type: string, taken: ReadonlySet<string>): string {
  const stem = `${kind[0]}-${type}`;
  for (let i = 1; ; i++) if (!taken.has(`${stem}-${i}`)) return `${stem}-${i}`;
}

/** Why a connection is refused, or null when it is fine: a trigger feeds gates or actions; an action feeds nothing; gates never go round in a circle. */
export function connectionProblem(graph: Pick<RuleGraph, "nodes" | "edges">, source: string, target: string): string | null {
  const byId = new Map(graph.nodes.map((n) => [n.id, n]));
  const from = byId.get(source);
  const to = byId.get(target);
  if (!from || !to) return "Both ends must be nodes on the Canvas.";
  if (source === target) return "A node cannot lead to itself.";
  if (from.kind === "action") return "An action ends a path; nothing follows it.";
  if (to.kind === "trigger") return "A trigger starts a path; nothing leads into it.";
  if (graph.edges.some((e) => e.source === source && e.target === target)) return "These two are already connected.";
  if (to.kind === "gate") {
    // Would target reach source through gates? Then the new connection closes a circle.
    const next = new Map<string, string[]>();
    for (const e of graph.edges) next.set(e.source, [...(next.get(e.source) ?? []), e.target]);
    const seen = new Set<string>();
    const stack = [target];
    while (stack.length) {
      const id = stack.pop()!;
      if (id === source) return "That would send these gates round in a circle.";
      if (seen.has(id)) continue;
      seen.add(id);
      for (const t of next.get(id) ?? []) if (byId.get(t)?.kind === "gate") stack.push(t);
    }
  }
  return null;
}

/** Copies of the given nodes (and the connections among them) with fresh ids, shifted by `offset`. */
export function copyNodes(graph: RuleGraph, ids: ReadonlySet<string>, taken: Set<string>, offset: number): RuleGraph {
  const map = new Map<string, string>();
  const nodes: RuleNode[] = [];
  for (const n of graph.nodes) {
    if (!ids.has(n.id)) continue;
    const id = freshId(n.id, taken);
    taken.add(id);
    map.set(n.id, id);
    const p = n.position ?? { x: 0, y: 0 };
    nodes.push({ ...structuredClone(n), id, position: { x: p.x + offset, y: p.y + offset } } as RuleNode);
  }
  const edges = graph.edges.filter((e) => map.has(e.source) && map.has(e.target)).map((e) => ({ id: edgeId(map.get(e.source)!, map.get(e.target)!), source: map.get(e.source)!, target: map.get(e.target)! }));
  return { nodes, edges };
}

const content = (n: RuleNode) => JSON.stringify({ kind: n.kind, type: n.type, params: n.params });

/**
 * "Keep mine as a copy" after a save conflict: start from their draft and add,
 * beside it, copies of the nodes I added or changed since my last save (`base`),
 * with my new connections. Nothing of theirs is removed or altered, so neither
 * person's work is lost; the copies are returned selected for review.
 */
export function keepMineAsCopy(base: RuleGraph, mine: RuleGraph, theirs: RuleGraph): { graph: RuleGraph; copiedIds: string[] } {
  const baseById = new Map(base.nodes.map((n) => [n.id, n]));
  const baseEdges = new Set(base.edges.map((e) => `${e.source}>${e.target}`));
  const theirIds = new Set(theirs.nodes.map((n) => n.id));
  const taken = new Set([...theirIds, ...mine.nodes.map((n) => n.id)]);
  const map = new Map<string, string>();
  const nodes: RuleNode[] = [...theirs.nodes];
  for (const n of mine.nodes) {
    const before = baseById.get(n.id);
    if (before && content(before) === content(n)) continue;
    const id = theirIds.has(n.id) || before ? freshId(n.id, taken) : n.id;
    taken.add(id);
    map.set(n.id, id);
    const p = n.position ?? { x: 0, y: 0 };
    nodes.push({ ...structuredClone(n), id, position: { x: p.x + 40, y: p.y + 40 } } as RuleNode);
  }
  const resolve = (id: string) => map.get(id) ?? (theirIds.has(id) ? id : null);
  const edges = [...theirs.edges];
  const have = new Set(edges.map((e) => `${e.source}>${e.target}`));
  for (const e of mine.edges) {
    const isMine = !baseEdges.has(`${e.source}>${e.target}`) || map.has(e.source) || map.has(e.target);
    const [s, t] = [resolve(e.source), resolve(e.target)];
    if (!isMine || !s || !t || have.has(`${s}>${t}`)) continue;
    have.add(`${s}>${t}`);
    edges.push({ id: edgeId(s, t), source: s, target: t });
  }
  return { graph: { nodes, edges }, copiedIds: [...map.values()] };
}

/** A graph written without positions (the demo seed, the API) gets an auto-layout when opened; saved positions are kept as they are. */
export function placeMissing(graph: RuleGraph): RuleGraph {
  if (graph.nodes.every((n) => n.position)) return graph;
  const pos = autoLayout(
    graph.nodes.map((n) => ({ id: n.id, ...NODE_SIZE[n.kind] })),
    graph.edges,
  );
  return { ...graph, nodes: graph.nodes.map((n) => ({ ...n, position: pos.get(n.id) }) as RuleNode) };
}

/** The nearest place at or below/right of `want` where a node of `size` overlaps no other node, so an added node never hides one. */
export function freeSpot(nodes: { position: { x: number; y: number }; width?: number; height?: number }[], want: { x: number; y: number }, size: { width: number; height: number }): { x: number; y: number } {
  const margin = 16;
  const hits = (p: { x: number; y: number }) =>
    nodes.some((n) => p.x < n.position.x + (n.width ?? 212) + margin && p.x + size.width + margin > n.position.x && p.y < n.position.y + (n.height ?? 84) + margin && p.y + size.height + margin > n.position.y);
  for (let col = 0; col < 12; col++) {
    for (let row = 0; row < 12; row++) {
      const p = { x: Math.round(want.x + col * (size.width + margin * 2)), y: Math.round(want.y + row * (size.height + margin)) };
      if (!hits(p)) return p;
    }
  }
  return want;
}
