import { describe, expect, it } from "vitest";
import { actualToLevel, actualToLinear, levelToActual, linearToActual } from "@/lib/mesh/lightness";

describe("light lightness", () => {
  // Source: Mesh Model 1.0.1 §6.1.2.2.1, Linear = ⌈65535·(Actual/65535)²⌉; values computed in references.md.
  it.each([
    [0, 0],
    [1, 1],
    [255, 1],
    [256, 2],
    [16384, 4097],
    [32768, 16385],
    [49152, 36865],
    [65535, 65535],
  ])("Actual %d → Linear %d", (actual, linear) => {
    expect(actualToLinear(actual)).toBe(linear);
  });

  it("Linear → Actual rounds to nearest (our documented choice) and undoes the ceiling to within one", () => {
    // Mesh Model 1.0.1 §6.1.2.2.1: Actual = 65535·√(Linear/65535); rounding is ours.
    expect(linearToActual(0)).toBe(0);
    expect(linearToActual(65535)).toBe(65535);
    expect(linearToActual(16384)).toBe(32768); // √(16384·65535) = 32767.75 → 32768
    for (let linear = 0; linear <= 65535; linear++) {
      const diff = actualToLinear(linearToActual(linear)) - linear;
      if (diff !== 0 && diff !== 1) throw new Error(`Linear ${linear} comes back as ${linear + diff}`);
    }
  });

  it("maps percent linearly onto Actual, rounding", () => {
    // Common practice, no source: a slider's percent is read as Actual.
    expect(levelToActual(0)).toBe(0);
    expect(levelToActual(100)).toBe(65535);
    expect(levelToActual(50)).toBe(32768); // 32767.5 rounds up
    expect(levelToActual(1)).toBe(655);
    expect(levelToActual(150)).toBe(65535);
    expect(actualToLevel(65535)).toBe(100);
    expect(actualToLevel(0)).toBe(0);
  });

  it("refuses values outside 0–65535", () => {
    expect(() => actualToLinear(65536)).toThrow(RangeError);
    expect(() => linearToActual(-1)).toThrow(RangeError);
    expect(() => actualToLinear(1.5)).toThrow(RangeError);
    expect(() => levelToActual(Number.NaN)).toThrow(RangeError);
  });
});
