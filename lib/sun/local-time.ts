/**
 * Wall-clock time in an IANA time zone, from the runtime's own time-zone database
 * (Intl), so summer-time rules come from the same data as everywhere else and no
 * date library is needed.
 */
export const WEEKDAYS = ["mon", "tue", "wed", "thu", "fri", "sat", "sun"] as const;
export type Weekday = (typeof WEEKDAYS)[number];

export type LocalDate = { year: number; month: number; day: number };
export type LocalDateTime = LocalDate & { hour: number; minute: number; second: number; weekday: Weekday };

const MINUTE_MS = 60_000;
const DAY_MS = 86_400_000;
const WEEKDAY_BY_SHORT: Record<string, Weekday> = { Mon: "mon", Tue: "tue", Wed: "wed", Thu: "thu", Fri: "fri", Sat: "sat", Sun: "sun" };

// Building a DateTimeFormat costs far more than using one: keep one per zone (a cache, not shared state).
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatterFor(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat("en-US", {
      timeZone,
      hourCycle: "h23",
      weekday: "short",
      year: "numeric",
      month: "numeric",
      day: "numeric",
      hour: "numeric",
      minute: "numeric",
      second: "numeric",
    });
    formatters.set(timeZone, f);
  }
  return f;
}

export function isValidTimeZone(timeZone: string): boolean {
  try {
    formatterFor(timeZone);
    return true;
  } catch {
    return false;
  }
}

// Reading the zone's offset through Intl costs microseconds; the offset holds for
// long stretches, so remember it per zone and 15-minute span of UTC (every real
// transition of recent decades falls on a quarter hour). A span whose two ends
// disagree holds a transition: those instants are read exactly. (A cache, bounded.)
// Spans are looked up through 6-hour blocks: a block whose two ends agree holds
// no transition (real zones change months apart), so all its spans share the
// offset and a log read in time order costs two Intl readings per block.
const SPAN_MS = 15 * MINUTE_MS;
const BLOCK_MS = 6 * 60 * MINUTE_MS;
const spanOffsets = new Map<string, Map<number, number | null>>();
const blockOffsets = new Map<string, Map<number, number | null>>();

/** The offset holding through the whole stretch of `length` ms around `ms`, or null if it changes inside (remembered per zone). */
function steadyOffset(cache: Map<string, Map<number, number | null>>, length: number, ms: number, timeZone: string): number | null {
  let zone = cache.get(timeZone);
  if (!zone) cache.set(timeZone, (zone = new Map()));
  const stretch = Math.floor(ms / length);
  let offset = zone.get(stretch);
  if (offset === undefined) {
    const start = offsetAt(stretch * length, timeZone);
    offset = start === offsetAt((stretch + 1) * length - 1, timeZone) && start % MINUTE_MS === 0 ? start : null;
    if (zone.size >= 20_000) zone.clear();
    zone.set(stretch, offset);
  }
  return offset;
}

function offsetAt(ms: number, timeZone: string): number {
  const p = exactParts(ms, timeZone);
  return Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute, p.second) - (ms - mod(ms, 1000));
}

function spanOffset(ms: number, timeZone: string): number | null {
  return steadyOffset(blockOffsets, BLOCK_MS, ms, timeZone) ?? steadyOffset(spanOffsets, SPAN_MS, ms, timeZone);
}

const WEEKDAY_BY_UTC_DAY: Weekday[] = ["sun", "mon", "tue", "wed", "thu", "fri", "sat"];

/** The wall-clock reading in `timeZone` at instant `ms`. */
export function localParts(ms: number, timeZone: string): LocalDateTime {
  const offset = spanOffset(ms, timeZone);
  if (offset === null) return exactParts(ms, timeZone);
  const wall = new Date(ms + offset);
  return {
    year: wall.getUTCFullYear(),
    month: wall.getUTCMonth() + 1,
    day: wall.getUTCDate(),
    hour: wall.getUTCHours(),
    minute: wall.getUTCMinutes(),
    second: wall.getUTCSeconds(),
    weekday: WEEKDAY_BY_UTC_DAY[wall.getUTCDay()],
  };
}

function exactParts(ms: number, timeZone: string): LocalDateTime {
  const out: Record<string, string> = {};
  for (const part of formatterFor(timeZone).formatToParts(ms)) out[part.type] = part.value;
  return {
    year: Number(out.year),
    month: Number(out.month),
    day: Number(out.day),
    hour: Number(out.hour),
    minute: Number(out.minute),
    second: Number(out.second),
    weekday: WEEKDAY_BY_SHORT[out.weekday],
  };
}

/** localParts at the start of the UTC minute holding `ms` (seconds 0): the clock rules read. */
export function localMinuteParts(ms: number, timeZone: string): Readonly<LocalDateTime> {
  return localParts(Math.floor(ms / MINUTE_MS) * MINUTE_MS, timeZone);
}

/** Minutes since local midnight (0–1439) at instant `ms`. */
export function minuteOfDay(ms: number, timeZone: string): number {
  const p = localParts(ms, timeZone);
  return p.hour * 60 + p.minute;
}

/** Local time minus UTC at instant `ms`, in minutes (+60 for CET in winter). */
export function utcOffsetMinutes(ms: number, timeZone: string): number {
  const p = localParts(ms, timeZone);
  const wall = Date.UTC(p.year, p.month - 1, p.day, p.hour, p.minute, p.second);
  return Math.round((wall - (ms - mod(ms, 1000))) / MINUTE_MS);
}

/**
 * The instant at which local `date` shows `minute` minutes past midnight.
 * Summer-time changes follow RFC 5545 §3.3.5 (iCalendar), the rule calendar
 * software shares: a wall time that happens twice (the repeated autumn hour)
 * means the first occurrence; a wall time that never happens (the spring-forward
 * gap) is read with the offset in force before the gap, so 02:30 on a +1 h
 * change lands at 03:30 new time.
 */
export function localToInstant(date: LocalDate, minute: number, timeZone: string): number {
  const wall = Date.UTC(date.year, date.month - 1, date.day) + minute * MINUTE_MS;
  // Real zones change offset at most once within a day either side.
  const offsetBefore = utcOffsetMinutes(wall - DAY_MS, timeZone);
  const offsetAfter = utcOffsetMinutes(wall + DAY_MS, timeZone);
  const early = wall - offsetBefore * MINUTE_MS;
  const late = wall - offsetAfter * MINUTE_MS;
  const fits = (t: number) => t + utcOffsetMinutes(t, timeZone) * MINUTE_MS === wall;
  const candidates = [early, late].filter(fits);
  if (candidates.length === 0) return early;
  return Math.min(...candidates);
}

export function localDateOf(ms: number, timeZone: string): LocalDate {
  const { year, month, day } = localParts(ms, timeZone);
  return { year, month, day };
}

export function addDays(date: LocalDate, days: number): LocalDate {
  const d = new Date(Date.UTC(date.year, date.month - 1, date.day) + days * DAY_MS);
  return { year: d.getUTCFullYear(), month: d.getUTCMonth() + 1, day: d.getUTCDate() };
}

/** "2024-06-20": sorts and compares as text. */
export function formatLocalDate(date: LocalDate): string {
  return `${String(date.year).padStart(4, "0")}-${pad2(date.month)}-${pad2(date.day)}`;
}

/** 0–1439 → "07:05". */
export function formatMinuteOfDay(minute: number): string {
  const m = mod(Math.round(minute), 1440);
  return `${pad2(Math.floor(m / 60))}:${pad2(m % 60)}`;
}

const pad2 = (n: number) => String(n).padStart(2, "0");

function mod(a: number, n: number): number {
  return ((a % n) + n) % n;
}
