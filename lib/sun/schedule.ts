import { addDays, localDateOf, localToInstant, minuteOfDay, type LocalDate } from "./local-time";
import { sunTimesOn } from "./sun-times";

/** When something happens in a day: a fixed wall-clock time, or sunrise/sunset shifted by minutes. */
export type TimeOfDay = { kind: "fixed"; time: string } | { kind: "sunrise" | "sunset"; offsetMinutes: number };

export type SiteClock = { timeZone: string; latitude: number; longitude: number };

const HH_MM = /^([01]\d|2[0-3]):([0-5]\d)$/;
const MINUTE_MS = 60_000;
// A day without sunrise repeats for months inside the polar circles; a year covers every case.
const SEARCH_DAYS = 370;

export function isHhMm(text: string): boolean {
  return HH_MM.test(text);
}

/** "07:30" → 450. */
export function parseHhMm(text: string): number {
  const m = HH_MM.exec(text);
  if (!m) throw new RangeError(`not a 24-hour HH:MM time: ${text}`);
  return Number(m[1]) * 60 + Number(m[2]);
}

/** The instant `spec` happens on local `date`, or null when the sun does not rise/set that day. */
export function instantOn(spec: TimeOfDay, date: LocalDate, site: SiteClock): number | null {
  if (spec.kind === "fixed") return localToInstant(date, parseHhMm(spec.time), site.timeZone);
  const sun = sunTimesOn(date, site.latitude, site.longitude);
  const base = spec.kind === "sunrise" ? sun.sunrise : sun.sunset;
  return base === null ? null : base + spec.offsetMinutes * MINUTE_MS;
}

/** The first time `spec` happens strictly after `afterMs`, or null if not within a year. */
export function nextOccurrence(spec: TimeOfDay, afterMs: number, site: SiteClock): number | null {
  // Start a day early: a sun time with a large offset can fall on the previous local date.
  let date = addDays(localDateOf(afterMs, site.timeZone), -1);
  for (let i = 0; i < SEARCH_DAYS; i++, date = addDays(date, 1)) {
    const at = instantOn(spec, date, site);
    if (at !== null && at > afterMs) return at;
  }
  return null;
}

/**
 * Local minutes past midnight (0–1439) at which `spec` falls on `date`, for
 * window checks; null when the sun does not rise/set that day.
 */
export function minuteOfSpec(spec: TimeOfDay, date: LocalDate, site: SiteClock): number | null {
  if (spec.kind === "fixed") return parseHhMm(spec.time);
  const at = instantOn(spec, date, site);
  return at === null ? null : minuteOfDay(at, site.timeZone);
}
