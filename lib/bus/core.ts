import type { Facts } from "@/lib/rules/closures";
import { readFacts, type RuleTrace } from "@/lib/rules/evaluate";
import type { IndexedRule, RuleGroup } from "@/lib/rules/rule-index";
import { triggerKey } from "@/lib/rules/trigger-key";
import { nextOccurrence } from "@/lib/sun/schedule";
import { applyAction } from "./actions";
import { deriveFromEvent } from "./derive";
import { factSource } from "./facts";
import type { Occurrence, Runtime } from "./runtime";
import { fireSystemTimer } from "./system-timers";
import type { ActionTrace, DeviceEvent, Step, TraceEntry } from "./types";

/**
 * Rules that keep changing the site mode would never stop, and two of them on
 * "any change" double the work at each round; a real cascade is a handful deep
 * and a handful wide, so cap both.
 */
const MAX_CASCADE_DEPTH = 16;
const MAX_CASCADE_TRIGGERS = 256;
// The event log's unique (site, event id) makes live ingest idempotent; this list only catches
// repeats close together in a stream (a bench, an import) and is rewritten with the state on every call.
const RECENT_IDS = 128;

export type Pending = { occ: Occurrence; group: RuleGroup; facts: Facts };
type Batch = { entry: TraceEntry; isMatched: boolean };

/**
 * One step of the discrete-event loop, driven from outside so the same logic
 * serves an async evaluator (json-rules-engine) and a sync one (closures):
 *   begin → (next → evaluate → finish)* → end.
 * next() fires due timers in (due, seq) order, then handles the event, and hands
 * back each trigger that has candidate rules, with the facts its gates read.
 */
export function createCore(rt: Runtime) {
  let event: DeviceEvent | null = null;
  let limit = 0;
  let batch: Batch | null = null;
  let cascaded = 0;

  function startClock(at: number) {
    if (rt.state.now !== null) return;
    rt.state.now = at;
    scheduleMissing(rt);
  }

  function closeBatch() {
    if (batch && !batch.isMatched) rt.out.trace.push(batch.entry);
    batch = null;
  }

  function handleEvent(ev: DeviceEvent) {
    const now = rt.state.now!;
    const at = Math.max(ev.at, now);
    rt.state.now = at;
    remember(rt, ev.id);
    const derived = deriveFromEvent(rt, ev, at);
    for (const occ of derived.occurrences) rt.queue.push(occ);
    if (!rt.tracing) return;
    const note = derived.note ?? "No rule waits for what this reported.";
    const entry: TraceEntry = { at, origin: ev.id, trigger: { key: null, type: ev.kind, device: ev.device, value: ev.value }, rules: [], actions: [], note };
    if (ev.at < now) {
      // Always said, matched or not: a late event is worth knowing about when reading a Trace.
      entry.note = `Arrived ${now - ev.at} ms behind the engine's clock; handled at its current time. ${note}`;
      rt.out.trace.push(entry);
    } else {
      batch = { entry, isMatched: false };
    }
  }

  function fireTimer(): boolean {
    const timer = rt.timers.popDue(limit);
    if (!timer) return false;
    rt.state.now = Math.max(rt.state.now!, timer.due);
    const origin = `timer:${timer.seq}`;
    const p = timer.payload;
    const at = rt.state.now;
    switch (p.kind) {
      case "schedule": {
        rt.queue.push({ key: p.triggerKey, type: "time-of-day", at, origin, device: null, value: null, depth: 0 });
        const watch = rt.index.watches.schedules.find((w) => w.key === p.triggerKey);
        const next = watch ? nextOccurrence(watch.at, timer.due, rt.model.site) : null;
        if (next !== null) rt.timers.set(timer.key, next, p);
        break;
      }
      case "named":
        rt.queue.push({ key: triggerKey("timer-fired", p.name), type: "timer-fired", at, origin, device: null, value: p.name, depth: 0 });
        break;
      case "vacancy":
        rt.queue.push({ key: p.triggerKey, type: "vacancy", at, origin, device: p.device, value: null, depth: 0 });
        break;
      case "left-open":
        rt.queue.push({ key: p.triggerKey, type: "contact-left-open", at, origin, device: p.device, value: "open", depth: 0 });
        break;
      default:
        fireSystemTimer(rt, p, origin, at);
        return true;
    }
    if (rt.tracing) batch = { entry: { at, origin, trigger: { key: rt.queue[0].key, type: rt.queue[0].type, device: rt.queue[0].device, value: null }, rules: [], actions: [], note: "No rule waits for this timer." }, isMatched: false };
    return true;
  }

  function run(occ: Occurrence, rule: IndexedRule, entry: TraceEntry | null) {
    rt.out.fired.push(rule.id);
    for (const action of rule.params.actions) {
      const done: ActionTrace = { ruleId: rule.id, actionId: action.nodeId, type: action.type, outcome: applyAction(rt, occ, rule, action) };
      rt.out.actions.push(done);
      if (entry) entry.actions.push(done);
    }
  }

  return {
    begin(input: { event: DeviceEvent } | { advanceTo: number }): Step | null {
      rt.out = emptyStep("event" in input ? { eventId: input.event.id } : { advanceTo: input.advanceTo });
      event = null;
      cascaded = 0;
      if ("event" in input) {
        if (rt.recent.has(input.event.id)) return { ...rt.out, isDuplicate: true, at: rt.state.now ?? input.event.at };
        startClock(input.event.at);
        event = input.event;
        limit = input.event.at;
      } else {
        startClock(input.advanceTo);
        limit = input.advanceTo;
      }
      return null;
    },

    next(): Pending | null {
      for (;;) {
        while (rt.queue.length > 0) {
          const occ = rt.queue.shift()!;
          if (occ.depth > 0 && (occ.depth > MAX_CASCADE_DEPTH || ++cascaded > MAX_CASCADE_TRIGGERS)) {
            // Cascades queue behind every first-hand trigger, so what is left is all runaway: drop it, say so once.
            if (rt.tracing) rt.out.trace.push({ at: occ.at, origin: occ.origin, trigger: { key: occ.key, type: occ.type, device: occ.device, value: occ.value }, rules: [], actions: [], note: "Stopped: rules keep changing the site mode in a loop." });
            rt.queue.length = 0;
            cascaded = 0;
            continue;
          }
          const group = rt.index.groups.get(occ.key);
          if (!group) continue;
          rt.out.matched++;
          if (batch) batch.isMatched = true;
          return { occ, group, facts: readFacts(group, factSource(rt, occ.at)) };
        }
        closeBatch();
        if (fireTimer()) continue;
        if (event) {
          handleEvent(event);
          event = null;
          continue;
        }
        return null;
      }
    },

    /** Applies the actions of the rules that passed, keeping the full trace (every candidate, gate and fact value). */
    finish(pending: Pending, rules: RuleTrace[]): void {
      const { occ, group } = pending;
      const entry: TraceEntry = { at: occ.at, origin: occ.origin, trigger: { key: occ.key, type: occ.type, device: occ.device, value: occ.value }, rules, actions: [] };
      rt.out.trace.push(entry);
      const list = group.rules;
      for (let i = 0; i < list.length; i++) if (rules[i].passed) run(occ, list[i], entry);
    },

    /**
     * The same without a trace: each rule's gates are tested on the facts read
     * before any of the group's actions ran (as finish sees them), so the
     * outcome is identical; nothing is kept of the rules that failed.
     */
    finishUntraced(pending: Pending): void {
      const { occ, group, facts } = pending;
      const list = group.rules;
      for (let i = 0; i < list.length; i++) {
        const gates = list[i].gates;
        let passed = true;
        for (let g = 0; g < gates.length; g++) {
          if (!gates[g].test(facts)) {
            passed = false;
            break;
          }
        }
        if (passed) run(occ, list[i], null);
      }
    },

    end(): Step {
      if (rt.state.now !== null && limit > rt.state.now && !("eventId" in rt.out.input)) rt.state.now = limit;
      rt.out.at = rt.state.now ?? limit;
      return rt.out;
    },
  };
}

export type Core = ReturnType<typeof createCore>;

export function emptyStep(input: Step["input"]): Step {
  return { input, at: 0, isDuplicate: false, changes: [], commands: [], notices: [], actions: [], fired: [], matched: 0, trace: [] };
}

/** Puts a timer on every time-of-day trigger that has none (a fresh engine, or rules changed since the state was saved). */
export function scheduleMissing(rt: Runtime): void {
  const now = rt.state.now;
  if (now === null) return;
  for (const w of rt.index.watches.schedules) {
    const key = `schedule|${w.key}`;
    if (rt.timers.get(key)) continue;
    const next = nextOccurrence(w.at, now, rt.model.site);
    if (next !== null) rt.timers.set(key, next, { kind: "schedule", triggerKey: w.key });
  }
}

function remember(rt: Runtime, id: string) {
  rt.recent.add(id);
  const ring = rt.recentRing;
  const gone = ring[rt.recentHead];
  if (gone !== undefined) rt.recent.delete(gone);
  ring[rt.recentHead] = id;
  rt.recentHead = (rt.recentHead + 1) % RECENT_IDS;
}

/** The ring of recent ids as the state keeps them: oldest first. */
export function recentIds(rt: Runtime): string[] {
  const out: string[] = [];
  for (let i = 0; i < RECENT_IDS; i++) {
    const id = rt.recentRing[(rt.recentHead + i) % RECENT_IDS];
    if (id !== undefined) out.push(id);
  }
  return out;
}

/** A ring holding the newest RECENT_IDS of `ids` (oldest first), for a runtime. */
export function recentRingOf(ids: string[]): { recent: Set<string>; recentRing: (string | undefined)[]; recentHead: number } {
  const kept = ids.slice(-RECENT_IDS);
  const recentRing: (string | undefined)[] = new Array(RECENT_IDS).fill(undefined);
  kept.forEach((id, i) => (recentRing[i] = id));
  return { recent: new Set(kept), recentRing, recentHead: kept.length % RECENT_IDS };
}
