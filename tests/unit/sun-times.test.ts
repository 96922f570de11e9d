import { describe, expect, it } from "vitest";
import { getSunTimes, sunTimesOn } from "@/lib/sun/sun-times";

// The prime-meridian observatory used as the worked example in references.md.
const LAT = 51.4769;
const LON = -0.0005;
const TWO_MINUTES = 2 * 60_000;

describe("sun times", () => {
  // Source: NOAA solar calculator (equations verified in references.md); ±2 min as references.md allows.
  it("matches the NOAA solar calculator at midsummer", () => {
    const t = sunTimesOn({ year: 2024, month: 6, day: 20 }, LAT, LON);
    expect(Math.abs(t.sunrise! - Date.UTC(2024, 5, 20, 3, 42, 38))).toBeLessThanOrEqual(TWO_MINUTES);
    expect(Math.abs(t.sunset! - Date.UTC(2024, 5, 20, 20, 20, 47))).toBeLessThanOrEqual(TWO_MINUTES);
  });

  it("matches the NOAA solar calculator at midwinter", () => {
    // Source: NOAA solar calculator, 2024-12-21: 08:03:20 / 15:53:18 UTC.
    const t = sunTimesOn({ year: 2024, month: 12, day: 21 }, LAT, LON);
    expect(Math.abs(t.sunrise! - Date.UTC(2024, 11, 21, 8, 3, 20))).toBeLessThanOrEqual(TWO_MINUTES);
    expect(Math.abs(t.sunset! - Date.UTC(2024, 11, 21, 15, 53, 18))).toBeLessThanOrEqual(TWO_MINUTES);
  });

  it("anchors on the calendar day whatever the time of day asked", () => {
    const early = getSunTimes(Date.UTC(2024, 5, 20, 0, 30), LAT, LON);
    const late = getSunTimes(Date.UTC(2024, 5, 20, 23, 30), LAT, LON);
    expect(Math.abs(early.sunrise! - late.sunrise!)).toBeLessThan(1000);
  });

  it("reports no sunrise in polar night instead of an invalid date", () => {
    // Common practice, no source: at 78° N the sun stays down around the December solstice.
    const t = sunTimesOn({ year: 2024, month: 12, day: 21 }, 78, 15);
    expect(t.sunrise).toBeNull();
    expect(t.sunset).toBeNull();
  });
});
