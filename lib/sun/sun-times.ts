import { getTimes } from "suncalc";
import { formatLocalDate, type LocalDate } from "./local-time";

/** Sunrise and sunset as epoch ms; null on a day the sun never rises or never sets there. */
export type SunTimes = { sunrise: number | null; sunset: number | null };

/** Sunrise and sunset for the solar day around instant `at` (NOAA-equivalent equations via suncalc). */
export function getSunTimes(at: number, latitude: number, longitude: number): SunTimes {
  const t = getTimes(new Date(at), latitude, longitude);
  return { sunrise: t.sunrise ? t.sunrise.getTime() : null, sunset: t.sunset ? t.sunset.getTime() : null };
}

// suncalc works a few dozen microseconds per call and schedules ask for the same day
// repeatedly; the result depends only on the arguments, so a small memo is safe.
const memo = new Map<string, SunTimes>();
const MEMO_LIMIT = 256;

/**
 * Sunrise and sunset on a site's local calendar date. suncalc anchors on the UTC
 * day of the instant it is given, so we hand it noon UTC of that date: the solar
 * noon nearest to it is the one of that local day for any inhabited longitude.
 */
export function sunTimesOn(date: LocalDate, latitude: number, longitude: number): SunTimes {
  const key = `${formatLocalDate(date)}|${latitude}|${longitude}`;
  const hit = memo.get(key);
  if (hit) return hit;
  const times = getSunTimes(Date.UTC(date.year, date.month - 1, date.day, 12), latitude, longitude);
  if (memo.size >= MEMO_LIMIT) memo.delete(memo.keys().next().value as string);
  memo.set(key, times);
  return times;
}
