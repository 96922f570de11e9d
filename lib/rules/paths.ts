import type { ActionNode, GateNode, RuleGraph, RuleNode, TriggerNode } from "./graph";

/** One way through the Canvas: a trigger, the gates passed in order, and the action reached. */
export type RulePath = { trigger: TriggerNode; gates: GateNode[]; action: ActionNode };

/** A graph with many diamond-shaped gate chains could have exponentially many paths; stop well before that hurts. */
export const MAX_PATHS = 10_000;

export function nodesById(graph: RuleGraph): Map<string, RuleNode> {
  const byId = new Map<string, RuleNode>();
  for (const node of graph.nodes) if (!byId.has(node.id)) byId.set(node.id, node);
  return byId;
}

/** Edges that make sense for flow (trigger/gate → gate/action), in graph order, without repeats. */
export function flowAdjacency(graph: RuleGraph, byId = nodesById(graph)): Map<string, string[]> {
  const next = new Map<string, string[]>();
  for (const edge of graph.edges) {
    const from = byId.get(edge.source);
    const to = byId.get(edge.target);
    if (!from || !to || from.kind === "action" || to.kind === "trigger") continue;
    const list = next.get(from.id) ?? [];
    if (!list.includes(to.id)) list.push(to.id);
    next.set(from.id, list);
  }
  return next;
}

/**
 * Every trigger → gates… → action path, depth first in node and edge order so the
 * same graph always gives the same list. A gate already on the current path is
 * not entered again (validate.ts reports the cycle).
 */
export function enumeratePaths(graph: RuleGraph): RulePath[] {
  const byId = nodesById(graph);
  const next = flowAdjacency(graph, byId);
  const paths: RulePath[] = [];

  const walk = (trigger: TriggerNode, fromId: string, gates: GateNode[]) => {
    for (const targetId of next.get(fromId) ?? []) {
      if (paths.length >= MAX_PATHS) return;
      const node = byId.get(targetId)!;
      if (node.kind === "action") paths.push({ trigger, gates, action: node });
      else if (node.kind === "gate" && !gates.some((g) => g.id === node.id)) walk(trigger, node.id, [...gates, node]);
    }
  };

  for (const node of byId.values()) if (node.kind === "trigger") walk(node, node.id, []);
  return paths;
}
