import { formatLocalDate, localParts, localToInstant } from "@/lib/sun/local-time";

/**
 * Times people type and read are the site's wall clock, whatever the browser's
 * zone: a `datetime-local` value ("2024-11-12T15:00") ⇄ an instant in ms.
 */
export function localInputToInstant(value: string, timeZone: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2}))?$/.exec(value);
  if (!m) return null;
  const [, y, mo, d, hh, mm, ss] = m.map(Number);
  return localToInstant({ year: y, month: mo, day: d }, hh * 60 + mm, timeZone) + (ss || 0) * 1000;
}

export function instantToLocalInput(ms: number, timeZone: string): string {
  const p = localParts(ms, timeZone);
  return `${formatLocalDate(p)}T${String(p.hour).padStart(2, "0")}:${String(p.minute).padStart(2, "0")}`;
}

/** "12 Nov 03:12:05" in the site's zone, for tables and timelines. */
export function formatSiteTime(ms: number, timeZone: string, withSeconds = true): string {
  const p = localParts(ms, timeZone);
  const month = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"][p.month - 1];
  const t = `${String(p.hour).padStart(2, "0")}:${String(p.minute).padStart(2, "0")}${withSeconds ? `:${String(p.second).padStart(2, "0")}` : ""}`;
  return `${p.day} ${month} ${p.year} ${t}`;
}
