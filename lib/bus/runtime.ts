import type { DelayWatch, RuleIndex, ThresholdWatch } from "@/lib/rules/rule-index";
import type { SiteModel } from "./site-model";
import type { TimerQueue } from "./timer-queue";
import type { Cause, EngineState, Step } from "./types";

/** Something rules may react to: a trigger key plus where it came from. */
export type Occurrence = {
  key: string;
  type: string;
  at: number;
  /** The event id, or "timer:<seq>" for what a timer set off; notices dedupe on it. */
  origin: string;
  device: string | null;
  value: unknown;
  /** How many site-mode changes led here within one step (a loop guard). */
  depth: number;
};

/** The engine's working set during a step; every bus module reads and writes through it. */
export type Runtime = {
  model: SiteModel;
  index: RuleIndex;
  state: EngineState;
  timers: TimerQueue;
  /** The last RECENT_IDS event ids: a set to look up, and a ring in arrival order (state.recentEventIds is written from it on a snapshot). */
  recent: Set<string>;
  recentRing: (string | undefined)[];
  recentHead: number;
  watchesByDevice: {
    thresholds: Map<string, ThresholdWatch[]>;
    vacancy: Map<string, DelayWatch[]>;
    leftOpen: Map<string, DelayWatch[]>;
  };
  queue: Occurrence[];
  out: Step;
  /** Whether steps keep their full trace (candidate rules, gates, fact values, notes). */
  tracing: boolean;
};

/**
 * An output item: its cause's fields, then its own. Built with Object.assign on
 * purpose: on Node 20 here `{ ...cause, more }` costs 7–10 µs per object (about
 * 60× this), and the engine makes several per luminaire per event.
 */
export function withCause<T extends object>(cause: Cause, fields: T): Cause & T {
  const base: Cause = { origin: cause.origin, ruleId: cause.ruleId, actionId: cause.actionId };
  if (cause.reason) base.reason = cause.reason;
  return Object.assign(base, fields);
}

export function systemCause(origin: string, reason: NonNullable<Cause["reason"]>): Cause {
  return { origin, ruleId: null, actionId: null, reason };
}

export function groupByDevice<T extends { device: string }>(items: T[]): Map<string, T[]> {
  const map = new Map<string, T[]>();
  for (const item of items) {
    const list = map.get(item.device);
    if (list) list.push(item);
    else map.set(item.device, [item]);
  }
  return map;
}
