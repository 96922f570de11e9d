import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { isValidTimeZone, localParts, localToInstant, minuteOfDay, utcOffsetMinutes } from "@/lib/sun/local-time";
import { minuteOfSpec, nextOccurrence, parseHhMm } from "@/lib/sun/schedule";

const cet = { timeZone: "CET", latitude: 50, longitude: 10 };
const at = (iso: string) => Date.parse(iso);

describe("local time through the IANA database", () => {
  // Source: IANA tz database "CET" — UTC+1, summer time UTC+2 from the last Sunday of March to the last Sunday of October at 01:00 UTC.
  it("knows summer time", () => {
    expect(utcOffsetMinutes(at("2024-01-15T12:00:00Z"), "CET")).toBe(60);
    expect(utcOffsetMinutes(at("2024-07-15T12:00:00Z"), "CET")).toBe(120);
    expect(utcOffsetMinutes(at("2024-07-15T12:00:00Z"), "WET")).toBe(60);
    expect(localParts(at("2024-03-31T00:59:59Z"), "CET").hour).toBe(1);
    expect(localParts(at("2024-03-31T01:00:00Z"), "CET").hour).toBe(3);
  });

  it("runs a daily 07:00 schedule at 06:00 UTC in winter and 05:00 UTC in summer", () => {
    const seven = { kind: "fixed", time: "07:00" } as const;
    expect(nextOccurrence(seven, at("2024-01-10T12:00:00Z"), cet)).toBe(at("2024-01-11T06:00:00Z"));
    expect(nextOccurrence(seven, at("2024-07-10T12:00:00Z"), cet)).toBe(at("2024-07-11T05:00:00Z"));
    // Across the spring change: Saturday 07:00 is +1, Sunday 07:00 is +2.
    const sat = nextOccurrence(seven, at("2024-03-29T12:00:00Z"), cet)!;
    expect(sat).toBe(at("2024-03-30T06:00:00Z"));
    expect(nextOccurrence(seven, sat, cet)).toBe(at("2024-03-31T05:00:00Z"));
  });

  it("puts a time in the spring-forward gap an hour later (RFC 5545 §3.3.5)", () => {
    // 02:30 does not exist on 2024-03-31 in CET; read with the offset before the gap (+1) it is 01:30 UTC = 03:30 summer time.
    const t = localToInstant({ year: 2024, month: 3, day: 31 }, parseHhMm("02:30"), "CET");
    expect(t).toBe(at("2024-03-31T01:30:00Z"));
    expect(minuteOfDay(t, "CET")).toBe(parseHhMm("03:30"));
  });

  it("fires a time in the repeated autumn hour once, at its first occurrence (RFC 5545 §3.3.5)", () => {
    // 02:30 happens twice on 2024-10-27 in CET: 00:30 UTC (summer) and 01:30 UTC (winter).
    const spec = { kind: "fixed", time: "02:30" } as const;
    const first = nextOccurrence(spec, at("2024-10-26T12:00:00Z"), cet)!;
    expect(first).toBe(at("2024-10-27T00:30:00Z"));
    expect(nextOccurrence(spec, first, cet)).toBe(at("2024-10-28T01:30:00Z"));
  });

  it("gives sun-relative times as local minutes, with offsets", () => {
    const date = { year: 2024, month: 6, day: 20 };
    const site = { timeZone: "UTC", latitude: 51.4769, longitude: -0.0005 };
    // NOAA solar calculator: sunset 20:20:47 UTC on that day (references.md), so sunset − 30 min ≈ 19:50.
    expect(Math.abs(minuteOfSpec({ kind: "sunset", offsetMinutes: -30 }, date, site)! - (20 * 60 + 20 - 30))).toBeLessThanOrEqual(2);
    expect(minuteOfSpec({ kind: "fixed", time: "23:59" }, date, site)).toBe(1439);
  });

  it("skips days without a sunrise when looking for the next one", () => {
    const polar = { timeZone: "UTC", latitude: 78, longitude: 15 };
    const next = nextOccurrence({ kind: "sunrise", offsetMinutes: 0 }, at("2024-12-01T00:00:00Z"), polar)!;
    expect(next).toBeGreaterThan(at("2025-01-15T00:00:00Z"));
  });

  it("tells real zone names from nonsense", () => {
    expect(isValidTimeZone("WET")).toBe(true);
    expect(isValidTimeZone("Nowhere/Special")).toBe(false);
  });
});

describe("localParts' offset cache", () => {
  // The IANA database through the runtime's Intl, read afresh each time: what the cache must always agree with.
  const intlParts = (ms: number, timeZone: string) => {
    const out: Record<string, string> = {};
    const f = new Intl.DateTimeFormat("en-US", { timeZone, hourCycle: "h23", weekday: "short", year: "numeric", month: "numeric", day: "numeric", hour: "numeric", minute: "numeric", second: "numeric" });
    for (const part of f.formatToParts(ms)) out[part.type] = part.value;
    return { year: Number(out.year), month: Number(out.month), day: Number(out.day), hour: Number(out.hour), minute: Number(out.minute), second: Number(out.second), weekday: out.weekday.toLowerCase() };
  };
  // Zones named by rule, not by place (the project names no real places).
  const zones = ["WET", "CET", "EET", "EST5EDT", "PST8PDT", "MST", "Etc/GMT+3", "UTC"];

  it("agrees with Intl at random instants 1990–2040", () => {
    fc.assert(
      fc.property(fc.integer({ min: Date.UTC(1990, 0, 1), max: Date.UTC(2040, 0, 1) }), fc.constantFrom(...zones), (ms, zone) => {
        expect(localParts(ms, zone)).toEqual(intlParts(ms, zone));
      }),
      { numRuns: 2000 },
    );
  });

  it("agrees with Intl second by second across spring-forward and fall-back (WET and EST5EDT, 2024)", () => {
    for (const [zone, at] of [["WET", Date.UTC(2024, 2, 31, 1)], ["WET", Date.UTC(2024, 9, 27, 1)], ["EST5EDT", Date.UTC(2024, 2, 10, 7)], ["EST5EDT", Date.UTC(2024, 10, 3, 6)]] as const) {
      for (let ms = at - 120_000; ms <= at + 120_000; ms += 1000) expect(localParts(ms, zone)).toEqual(intlParts(ms, zone));
    }
  });
});
