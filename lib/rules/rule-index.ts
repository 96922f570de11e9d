import { Engine } from "json-rules-engine";
import type { TimeOfDay } from "@/lib/sun/schedule";
import { compileCondition, factsOf, type ConditionJson, type Test } from "./closures";
import type { PathParams, RuleJson } from "./compile";
import { factReader, registerOperators, type FactReader } from "./registry";

/**
 * The trigger index built from stored rule JSON: rules grouped by trigger key,
 * each group with the facts its gates read, its closures, and (made on first
 * use) its own json-rules-engine Engine. One small Engine per key keeps a run
 * to the few rules that can match; one big Engine runs them all every time.
 */
export type CompiledGate = { nodeId: string; type: string; test: Test; facts: string[] };
export type IndexedRule = { id: string; order: number; priority: number; json: RuleJson; params: PathParams; gates: CompiledGate[] };
export type RuleGroup = { key: string; rules: IndexedRule[]; facts: FactReader[]; engine: Engine | null };

export type Measure = "lux" | "temperature" | "humidity";
export type ThresholdWatch = { key: string; device: string; measure: Measure; direction: "above" | "below"; threshold: number; hysteresis: number };
export type DelayWatch = { key: string; device: string; minutes: number };
export type ScheduleWatch = { key: string; at: TimeOfDay };

/** What the engine must watch for to derive triggers from raw readings and the clock. Sorted by key. */
export type Watches = { thresholds: ThresholdWatch[]; vacancy: DelayWatch[]; leftOpen: DelayWatch[]; schedules: ScheduleWatch[] };

export type RuleIndex = { rules: IndexedRule[]; groups: Map<string, RuleGroup>; watches: Watches };

export function buildRuleIndex(rules: RuleJson[]): RuleIndex {
  const indexed = rules.map((json, order) => indexRule(json, order));
  const groups = new Map<string, RuleGroup>();
  for (const rule of indexed) {
    const key = rule.params.triggerKey;
    const group = groups.get(key) ?? { key, rules: [], facts: [], engine: null };
    group.rules.push(rule);
    groups.set(key, group);
  }
  for (const group of groups.values()) {
    // Highest override level first, then Canvas order: the order actions are applied in.
    group.rules.sort((a, b) => b.priority - a.priority || a.order - b.order);
    const ids = [...new Set(group.rules.flatMap((r) => r.gates.flatMap((g) => g.facts)))].sort();
    group.facts = ids.map(factReader);
  }
  return { rules: indexed, groups, watches: watchesOf(indexed) };
}

function indexRule(json: RuleJson, order: number): IndexedRule {
  const params = json.event.params;
  const conditions = json.conditions as ConditionJson;
  const entries: ConditionJson[] = "all" in conditions ? conditions.all : [conditions];
  const gates = entries.map((c, i) => ({
    nodeId: params.gates[i]?.nodeId ?? `condition-${i}`,
    type: params.gates[i]?.type ?? "condition",
    test: compileCondition(c),
    facts: factsOf(c),
  }));
  return { id: params.ruleId, order, priority: json.priority, json, params, gates };
}

/** The group's json-rules-engine Engine, built the first time the live path needs it. */
export function rulesEngineFor(group: RuleGroup): Engine {
  if (!group.engine) {
    const engine = new Engine([], { allowUndefinedFacts: true });
    registerOperators(engine);
    // The library keeps references to what it is given; hand it copies so stored JSON stays untouched.
    for (const rule of group.rules) engine.addRule(structuredClone(rule.json));
    group.engine = engine;
  }
  return group.engine;
}

function watchesOf(rules: IndexedRule[]): Watches {
  const thresholds = new Map<string, ThresholdWatch>();
  const vacancy = new Map<string, DelayWatch>();
  const leftOpen = new Map<string, DelayWatch>();
  const schedules = new Map<string, ScheduleWatch>();
  for (const { params } of rules) {
    const key = params.triggerKey;
    const t = params.trigger;
    switch (t.type) {
      case "light-level-below":
      case "light-level-above":
        thresholds.set(key, { key, device: t.params.device, measure: "lux", direction: direction(t.type), threshold: t.params.lux, hysteresis: t.params.hysteresisLux });
        break;
      case "temperature-above":
      case "temperature-below":
        thresholds.set(key, { key, device: t.params.device, measure: "temperature", direction: direction(t.type), threshold: t.params.celsius, hysteresis: t.params.hysteresis });
        break;
      case "humidity-above":
      case "humidity-below":
        thresholds.set(key, { key, device: t.params.device, measure: "humidity", direction: direction(t.type), threshold: t.params.percent, hysteresis: t.params.hysteresis });
        break;
      case "vacancy":
        vacancy.set(key, { key, device: t.params.device, minutes: t.params.minutes });
        break;
      case "contact-left-open":
        leftOpen.set(key, { key, device: t.params.device, minutes: t.params.minutes });
        break;
      case "time-of-day":
        schedules.set(key, { key, at: t.params.at });
        break;
    }
  }
  const sorted = <T extends { key: string }>(m: Map<string, T>) => [...m.values()].sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  return { thresholds: sorted(thresholds), vacancy: sorted(vacancy), leftOpen: sorted(leftOpen), schedules: sorted(schedules) };
}

const direction = (type: string) => (type.endsWith("-above") ? "above" : "below");
