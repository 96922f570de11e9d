/** Bench times are shown in the site's time zone, with the zone named. */
export function formatBenchTime(ms: number | null, timeZone: string, withDate = true): string {
  if (ms === null) return "—";
  return new Intl.DateTimeFormat("en-GB", { ...(withDate ? { weekday: "short", day: "numeric", month: "short", year: "numeric" } : {}), hour: "2-digit", minute: "2-digit", second: withDate ? undefined : "2-digit", timeZone }).format(ms);
}

/** The site-local date and time of an instant, for the set-date inputs. */
export function localInputs(ms: number | null, timeZone: string): { date: string; time: string } {
  const parts = Object.fromEntries(new Intl.DateTimeFormat("en-CA", { year: "numeric", month: "2-digit", day: "2-digit", hour: "2-digit", minute: "2-digit", hourCycle: "h23", timeZone }).formatToParts(ms ?? Date.now()).map((p) => [p.type, p.value]));
  return { date: `${parts.year}-${parts.month}-${parts.day}`, time: `${parts.hour}:${parts.minute}` };
}

export const LEVEL_WORD: Record<string, string> = { emergency: "Emergency", manual: "Manual", sensor: "Sensor", schedule: "Schedule" };
