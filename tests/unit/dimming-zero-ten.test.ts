import { describe, expect, it } from "vitest";
import { levelToZeroTen, maxDriversOnControl, zeroTenToLevel } from "@/lib/dimming/zero-ten";

describe("0–10 V control", () => {
  it("0 % opens the relay and parks the line at 1 V, because 1 V is minimum, not off", () => {
    // Source: IEC 60929 Annex E / IEC 63128 — ≤ 1 V = minimum (not off).
    const off = levelToZeroTen(0);
    expect(off.relay).toBe("open");
    expect(off.volts).toBe(1);
    expect(off.label).toBe("off (relay)");
  });

  it("100 % is 10 V and the driver's minimum is 1 V", () => {
    // Source: IEC 60929 Annex E / IEC 63128 — ≥ 10 V = maximum, ≤ 1 V = minimum.
    expect(levelToZeroTen(100).volts).toBe(10);
    const atMin = levelToZeroTen(10, 10);
    expect(atMin).toMatchObject({ relay: "closed", volts: 1, isAtMinimum: true });
  });

  it("is linear between minimum and maximum (our convention; the real curve is driver-specific)", () => {
    // Common practice, no source: straight line (min level, 1 V) → (100 %, 10 V).
    expect(levelToZeroTen(50).volts).toBeCloseTo(5.5, 12);
    expect(levelToZeroTen(55, 10).volts).toBeCloseTo(5.5, 12);
    expect(levelToZeroTen(50).label).toBe("5.50 V");
  });

  it("holds requests below the driver minimum at 1 V and says so", () => {
    const low = levelToZeroTen(4, 10);
    expect(low).toMatchObject({ relay: "closed", volts: 1, isAtMinimum: true });
    expect(levelToZeroTen(40, 10)).toMatchObject({ isAtMinimum: false });
  });

  it("inverts: volts back to level, clamped to 1–10 V", () => {
    expect(zeroTenToLevel(5.5)).toBeCloseTo(50, 12);
    expect(zeroTenToLevel(5.5, 10)).toBeCloseTo(55, 12);
    expect(zeroTenToLevel(0.3, 10)).toBe(10);
    expect(zeroTenToLevel(11)).toBe(100);
  });

  it("refuses levels outside 0–100 %", () => {
    expect(() => levelToZeroTen(-1)).toThrow(RangeError);
    expect(() => levelToZeroTen(101)).toThrow(RangeError);
    expect(() => levelToZeroTen(50, 100)).toThrow(RangeError);
  });

  it("counts drivers a control output can sink at 2 mA each, rounding down", () => {
    // Source: IEC 60929 Annex E — control current ≤ 2 mA per driver.
    expect(maxDriversOnControl(50)).toBe(25);
    expect(maxDriversOnControl(51.9)).toBe(25);
    expect(maxDriversOnControl(1.9)).toBe(0);
    expect(maxDriversOnControl(0.6 * 10)).toBe(3);
    expect(() => maxDriversOnControl(-1)).toThrow(RangeError);
  });
});
