import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { daliArcToPercent, percentToDaliArc } from "@/lib/dimming/dali";

describe("DALI logarithmic curve", () => {
  // Source: IEC 62386-102 clause M — X(n) = 10^((n−1)/(253/3) − 1) %, values computed from it.
  it.each([
    [1, 0.1, 4],
    [85, 0.9909, 4],
    [128, 3.206, 3],
    [170, 10.091, 3],
    [229, 50.53, 2],
    [254, 100, 9],
  ])("arc %i gives %f %", (arc, percent, digits) => {
    expect(daliArcToPercent(arc)).toBeCloseTo(percent, digits);
  });

  it("does not use integer division for 253/3 (84 would give 3.28 % at arc 128)", () => {
    // Source: IEC 62386-102 clause M; 10^(127/84 − 1) = 3.2797 % is the integer-division mistake.
    expect(Math.abs(daliArcToPercent(128) - 3.2797)).toBeGreaterThan(0.05);
  });

  it("0 is off and levels outside 0–254 are refused (255 means 'no change' on the bus)", () => {
    expect(daliArcToPercent(0)).toBe(0);
    expect(() => daliArcToPercent(255)).toThrow(RangeError);
    expect(() => daliArcToPercent(-1)).toThrow(RangeError);
    expect(() => daliArcToPercent(12.5)).toThrow(RangeError);
  });

  it("inverts the published points exactly", () => {
    // Source: IEC 62386-102 clause M.
    expect(percentToDaliArc(0.1)).toBe(1);
    expect(percentToDaliArc(0.9909)).toBe(85);
    expect(percentToDaliArc(3.206)).toBe(128);
    expect(percentToDaliArc(10.091)).toBe(170);
    expect(percentToDaliArc(50.53)).toBe(229);
    expect(percentToDaliArc(100)).toBe(254);
  });

  it("0 % is off; any light at all is at least arc 1", () => {
    expect(percentToDaliArc(0)).toBe(0);
    expect(percentToDaliArc(0.0001)).toBe(1);
    expect(percentToDaliArc(0.05)).toBe(1);
    expect(() => percentToDaliArc(100.5)).toThrow(RangeError);
    expect(() => percentToDaliArc(Number.NaN)).toThrow(RangeError);
  });

  it("picks the level nearest in percent, not in log space", () => {
    // Between arc 229 (50.53 %) and 230 (≈ 51.92 %) the linear midpoint is ≈ 51.225 %.
    const lower = daliArcToPercent(229);
    const upper = daliArcToPercent(230);
    const mid = (lower + upper) / 2;
    expect(percentToDaliArc(mid - 0.01)).toBe(229);
    expect(percentToDaliArc(mid + 0.01)).toBe(230);
  });

  it("round-trips every arc level and is monotonic (property)", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: 254 }), (arc) => {
        expect(percentToDaliArc(daliArcToPercent(arc))).toBe(arc);
        if (arc < 254) expect(daliArcToPercent(arc + 1)).toBeGreaterThan(daliArcToPercent(arc));
      }),
    );
  });

  it("the chosen level is never further from the request than its neighbours (property)", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.1, max: 100, noNaN: true }), (pct) => {
        const arc = percentToDaliArc(pct);
        const error = Math.abs(daliArcToPercent(arc) - pct);
        if (arc > 1) expect(error).toBeLessThanOrEqual(Math.abs(daliArcToPercent(arc - 1) - pct) + 1e-12);
        if (arc < 254) expect(error).toBeLessThanOrEqual(Math.abs(daliArcToPercent(arc + 1) - pct) + 1e-12);
      }),
    );
  });
});
