import type { RuleResult } from "json-rules-engine";
import type { Facts } from "./closures";
import type { FactSource } from "./registry";
import { rulesEngineFor, type IndexedRule, type RuleGroup } from "./rule-index";

/** A gate as the trace shows it: passed or not, and the fact values it saw. */
export type GateTrace = { nodeId: string; type: string; passed: boolean; facts: Record<string, unknown> };
/** One candidate rule for a trigger: passed only when every gate passed. */
export type RuleTrace = { ruleId: string; passed: boolean; gates: GateTrace[] };

/** Reads just the facts the group's gates need; an unknown value is null so it survives JSON. */
export function readFacts(group: RuleGroup, src: FactSource): Facts {
  const facts: Facts = {};
  for (const f of group.facts) facts[f.id] = f.read(src) ?? null;
  return facts;
}

export function evaluateWithClosures(group: RuleGroup, facts: Facts): RuleTrace[] {
  return group.rules.map((rule) => {
    const gates = rule.gates.map((g) => ({ nodeId: g.nodeId, type: g.type, passed: g.test(facts), facts: pick(facts, g.facts) }));
    return { ruleId: rule.id, passed: gates.every((g) => g.passed), gates };
  });
}

type ConditionResult = { result?: boolean };

export async function evaluateWithRulesEngine(group: RuleGroup, facts: Facts): Promise<RuleTrace[]> {
  const { results, failureResults } = await rulesEngineFor(group).run(facts);
  const byName = new Map<string, RuleResult>();
  for (const r of results) byName.set(r.name, r);
  for (const r of failureResults) byName.set(r.name, r);
  return group.rules.map((rule) => traceOf(rule, byName.get(rule.id), facts));
}

function traceOf(rule: IndexedRule, result: RuleResult | undefined, facts: Facts): RuleTrace {
  const conditions = result?.conditions as unknown as { all?: ConditionResult[] } & ConditionResult;
  const gates = rule.gates.map((g, i) => {
    const c = conditions?.all ? conditions.all[i] : conditions;
    return { nodeId: g.nodeId, type: g.type, passed: c?.result === true, facts: pick(facts, g.facts) };
  });
  return { ruleId: rule.id, passed: result?.result === true, gates };
}

function pick(facts: Facts, ids: string[]): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const id of ids) out[id] = facts[id];
  return out;
}
