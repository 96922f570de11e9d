import type { z } from "zod";
import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import { ruleGraphSchema, type RuleGraph, type RuleNode } from "./graph";
import { enumeratePaths, flowAdjacency, nodesById } from "./paths";
import { validateLoopsAndConflicts } from "./validate-loops";
import { validateAgainstSite } from "./validate-site";

export type Problem = { nodeId?: string; severity: "error" | "warning"; message: string };

/** What validation needs to know about the site: which devices, zones and scenes exist. */
export type SiteContext = {
  devices: { id: string; kind: DeviceKind; zoneId: string | null; name?: string }[];
  zones: { id: string; name?: string }[];
  scenes?: { number: number; name: string; levels?: { zoneId?: string; deviceId?: string; level: number }[] }[];
};

/**
 * Everything wrong with a Canvas graph, in words for the person editing it.
 * Errors stop a Rule set from being activated; warnings are worth a look.
 * A graph that does not even parse gets only its field messages.
 */
export function validateGraph(input: unknown, site: SiteContext): Problem[] {
  const parsed = ruleGraphSchema.safeParse(input);
  if (!parsed.success) return schemaProblems(input, parsed.error);
  const graph = parsed.data;
  return [...validateStructure(graph), ...validateAgainstSite(graph, site), ...validateLoopsAndConflicts(graph, site)];
}

function schemaProblems(input: unknown, error: z.ZodError): Problem[] {
  const nodes = (input as { nodes?: { id?: unknown }[] } | null)?.nodes;
  return error.issues.map((issue) => {
    const [list, index] = issue.path;
    const id = list === "nodes" && typeof index === "number" && Array.isArray(nodes) ? nodes[index]?.id : undefined;
    return typeof id === "string" ? { nodeId: id, severity: "error", message: issue.message } : { severity: "error", message: issue.message };
  });
}

const label = (n: RuleNode) => `${n.kind === "gate" ? "This gate" : n.kind === "trigger" ? "This trigger" : "This action"}`;

export function validateStructure(graph: RuleGraph): Problem[] {
  const problems: Problem[] = [];
  const seen = new Set<string>();
  for (const n of graph.nodes) {
    if (seen.has(n.id)) problems.push({ nodeId: n.id, severity: "error", message: `Two nodes share the id "${n.id}"; give each its own.` });
    seen.add(n.id);
  }
  const byId = nodesById(graph);
  const touched = new Set<string>();
  const edgeKeys = new Set<string>();
  for (const e of graph.edges) {
    const from = byId.get(e.source);
    const to = byId.get(e.target);
    if (from) touched.add(from.id);
    if (to) touched.add(to.id);
    if (!from || !to) {
      problems.push({ nodeId: from?.id ?? to?.id, severity: "error", message: "A connection leads to a node that is no longer on the Canvas; remove it." });
      continue;
    }
    const key = `${e.source}->${e.target}`;
    if (edgeKeys.has(key)) problems.push({ nodeId: to.id, severity: "warning", message: "These two nodes are connected twice; one connection is enough." });
    edgeKeys.add(key);
    if (from.id === to.id) problems.push({ nodeId: from.id, severity: "error", message: `${label(from)} is connected to itself.` });
    else if (to.kind === "trigger") problems.push({ nodeId: to.id, severity: "error", message: "A trigger starts a path; nothing can lead into it." });
    else if (from.kind === "action") problems.push({ nodeId: from.id, severity: "error", message: "An action ends a path; connect it from a trigger or gate, not onward." });
  }

  const next = flowAdjacency(graph, byId);
  const reached = new Set<string>();
  for (const path of enumeratePaths(graph)) {
    reached.add(path.action.id);
    for (const g of path.gates) reached.add(g.id);
  }
  for (const n of byId.values()) {
    if (!touched.has(n.id)) {
      problems.push({ nodeId: n.id, severity: "warning", message: `${label(n)} is not connected to anything.` });
      continue;
    }
    const hasOut = (next.get(n.id) ?? []).length > 0;
    if (n.kind === "trigger" && !hasOut) problems.push({ nodeId: n.id, severity: "warning", message: "This trigger leads to no gate or action, so nothing happens when it fires." });
    if (n.kind === "gate" && !hasOut) problems.push({ nodeId: n.id, severity: "warning", message: "This gate leads to no action." });
    if (n.kind === "gate" && !reached.has(n.id) && hasOut) problems.push({ nodeId: n.id, severity: "warning", message: "No trigger leads to this gate, so it is never checked." });
    if (n.kind === "action" && !reached.has(n.id)) problems.push({ nodeId: n.id, severity: "error", message: "No trigger reaches this action, so it never runs." });
  }
  for (const gateId of gateCycles(graph, next, byId)) {
    problems.push({ nodeId: gateId, severity: "error", message: "These gates lead round in a circle; a path must run from a trigger to an action." });
  }
  return problems;
}

/** One gate per cycle among gates (the first met in graph order). */
function gateCycles(graph: RuleGraph, next: Map<string, string[]>, byId: Map<string, RuleNode>): string[] {
  const state = new Map<string, "open" | "done">();
  const found: string[] = [];
  const visit = (id: string) => {
    state.set(id, "open");
    for (const t of next.get(id) ?? []) {
      if (byId.get(t)?.kind !== "gate") continue;
      if (state.get(t) === "open") found.push(t);
      else if (!state.has(t)) visit(t);
    }
    state.set(id, "done");
  };
  for (const n of graph.nodes) if (n.kind === "gate" && !state.has(n.id)) visit(n.id);
  return [...new Set(found)];
}
