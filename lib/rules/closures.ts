import { OPERATORS, type OperatorName } from "./registry";

/**
 * Rule conditions compiled to plain functions for replay: the same JSON and the
 * same operator functions as the json-rules-engine path, minus its promises and
 * per-run almanac. A differential test holds the two to identical results.
 */
export type ConditionJson =
  | { all: ConditionJson[] }
  | { any: ConditionJson[] }
  | { not: ConditionJson }
  | { fact: string; operator: string; value: unknown; name?: string };

export type Facts = Record<string, unknown>;
export type Test = (facts: Facts) => boolean;

export function compileCondition(condition: ConditionJson): Test {
  if ("all" in condition) {
    const parts = condition.all.map(compileCondition);
    return (facts) => parts.every((t) => t(facts));
  }
  if ("any" in condition) {
    const parts = condition.any.map(compileCondition);
    // json-rules-engine answers true for an empty "any" too (its empty-set shortcut); match it.
    if (parts.length === 0) return () => true;
    return (facts) => parts.some((t) => t(facts));
  }
  if ("not" in condition) {
    const inner = compileCondition(condition.not);
    return (facts) => !inner(facts);
  }
  const op = OPERATORS[condition.operator as OperatorName];
  if (!op) throw new Error(`unknown operator "${condition.operator}"`);
  const { fact, value } = condition;
  return (facts) => op(facts[fact], value);
}

/** The fact ids a condition reads, in first-use order. */
export function factsOf(condition: ConditionJson, out: string[] = []): string[] {
  if ("all" in condition) condition.all.forEach((c) => factsOf(c, out));
  else if ("any" in condition) condition.any.forEach((c) => factsOf(c, out));
  else if ("not" in condition) factsOf(condition.not, out);
  else if (!out.includes(condition.fact)) out.push(condition.fact);
  return out;
}
