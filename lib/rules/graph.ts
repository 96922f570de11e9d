import { z } from "zod";
import { actionNodeSchema, type ActionNode } from "./graph-actions";
import { nodeId } from "./graph-fields";
import { gateNodeSchema, type GateNode } from "./graph-gates";
import { triggerNodeSchema, type TriggerNode } from "./graph-triggers";

/**
 * A Canvas graph as data: Trigger → Gate… → Action nodes joined by edges. The
 * compiler turns it into rules; validate.ts explains what is wrong with it.
 */
export const ruleNodeSchema = z.discriminatedUnion("kind", [triggerNodeSchema, gateNodeSchema, actionNodeSchema], {
  error: "A node is a trigger, a gate or an action.",
});

export const ruleEdgeSchema = z.object({
  id: z.string({ error: "Every connection needs an id." }).min(1, "Every connection needs an id."),
  source: nodeId,
  target: nodeId,
});

export const ruleGraphSchema = z.object({
  nodes: z.array(ruleNodeSchema, { error: "The graph needs a list of nodes." }),
  edges: z.array(ruleEdgeSchema, { error: "The graph needs a list of connections." }),
});

export type RuleNode = TriggerNode | GateNode | ActionNode;
export type RuleEdge = z.output<typeof ruleEdgeSchema>;
export type RuleGraph = z.output<typeof ruleGraphSchema>;
/** What a Canvas or a test may write: defaults (hysteresis, othersOff …) may be left out. */
export type RuleGraphInput = z.input<typeof ruleGraphSchema>;

export type { ActionNode, GateNode, TriggerNode };
export type { ActionType } from "./graph-actions";
export type { GateType } from "./graph-gates";
export type { TriggerType } from "./graph-triggers";

/** Edges joining the nodes in order: chainEdges("t", "g", "a") gives t→g and g→a. */
export function chainEdges(...ids: string[]): RuleEdge[] {
  return ids.slice(1).map((target, i) => ({ id: `e-${ids[i]}--${target}`, source: ids[i], target }));
}

export function parseRuleGraph(input: unknown): RuleGraph {
  return ruleGraphSchema.parse(input);
}
