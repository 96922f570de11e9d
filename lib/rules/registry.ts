import type { Engine } from "json-rules-engine";
import type { Weekday } from "@/lib/sun/local-time";
import { parseHhMm, type TimeOfDay } from "@/lib/sun/schedule";

/**
 * The one registry of custom operators and facts. Both evaluators (json-rules-engine
 * for the live path, closures for replay) call these same functions, so they
 * cannot drift apart. Every operator is ours, even "is": json-rules-engine's
 * built-ins carry their own type checks that a closure would have to copy.
 */
export type Clock = {
  /** Local minutes past midnight at the event. */
  minute: number;
  /** Today's local sunrise/sunset in minutes past midnight; null where the sun does not rise/set. */
  sunrise: number | null;
  sunset: number | null;
};

export type DayWindow = { from: TimeOfDay; to: TimeOfDay };

export const OPERATORS = {
  /** A known number strictly below the threshold; an unknown reading never passes. */
  below: (fact: unknown, value: unknown) => typeof fact === "number" && typeof value === "number" && fact < value,
  is: (fact: unknown, value: unknown) => fact === value,
  oneOf: (fact: unknown, value: unknown) => Array.isArray(value) && value.includes(fact),
  /**
   * from ≤ now < to; a window whose start is after its end crosses midnight.
   * Sun-relative ends use today's sunrise/sunset (a minute or two off for the
   * after-midnight part of a sunset-to-sunrise window, which is fine for lighting).
   */
  inDayWindow: (fact: unknown, value: unknown) => {
    const clock = fact as Clock;
    const window = value as DayWindow;
    const from = resolveMinute(window.from, clock);
    const to = resolveMinute(window.to, clock);
    if (from === null || to === null) return false;
    return from <= to ? clock.minute >= from && clock.minute < to : clock.minute >= from || clock.minute < to;
  },
} satisfies Record<string, (fact: unknown, value: unknown) => boolean>;

export type OperatorName = keyof typeof OPERATORS;

function resolveMinute(spec: TimeOfDay, clock: Clock): number | null {
  if (spec.kind === "fixed") return parseHhMm(spec.time);
  const base = spec.kind === "sunrise" ? clock.sunrise : clock.sunset;
  return base === null ? null : (((base + spec.offsetMinutes) % 1440) + 1440) % 1440;
}

/** What the engine knows at the moment a trigger happens; facts read it. */
export type FactSource = {
  clock(): Clock;
  weekday(): Weekday;
  siteMode(): string;
  isEmergencyActive(): boolean;
  lux(deviceId: string): number | null;
  isZoneOccupied(zoneId: string): boolean;
};

/**
 * Facts are flat ids ("lux:<device>", "occupied:<zone>") rather than one big
 * object read through JSONPath: a path lookup costs about three times a plain fact.
 */
export const FACTS = {
  clock: (src: FactSource) => src.clock(),
  weekday: (src: FactSource) => src.weekday(),
  "site-mode": (src: FactSource) => src.siteMode(),
  "emergency-active": (src: FactSource) => src.isEmergencyActive(),
  lux: (src: FactSource, device: string) => src.lux(device),
  occupied: (src: FactSource, zone: string) => src.isZoneOccupied(zone),
} satisfies Record<string, (src: FactSource, subject: string) => unknown>;

export type FactName = keyof typeof FACTS;

export function factId(name: FactName, subject?: string): string {
  return subject === undefined ? name : `${name}:${subject}`;
}

export type FactReader = { id: string; read: (src: FactSource) => unknown };

/** Parses a fact id once, so per-event reads are a direct call. */
export function factReader(id: string): FactReader {
  const colon = id.indexOf(":");
  const name = (colon < 0 ? id : id.slice(0, colon)) as FactName;
  const subject = colon < 0 ? "" : id.slice(colon + 1);
  const fn = FACTS[name];
  if (!fn) throw new Error(`unknown fact "${id}"`);
  return { id, read: (src) => fn(src, subject) };
}

export function registerOperators(engine: Engine): void {
  for (const [name, fn] of Object.entries(OPERATORS)) engine.addOperator(name, fn);
}
