import { createReplayEngine, type ReplayEngine } from "@/lib/bus/engine";
import type { SiteInput } from "@/lib/bus/site-model";
import type { DeviceEvent, EngineState, Step, TraceEntry } from "@/lib/bus/types";
import { isLuminaire } from "@/lib/catalogue/device-kinds";
import type { RuleJson } from "@/lib/rules/compile";
import { buildRuleIndex, type RuleIndex } from "@/lib/rules/rule-index";
import { effectKeys, effectsOf, hasEffects, isSameOutcome, unmatched, type Names } from "./outcome";
import { createStepSeries, type StepSeries } from "./series";
import type { Difference, ReplayResult, RunCounts, RunResult, StepInput, TimelineEntry } from "./types";

/** Kept per run and for a Compare; a year holds far more, and a browser needs far less. */
export const TIMELINE_CAP = 1000;
export const DIFFERENCE_CAP = 300;
/**
 * Inputs run since the last saved state at most, before the traces they need
 * are filled in. Short on purpose: what a segment holds on to then dies young.
 * Held across several young-generation collections (4,096 inputs here), V8
 * learns to make those objects in the old generation, and a year's replay spent
 * a third of its time collecting them (measured with bench/replay.ts).
 */
export const SEGMENT = 128;

export type ReplaySpec = { label: string; rules: RuleJson[] | RuleIndex };
export type ReplayFilter = { device?: string; zone?: string };
export type ReplayOptions = {
  input: SiteInput;
  runs: ReplaySpec[];
  window: { from: number; to: number };
  filter?: ReplayFilter;
  /** Called with every step of every run (tests compare them with the live store's); the runs then keep their full trace. */
  onStep?: (run: number, input: StepInput, step: Step) => void;
  /** Inputs per segment (tests use small ones to cross many boundaries). */
  segment?: number;
};

type RunState = {
  spec: ReplaySpec;
  rules: RuleIndex;
  engine: ReplayEngine;
  counts: RunCounts;
  timeline: TimelineEntry[];
  isTimelineCut: boolean;
  levels: Map<string, number>;
  relays: Map<string, boolean>;
  mode: string;
  isEmergency: boolean;
  zoneSeries: Map<string, StepSeries>;
  /** Per luminaire: its zone's running sum of levels and series (the zone line is the mean of its luminaires). */
  zoneOf: Map<string, { sum: number; members: number; series: StepSeries }>;
  relaySeries: Map<string, StepSeries>;
};

/** An event of the window, or null for the end of the window (the timers due before it). */
type Input = DeviceEvent | null;
/**
 * A step whose trace is wanted (a timeline line, a difference), filled in when
 * its segment is run again with the trace on; `fired` is what each run fired the
 * first time (null: that run's trace is not wanted), to check the second run.
 */
type Hole = { index: number; fired: (string[] | null)[]; fill: (traces: TraceEntry[][]) => void };

/**
 * Runs a window of the log through one rule set (a Replay) or two (a Compare)
 * in virtual time, one event at a time, with the replay engine (closures: the
 * same loop and outputs as the live engine). Memory stays flat: the timeline
 * and the differences are capped, the series downsampled as they grow.
 * Both runs start from an empty state at the start of the window.
 *
 * Speed: the runs go without a trace (most of a step's cost; see
 * createReplayEngine). Only the steps that reach the timeline or the
 * differences need theirs: the engine is deterministic, so the inputs since the
 * last saved state (a segment of at most SEGMENT) are run again from that state
 * with the trace on, and those steps' traces are taken from the second run. Once
 * the timeline and the differences are full, no state is saved any more.
 */
export function createReplay(options: ReplayOptions) {
  const { input, window, filter } = options;
  const traceAll = !!options.onStep;
  const segmentSize = options.segment ?? SEGMENT;
  const devices = new Map(input.devices.map((d) => [d.id, d]));
  const names: Names = { device: (id) => devices.get(id)?.name ?? id };
  const luminairesByZone = new Map<string, string[]>();
  for (const d of input.devices) if (isLuminaire(d.kind) && d.zoneId) luminairesByZone.set(d.zoneId, [...(luminairesByZone.get(d.zoneId) ?? []), d.id]);
  const relays = input.devices.filter((d) => d.kind === "relay");
  const initialMode = input.site.initialMode ?? "open";

  const runs: RunState[] = options.runs.map((spec) => {
    const rules = Array.isArray(spec.rules) ? buildRuleIndex(spec.rules) : spec.rules;
    const zoneSeries = new Map<string, StepSeries>();
    const zoneOf = new Map<string, { sum: number; members: number; series: StepSeries }>();
    for (const [zoneId, members] of luminairesByZone) {
      const s = createStepSeries(window.from, window.to);
      s.add(window.from, 0);
      zoneSeries.set(zoneId, s);
      const acc = { sum: 0, members: members.length, series: s };
      for (const id of members) zoneOf.set(id, acc);
    }
    const relaySeries = new Map<string, StepSeries>();
    for (const r of relays) {
      const s = createStepSeries(window.from, window.to);
      s.add(window.from, 0);
      relaySeries.set(r.id, s);
    }
    return {
      spec,
      rules,
      engine: createReplayEngine({ ...input, rules }, { trace: traceAll }),
      counts: { steps: 0, firings: 0, actions: 0, changes: 0, notices: 0, commands: 0 },
      timeline: [],
      isTimelineCut: false,
      levels: new Map(),
      relays: new Map(),
      mode: initialMode,
      isEmergency: false,
      zoneSeries,
      zoneOf,
      relaySeries,
    };
  });

  const differences: Difference[] = [];
  let isDiffCut = false;
  let root = 0;
  let knockOn = 0;
  let events = 0;
  /** What the two runs' lighting, relays, mode and emergency disagree on: to tell when they have parted. */
  const partedLevels = new Set<string>();
  const partedRelays = new Set<string>();
  let isModeParted = false;
  let isEmergencyParted = false;

  // The current segment: the state each run started it from, its inputs, and the steps in it that want a trace.
  let saved: EngineState[] | null = null;
  let segment: Input[] = [];
  let holes: Hole[] = [];
  // The caps only fill up: once no trace can be wanted, none ever will be (and the question is not asked per event again).
  let isTracing = !traceAll;
  const mayWantTraces = () => (isTracing &&= runs.some((r) => r.timeline.length < TIMELINE_CAP) || (runs.length === 2 && differences.length < DIFFERENCE_CAP));

  /** What a timeline line or a difference says the step ran for; made only for those (not a new object per event). */
  const stepInput = (item: Input): StepInput =>
    item ? { key: item.id, at: item.at, device: item.device, kind: item.kind, value: item.value } : { key: "end-of-window", at: window.to, device: null, kind: "timers up to the end of the window", value: null };

  const isWanted = (item: Input, step: Step): boolean => {
    if (!filter?.device && !filter?.zone) return true;
    const touches = (deviceId: string | null) => {
      if (!deviceId) return false;
      if (filter.device && deviceId === filter.device) return true;
      return !!filter.zone && devices.get(deviceId)?.zoneId === filter.zone;
    };
    if (touches(item?.device ?? null)) return true;
    for (const c of step.changes) if ((c.kind === "level" || c.kind === "relay") && touches(c.deviceId)) return true;
    return false;
  };

  /** Hands the runs' traces of this step to `set`: now when the runs keep theirs, else once the segment has been run again. */
  function traceFor(steps: (Step | null)[], set: (traces: TraceEntry[][]) => void) {
    if (traceAll) set(steps.map((s) => s?.trace ?? []));
    else holes.push({ index: segment.length - 1, fired: steps.map((s) => (s ? s.fired.slice() : null)), fill: set });
  }

  function record(run: RunState, item: Input, step: Step) {
    const c = run.counts;
    c.steps++;
    c.firings += step.fired.length;
    c.actions += step.actions.length;
    c.changes += step.changes.length;
    c.notices += step.notices.length;
    c.commands += step.commands.length;
    for (const ch of step.changes) {
      if (ch.kind === "level") {
        const from = run.levels.get(ch.deviceId) ?? 0;
        run.levels.set(ch.deviceId, ch.to);
        const zone = run.zoneOf.get(ch.deviceId);
        if (zone) {
          zone.sum += ch.to - from;
          zone.series.add(ch.at, Math.round((zone.sum / zone.members) * 10) / 10);
        }
      } else if (ch.kind === "relay") {
        run.relays.set(ch.deviceId, ch.isOn);
        run.relaySeries.get(ch.deviceId)?.add(ch.at, ch.isOn ? 1 : 0);
      } else if (ch.kind === "mode") run.mode = ch.to;
      else run.isEmergency = ch.isActive;
    }
    if (step.matched === 0 && !hasEffects(step)) return;
    if (run.timeline.length >= TIMELINE_CAP) {
      if (!run.isTimelineCut && isWanted(item, step)) run.isTimelineCut = true;
      return;
    }
    if (!isWanted(item, step)) return;
    const entry: TimelineEntry = { ...stepInput(item), fired: step.fired.slice(), effects: effectsOf(step, names), trace: [] };
    run.timeline.push(entry);
    const i = runs.indexOf(run);
    traceFor(runs.map((_, j) => (j === i ? step : null)), (traces) => (entry.trace = traces[i]));
  }

  function compare(item: Input, a: Step, b: Step, wasParted: boolean) {
    if (!hasEffects(a) && !hasEffects(b)) return;
    if (isSameOutcome(a, b)) return;
    const ka = effectKeys(a);
    const kb = effectKeys(b);
    const missA = unmatched(ka, kb);
    const missB = unmatched(kb, ka);
    if (!missA.length && !missB.length) return;
    if (wasParted) knockOn++;
    else root++;
    if (differences.length >= DIFFERENCE_CAP) {
      isDiffCut = true;
      return;
    }
    const sa = effectsOf(a, names);
    const sb = effectsOf(b, names);
    const onlyA = missA.map((i) => sa[i]);
    const onlyB = missB.map((i) => sb[i]);
    const difference: Difference = { ...stepInput(item), isKnockOn: wasParted, onlyA, onlyB, traceA: [], traceB: [] };
    differences.push(difference);
    traceFor([a, b], ([traceA, traceB]) => {
      difference.traceA = traceA;
      difference.traceB = traceB;
    });
  }

  function updateParted(a: Step, b: Step) {
    const [ra, rb] = runs;
    for (const step of [a, b])
      for (const ch of step.changes) {
        if (ch.kind === "level") {
          if ((ra.levels.get(ch.deviceId) ?? 0) === (rb.levels.get(ch.deviceId) ?? 0)) partedLevels.delete(ch.deviceId);
          else partedLevels.add(ch.deviceId);
        } else if (ch.kind === "relay") {
          if ((ra.relays.get(ch.deviceId) ?? false) === (rb.relays.get(ch.deviceId) ?? false)) partedRelays.delete(ch.deviceId);
          else partedRelays.add(ch.deviceId);
        } else if (ch.kind === "mode") isModeParted = ra.mode !== rb.mode;
        else isEmergencyParted = ra.isEmergency !== rb.isEmergency;
      }
  }

  const go = (engine: ReplayEngine, item: Input) => (item ? engine.ingest(item) : engine.advanceTo(window.to));

  function run(item: Input) {
    if (segment.length === 0 && mayWantTraces()) saved = runs.map((r) => r.engine.getState());
    if (saved) segment.push(item);
    const wasParted = partedLevels.size > 0 || partedRelays.size > 0 || isModeParted || isEmergencyParted;
    // Plain loops: this runs once per event of a year.
    const a = go(runs[0].engine, item);
    const b = runs.length === 2 ? go(runs[1].engine, item) : null;
    if (options.onStep) {
      options.onStep(0, stepInput(item), a);
      if (b) options.onStep(1, stepInput(item), b);
    }
    record(runs[0], item, a);
    if (b) {
      record(runs[1], item, b);
      compare(item, a, b, wasParted);
      updateParted(a, b);
    }
    if (segment.length >= segmentSize) fillTraces();
  }

  /** Runs the segment again from its saved states with the trace on, up to its last step that wants one. */
  function fillTraces() {
    const wanted = holes;
    const inputs = segment;
    const states = saved;
    holes = [];
    segment = [];
    saved = null;
    if (!wanted.length || !states) return;
    const engines = runs.map((r, i) => createReplayEngine({ ...input, rules: r.rules, state: states[i] }, { trace: true }));
    const last = wanted[wanted.length - 1].index;
    let h = 0;
    for (let i = 0; i <= last; i++) {
      const steps = engines.map((e) => go(e, inputs[i]));
      for (; h < wanted.length && wanted[h].index === i; h++) {
        const hole = wanted[h];
        // Deterministic, so the second run must fire what the first did; anything else is a bug worth stopping for.
        steps.forEach((s, r) => {
          const fired = hole.fired[r];
          if (fired && s.fired.join("\n") !== fired.join("\n")) throw new Error(`Replay: the traced run of step ${inputs[i]?.id ?? "end-of-window"} fired other rules than the first run.`);
        });
        // A copy, so the engine's own objects stay short-lived (see SEGMENT).
        hole.fill(steps.map((s) => structuredClone(s.trace)));
      }
    }
  }

  return {
    /** One event of the window, in time order. */
    feed(event: DeviceEvent) {
      events++;
      run(event);
    },
    get processed() {
      return events;
    },
    /** Fires the timers due before the window ends, then sums up. */
    finish(): ReplayResult {
      run(null);
      fillTraces();
      const zoneNames = new Map(input.zones.map((z) => [z.id, z.name ?? z.id]));
      const result: RunResult[] = runs.map((r) => ({
        label: r.spec.label,
        counts: r.counts,
        timeline: r.timeline,
        isTimelineCut: r.isTimelineCut,
        series: {
          zones: [...r.zoneSeries].map(([id, s]) => ({ id, name: zoneNames.get(id) ?? id, points: s.points() })),
          relays: [...r.relaySeries].map(([id, s]) => ({ id, name: names.device(id), points: s.points() })),
        },
      }));
      return { window, events, runs: result, compare: runs.length === 2 ? { differences, isCut: isDiffCut, root, knockOn } : null };
    },
  };
}
