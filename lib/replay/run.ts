import { createReplayEngine, type ReplayEngine } from "@/lib/bus/engine";
import type { SiteInput } from "@/lib/bus/site-model";
import type { DeviceEvent, Step } from "@/lib/bus/types";
import { isLuminaire } from "@/lib/catalogue/device-kinds";
import type { RuleJson } from "@/lib/rules/compile";
import { buildRuleIndex, type RuleIndex } from "@/lib/rules/rule-index";
import { countFired, effectsOf, firedRules, hasEffects, onlyIn, type Names } from "./outcome";
import { createStepSeries, type StepSeries } from "./series";
import type { Difference, ReplayResult, RunCounts, RunResult, StepInput, TimelineEntry } from "./types";

/** Kept per run and for a Compare; a year holds far more, and a browser needs far less. */
export const TIMELINE_CAP = 1000;
export const DIFFERENCE_CAP = 300;

export type ReplaySpec = { label: string; rules: RuleJson[] | RuleIndex };
export type ReplayFilter = { device?: string; zone?: string };
export type ReplayOptions = {
  input: SiteInput;
  runs: ReplaySpec[];
  window: { from: number; to: number };
  filter?: ReplayFilter;
  /** Called with every step of every run (tests compare them with the live store's). */
  onStep?: (run: number, input: StepInput, step: Step) => void;
};

type RunState = {
  spec: ReplaySpec;
  engine: ReplayEngine;
  counts: RunCounts;
  timeline: TimelineEntry[];
  isTimelineCut: boolean;
  levels: Map<string, number>;
  zoneSums: Map<string, number>;
  zoneSeries: Map<string, StepSeries>;
  relaySeries: Map<string, StepSeries>;
  /** Lighting, relays, mode and emergency as the changes left them: to tell when two runs have parted. */
  visible: Map<string, string>;
};

/**
 * Runs a window of the log through one rule set (a Replay) or two (a Compare)
 * in virtual time, one event at a time, with the replay engine (closures: the
 * same loop and outputs as the live engine). Memory stays flat: the timeline
 * and the differences are capped, the series downsampled as they grow.
 * Both runs start from an empty state at the start of the window.
 */
export function createReplay(options: ReplayOptions) {
  const { input, window, filter } = options;
  const devices = new Map(input.devices.map((d) => [d.id, d]));
  const names: Names = { device: (id) => devices.get(id)?.name ?? id };
  const luminairesByZone = new Map<string, string[]>();
  for (const d of input.devices) if (isLuminaire(d.kind) && d.zoneId) luminairesByZone.set(d.zoneId, [...(luminairesByZone.get(d.zoneId) ?? []), d.id]);
  const relays = input.devices.filter((d) => d.kind === "relay");

  const runs: RunState[] = options.runs.map((spec) => {
    const rules = Array.isArray(spec.rules) ? buildRuleIndex(spec.rules) : spec.rules;
    const zoneSeries = new Map<string, StepSeries>();
    for (const zoneId of luminairesByZone.keys()) {
      const s = createStepSeries(window.from, window.to);
      s.add(window.from, 0);
      zoneSeries.set(zoneId, s);
    }
    const relaySeries = new Map<string, StepSeries>();
    for (const r of relays) {
      const s = createStepSeries(window.from, window.to);
      s.add(window.from, 0);
      relaySeries.set(r.id, s);
    }
    return {
      spec,
      engine: createReplayEngine({ ...input, rules }),
      counts: { steps: 0, firings: 0, actions: 0, changes: 0, notices: 0, commands: 0 },
      timeline: [],
      isTimelineCut: false,
      levels: new Map(),
      zoneSums: new Map(),
      zoneSeries,
      relaySeries,
      visible: new Map(),
    };
  });

  const differences: Difference[] = [];
  let isDiffCut = false;
  let root = 0;
  let knockOn = 0;
  let events = 0;
  /** Keys of `visible` on which the two runs disagree. */
  const parted = new Set<string>();

  const isWanted = (si: StepInput, step: Step): boolean => {
    if (!filter?.device && !filter?.zone) return true;
    const touches = (deviceId: string | null) => {
      if (!deviceId) return false;
      if (filter.device && deviceId === filter.device) return true;
      return !!filter.zone && devices.get(deviceId)?.zoneId === filter.zone;
    };
    if (touches(si.device)) return true;
    for (const c of step.changes) if ((c.kind === "level" || c.kind === "relay") && touches(c.deviceId)) return true;
    return false;
  };

  function record(run: RunState, si: StepInput, step: Step) {
    const c = run.counts;
    c.steps++;
    c.firings += countFired(step.trace);
    for (const e of step.trace) c.actions += e.actions.length;
    c.changes += step.changes.length;
    c.notices += step.notices.length;
    c.commands += step.commands.length;
    for (const ch of step.changes) {
      if (ch.kind === "level") {
        const from = run.levels.get(ch.deviceId) ?? 0;
        run.levels.set(ch.deviceId, ch.to);
        run.visible.set(`level|${ch.deviceId}`, String(ch.to));
        const zoneId = devices.get(ch.deviceId)?.zoneId;
        const members = zoneId ? luminairesByZone.get(zoneId) : undefined;
        if (zoneId && members) {
          const sum = (run.zoneSums.get(zoneId) ?? 0) + ch.to - from;
          run.zoneSums.set(zoneId, sum);
          run.zoneSeries.get(zoneId)?.add(ch.at, Math.round((sum / members.length) * 10) / 10);
        }
      } else if (ch.kind === "relay") {
        run.visible.set(`relay|${ch.deviceId}`, String(ch.isOn));
        run.relaySeries.get(ch.deviceId)?.add(ch.at, ch.isOn ? 1 : 0);
      } else if (ch.kind === "mode") run.visible.set("mode", ch.to);
      else run.visible.set("emergency", String(ch.isActive));
    }
    if (run.timeline.length >= TIMELINE_CAP) {
      if (!run.isTimelineCut && (hasEffects(step) || step.trace.some((e) => e.rules.length)) && isWanted(si, step)) run.isTimelineCut = true;
      return;
    }
    const isMatched = step.trace.some((e) => e.rules.length > 0);
    if (!isMatched && !hasEffects(step)) return;
    if (!isWanted(si, step)) return;
    run.timeline.push({ ...si, fired: firedRules(step.trace), effects: effectsOf(step, names), trace: step.trace });
  }

  function compare(si: StepInput, a: Step, b: Step, wasParted: boolean) {
    if (!hasEffects(a) && !hasEffects(b)) return;
    const ea = effectsOf(a, names);
    const eb = effectsOf(b, names);
    const onlyA = onlyIn(ea, eb);
    const onlyB = onlyIn(eb, ea);
    if (!onlyA.length && !onlyB.length) return;
    if (wasParted) knockOn++;
    else root++;
    if (differences.length >= DIFFERENCE_CAP) {
      isDiffCut = true;
      return;
    }
    differences.push({ ...si, isKnockOn: wasParted, onlyA, onlyB, traceA: a.trace, traceB: b.trace });
  }

  function updateParted(a: Step, b: Step) {
    const [ra, rb] = runs;
    for (const step of [a, b])
      for (const ch of step.changes) {
        const key = ch.kind === "level" ? `level|${ch.deviceId}` : ch.kind === "relay" ? `relay|${ch.deviceId}` : ch.kind;
        if ((ra.visible.get(key) ?? "") === (rb.visible.get(key) ?? "")) parted.delete(key);
        else parted.add(key);
      }
  }

  function run(si: StepInput, go: (engine: ReplayEngine) => Step) {
    const steps = runs.map((r) => go(r.engine));
    const wasParted = parted.size > 0;
    steps.forEach((step, i) => {
      options.onStep?.(i, si, step);
      record(runs[i], si, step);
    });
    if (steps.length === 2) {
      compare(si, steps[0], steps[1], wasParted);
      updateParted(steps[0], steps[1]);
    }
  }

  return {
    /** One event of the window, in time order. */
    feed(event: DeviceEvent) {
      events++;
      run({ key: event.id, at: event.at, device: event.device, kind: event.kind, value: event.value }, (e) => e.ingest(event));
    },
    get processed() {
      return events;
    },
    /** Fires the timers due before the window ends, then sums up. */
    finish(): ReplayResult {
      run({ key: "end-of-window", at: window.to, device: null, kind: "timers up to the end of the window", value: null }, (e) => e.advanceTo(window.to));
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
