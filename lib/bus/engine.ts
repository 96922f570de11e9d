import type { RuleJson } from "@/lib/rules/compile";
import { evaluateWithClosures, evaluateWithRulesEngine } from "@/lib/rules/evaluate";
import { buildRuleIndex, type RuleIndex } from "@/lib/rules/rule-index";
import { createCore, emptyStep, recentIds, recentRingOf, scheduleMissing } from "./core";
import { groupByDevice, type Runtime } from "./runtime";
import { buildSiteModel, type SiteInput } from "./site-model";
import { canonical, initialState } from "./state";
import { TimerQueue } from "./timer-queue";
import type { DeviceEvent, EngineState, Step } from "./types";

export type EngineOptions = SiteInput & {
  /** The stored rule JSON of the active version, or an index already built from it (to share between engines). */
  rules: RuleJson[] | RuleIndex;
  /** Resume from a saved state (the live store); omit to start empty. */
  state?: EngineState;
};

/** Live engine: rules run through json-rules-engine (the reference evaluator), so steps are async. */
export type Engine = {
  ingest(event: DeviceEvent): Promise<Step>;
  advanceTo(ms: number): Promise<Step>;
  getState(): EngineState;
};

/** Replay engine: the same loop with rules compiled to closures, synchronous and several times faster. */
export type ReplayEngine = {
  ingest(event: DeviceEvent): Step;
  advanceTo(ms: number): Step;
  getState(): EngineState;
};

export function createEngine(options: EngineOptions): Engine {
  const rt = createRuntime(options);
  const core = createCore(rt);
  // Steps mutate one state: a caller that does not await must still get them one at a time, in call order.
  let chain: Promise<unknown> = Promise.resolve();
  const run = (input: Parameters<typeof core.begin>[0]) => {
    const step = chain.then(async () => {
      const duplicate = core.begin(input);
      if (duplicate) return duplicate;
      for (let p = core.next(); p; p = core.next()) core.finish(p, await evaluateWithRulesEngine(p.group, p.facts));
      return core.end();
    });
    chain = step.catch(() => undefined);
    return step;
  };
  return {
    ingest: (event) => run({ event }),
    advanceTo: (ms) => run({ advanceTo: ms }),
    getState: () => snapshot(rt),
  };
}

/**
 * `trace: false` is a replay's fast mode: the same state, changes, commands,
 * notices, actions and fired rules, but no trace entries (candidate rules,
 * gates, fact values, notes) — a trace is most of a step's cost. The engine is
 * deterministic, so a replay that needs one step's trace runs again from a
 * saved state with the trace on (lib/replay/run.ts) and gets exactly that step.
 */
export function createReplayEngine(options: EngineOptions, { trace = true }: { trace?: boolean } = {}): ReplayEngine {
  const rt = createRuntime(options, trace);
  const core = createCore(rt);
  const run = (input: Parameters<typeof core.begin>[0]) => {
    const duplicate = core.begin(input);
    if (duplicate) return duplicate;
    if (trace) for (let p = core.next(); p; p = core.next()) core.finish(p, evaluateWithClosures(p.group, p.facts));
    else for (let p = core.next(); p; p = core.next()) core.finishUntraced(p);
    return core.end();
  };
  return {
    ingest: (event) => run({ event }),
    advanceTo: (ms) => run({ advanceTo: ms }),
    getState: () => snapshot(rt),
  };
}

function createRuntime(options: EngineOptions, tracing = true): Runtime {
  const model = buildSiteModel(options);
  const index = Array.isArray(options.rules) ? buildRuleIndex(options.rules) : options.rules;
  const state = options.state ? structuredClone(options.state) : initialState(options.site.initialMode ?? "open");
  const timers = new TimerQueue(state.timers.entries, state.timers.nextSeq);
  const rt: Runtime = {
    model,
    index,
    state,
    timers,
    ...recentRingOf(state.recentEventIds),
    watchesByDevice: {
      thresholds: groupByDevice(index.watches.thresholds),
      vacancy: groupByDevice(index.watches.vacancy),
      leftOpen: groupByDevice(index.watches.leftOpen),
    },
    queue: [],
    out: emptyStep({ advanceTo: 0 }),
    tracing,
  };
  // A saved state may predate this rule version: drop clock timers no rule waits for, add the missing ones.
  const wanted = new Set(index.watches.schedules.map((w) => `schedule|${w.key}`));
  for (const e of state.timers.entries) if (e.payload.kind === "schedule" && !wanted.has(e.key)) timers.cancel(e.key);
  scheduleMissing(rt);
  return rt;
}

function snapshot(rt: Runtime): EngineState {
  return canonical({ ...rt.state, recentEventIds: recentIds(rt), timers: rt.timers.toJSON() });
}
