import type { RuleGraph, RuleNode } from "./graph";
import { ruleGroups, sentence, type SiteNames } from "./sentence";

/**
 * What changes between two Rule sets, rule by rule, in plain sentences: shown
 * before Activate and before rolling back to an earlier version. A rule is a
 * trigger with its gate chain (as the compiler groups paths); two rules are the
 * same rule when they have the same trigger and gate ids, and unchanged when
 * their content (types and parameters, not positions) is equal. A rule whose ids
 * changed but whose content did not (a pasted copy replacing the original) counts
 * as unchanged, so the summary only lists what behaves differently.
 */
export type RuleChange = { before: string; after: string };
export type RuleDiff = { added: string[]; removed: string[]; changed: RuleChange[]; unchanged: number };

type Rule = { id: string; content: string; text: string };

const strip = (n: RuleNode) => ({ kind: n.kind, type: n.type, params: n.params });

/** JSON with sorted keys, so parameter order never makes two equal rules look different. */
function canonical(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(canonical).join(",")}]`;
  if (value && typeof value === "object") {
    return `{${Object.keys(value)
      .sort()
      .filter((k) => (value as Record<string, unknown>)[k] !== undefined)
      .map((k) => `${JSON.stringify(k)}:${canonical((value as Record<string, unknown>)[k])}`)
      .join(",")}}`;
  }
  return JSON.stringify(value);
}

export function rulesOf(graph: RuleGraph, names: SiteNames): Rule[] {
  return ruleGroups(graph).map((g) => ({
    id: g.id,
    // Actions of one rule run in graph order, but their order does not change what the rule does.
    content: canonical({ trigger: strip(g.trigger), gates: g.gates.map(strip), actions: g.actions.map(strip).map(canonical).sort() }),
    text: sentence(g.trigger, g.gates, g.actions, names),
  }));
}

export function diffGraphs(from: RuleGraph, to: RuleGraph, names: SiteNames): RuleDiff {
  const before = rulesOf(from, names);
  const after = rulesOf(to, names);
  const beforeById = new Map(before.map((r) => [r.id, r]));
  const afterIds = new Set(after.map((r) => r.id));
  // Content left over on the old side, counted so duplicates pair off one to one.
  const spare = new Map<string, number>();
  for (const r of before) if (!afterIds.has(r.id)) spare.set(r.content, (spare.get(r.content) ?? 0) + 1);

  const diff: RuleDiff = { added: [], removed: [], changed: [], unchanged: 0 };
  const matchedByContent = new Map<string, number>();
  for (const r of after) {
    const old = beforeById.get(r.id);
    if (old) {
      if (old.content === r.content) diff.unchanged++;
      else if (old.text === r.text) diff.changed.push({ before: old.text, after: `${r.text} (settings such as hysteresis or fade changed)` });
      else diff.changed.push({ before: old.text, after: r.text });
    } else if ((spare.get(r.content) ?? 0) > 0) {
      spare.set(r.content, spare.get(r.content)! - 1);
      matchedByContent.set(r.content, (matchedByContent.get(r.content) ?? 0) + 1);
      diff.unchanged++;
    } else diff.added.push(r.text);
  }
  for (const r of before) {
    if (afterIds.has(r.id)) continue;
    const used = matchedByContent.get(r.content) ?? 0;
    if (used > 0) matchedByContent.set(r.content, used - 1);
    else diff.removed.push(r.text);
  }
  return diff;
}

/** The diff as lines a person reads top to bottom. */
export function diffSentences(diff: RuleDiff): string[] {
  return [
    ...diff.added.map((t) => `Added: ${t}.`),
    ...diff.removed.map((t) => `Removed: ${t}.`),
    ...diff.changed.map((c) => `Changed: ${c.before} → now: ${c.after}.`),
  ];
}
