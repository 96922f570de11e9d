import type { ActionNode, GateNode, RuleGraph, TriggerNode } from "./graph";
import { enumeratePaths } from "./paths";
import { factId, type OperatorName } from "./registry";
import { OVERRIDE_RANK, TRIGGER_LEVEL, triggerKeyOf, type OverrideLevel } from "./trigger-key";

/**
 * Canvas graph → json-rules-engine rules. The rule JSON is the stored form of an
 * activated rule set: both evaluators and the trigger index are rebuilt from it,
 * so a stored version replays exactly as it ran.
 */
type Described<T extends { id: string; type: string; params: unknown }> = T extends unknown
  ? { nodeId: string; type: T["type"]; params: T["params"] }
  : never;

export type PathTrigger = Described<TriggerNode>;
export type PathAction = Described<ActionNode>;
export type PathGate = { nodeId: string; type: GateNode["type"] };

export type LeafCondition = { fact: string; operator: OperatorName; value: unknown; name: string };

export type PathParams = {
  ruleId: string;
  triggerKey: string;
  /** The override level the actions write at (from the trigger: a press is Manual, a reading Sensor …). */
  level: OverrideLevel;
  trigger: PathTrigger;
  gates: PathGate[];
  actions: PathAction[];
};

export type RuleJson = {
  name: string;
  priority: number;
  /** One named condition per gate, in path order; no gates → always passes. */
  conditions: { all: LeafCondition[] };
  event: { type: "path"; params: PathParams };
};

export function compileGraph(graph: RuleGraph): RuleJson[] {
  const rules = new Map<string, RuleJson>();
  for (const path of enumeratePaths(graph)) {
    // Actions reached through the same gate chain share one rule: one evaluation, one trace line.
    const ruleId = [path.trigger.id, ...path.gates.map((g) => g.id)].join(">");
    let rule = rules.get(ruleId);
    if (!rule) {
      const level = TRIGGER_LEVEL[path.trigger.type];
      rule = {
        name: ruleId,
        priority: OVERRIDE_RANK[level],
        conditions: { all: path.gates.map(gateCondition) },
        event: {
          type: "path",
          params: {
            ruleId,
            triggerKey: triggerKeyOf(path.trigger),
            level,
            trigger: describe(path.trigger) as PathTrigger,
            gates: path.gates.map((g) => ({ nodeId: g.id, type: g.type })),
            actions: [],
          },
        },
      };
      rules.set(ruleId, rule);
    }
    const actions = rule.event.params.actions;
    if (!actions.some((a) => a.nodeId === path.action.id)) actions.push(describe(path.action) as PathAction);
  }
  return [...rules.values()];
}

function describe(node: TriggerNode | ActionNode) {
  return { nodeId: node.id, type: node.type, params: structuredClone(node.params) };
}

/** Each gate is exactly one condition so a trace can report it as passed or failed with the fact it read. */
export function gateCondition(gate: GateNode): LeafCondition {
  const name = gate.id;
  switch (gate.type) {
    case "time-window":
      return { name, fact: factId("clock"), operator: "inDayWindow", value: { from: gate.params.from, to: gate.params.to } };
    case "days-of-week":
      return { name, fact: factId("weekday"), operator: "oneOf", value: [...gate.params.days] };
    case "light-level-below":
      return { name, fact: factId("lux", gate.params.device), operator: "below", value: gate.params.lux };
    case "zone-occupied":
      return { name, fact: factId("occupied", gate.params.zone), operator: "is", value: true };
    case "zone-vacant":
      return { name, fact: factId("occupied", gate.params.zone), operator: "is", value: false };
    case "site-mode-is":
      return { name, fact: factId("site-mode"), operator: "oneOf", value: [...gate.params.modes] };
    case "emergency-not-active":
      return { name, fact: factId("emergency-active"), operator: "is", value: false };
  }
}
