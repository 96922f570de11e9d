import type { EngineState } from "./types";

export function initialState(mode: string): EngineState {
  return {
    version: 1,
    now: null,
    mode,
    emergency: { active: false, since: null, scene: null, ruleId: null },
    levels: {},
    overrides: {},
    relays: {},
    sensors: { lux: {}, temperature: {}, humidity: {}, sides: {}, contacts: {}, fireAlarms: {}, occupied: {}, pressedAt: {} },
    timers: { nextSeq: 0, entries: [] },
    tids: {},
    recentEventIds: [],
  };
}

/**
 * A deep copy with every object's keys sorted, so two engines in the same state
 * serialise to the same bytes however their records were filled (and a caller
 * cannot reach into the live state through what it was given).
 */
export function canonical<T>(value: T): T {
  if (Array.isArray(value)) return value.map(canonical) as T;
  if (value === null || typeof value !== "object") return value;
  const out: Record<string, unknown> = {};
  for (const key of Object.keys(value).sort()) {
    const v = (value as Record<string, unknown>)[key];
    if (v !== undefined) out[key] = canonical(v);
  }
  return out as T;
}
