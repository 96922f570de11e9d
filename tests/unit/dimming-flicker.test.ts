import { describe, expect, it } from "vitest";
import { cameraBandingBoundPct, flickerIndex, ieee1789Risk, IEEE_1789_SOURCE, percentFlicker, pwmFlicker } from "@/lib/dimming/flicker";

/** One period of a square wave, `n` equally spaced samples. */
const square = (n: number, duty: number, low: number, high: number) => Array.from({ length: n }, (_, i) => (i < n * duty ? high : low));
/** One period of a full sine between 0 and 2 (100 % modulation). */
const sine = (n: number) => Array.from({ length: n }, (_, i) => 1 + Math.sin((2 * Math.PI * i) / n));

describe("percent flicker and flicker index from samples", () => {
  it("50 % duty square 0↔1 → 100 %, 0.500", () => {
    // Source: IES percent flicker / flicker index definitions (from memory), values computed.
    const wave = square(1000, 0.5, 0, 1);
    expect(percentFlicker(wave)).toBe(100);
    expect(flickerIndex(wave)).toBeCloseTo(0.5, 6);
  });

  it("25 % duty square 0↔1 → 100 %, 0.750", () => {
    // Source: IES definitions (from memory), values computed.
    const wave = square(1000, 0.25, 0, 1);
    expect(percentFlicker(wave)).toBe(100);
    expect(flickerIndex(wave)).toBeCloseTo(0.75, 6);
  });

  it("full sine → 100 %, 1/π", () => {
    // Source: IES definitions (from memory), values computed.
    const wave = sine(100_000);
    expect(percentFlicker(wave)).toBeCloseTo(100, 6);
    expect(flickerIndex(wave)).toBeCloseTo(1 / Math.PI, 4);
  });

  it("square 0.8↔1.0 → 11.11 %, 0.0556", () => {
    // Source: IES definitions (from memory), values computed.
    const wave = square(1000, 0.5, 0.8, 1);
    expect(percentFlicker(wave)).toBeCloseTo(11.11, 2);
    expect(flickerIndex(wave)).toBeCloseTo(0.0556, 4);
  });

  it("steady light and darkness do not flicker; bad samples are refused", () => {
    expect(percentFlicker([3, 3, 3])).toBe(0);
    expect(flickerIndex([3, 3, 3])).toBe(0);
    expect(percentFlicker([0, 0])).toBe(0);
    expect(() => percentFlicker([])).toThrow(RangeError);
    expect(() => flickerIndex([1, -1])).toThrow(RangeError);
  });
});

describe("PWM in closed form", () => {
  it.each([
    [0.5, 100, 100, 0.5],
    [0.25, 100, 100, 0.75],
    [0.5, 100 / 9, 11.11, 0.0556],
  ])("duty %f, Mod %f % → %f %, FI %f", (duty, depth, pf, fi) => {
    // Source: IES definitions (from memory), values computed (same cases as the sampled ones).
    const result = pwmFlicker({ frequencyHz: 1000, duty, modulationDepthPct: depth });
    expect(result.percentFlicker).toBeCloseTo(pf, 2);
    expect(result.flickerIndex).toBeCloseTo(fi, 4);
  });

  it("agrees with the sampled waveform for an uneven duty and partial depth", () => {
    // high 1.3, low 0.7 → Mod 30 %; duty 0.2.
    const wave = square(1000, 0.2, 0.7, 1.3);
    const closed = pwmFlicker({ frequencyHz: 500, duty: 0.2, modulationDepthPct: 30 });
    expect(closed.flickerIndex).toBeCloseTo(flickerIndex(wave), 10);
    expect(closed.percentFlicker).toBeCloseTo(percentFlicker(wave), 10);
  });
});

describe("IEEE 1789 bands", () => {
  it("100 Hz → low risk ≤ 8 %, no observable effect ≤ 3.33 %", () => {
    // Source: IEEE 1789-2015 (from memory, not verified).
    const a = ieee1789Risk(100, 5);
    expect(a.lowRiskLimitPct).toBeCloseTo(8, 9);
    expect(a.noEffectLimitPct).toBeCloseTo(3.33, 2);
    expect(a.risk).toBe("low-risk");
    expect(a.source).toBe(IEEE_1789_SOURCE);
    expect(IEEE_1789_SOURCE).toContain("from memory");
  });

  it("1000 Hz → 80 % / 33.3 %", () => {
    // Source: IEEE 1789-2015 (from memory, not verified).
    const a = ieee1789Risk(1000, 90);
    expect(a.lowRiskLimitPct).toBeCloseTo(80, 9);
    expect(a.noEffectLimitPct).toBeCloseTo(33.3, 1);
    expect(a.risk).toBe("above-low-risk");
    expect(ieee1789Risk(1000, 30).risk).toBe("no-observable-effect");
  });

  it("uses 0.025·f and 0.01·f below 90 Hz, and lifts the limits above 1250 / 3000 Hz", () => {
    // Source: IEEE 1789-2015 (from memory, not verified).
    const a = ieee1789Risk(60, 1);
    expect(a.lowRiskLimitPct).toBeCloseTo(1.5, 9);
    expect(a.noEffectLimitPct).toBeCloseTo(0.6, 9);
    expect(a.risk).toBe("low-risk");
    expect(ieee1789Risk(90, 7).lowRiskLimitPct).toBeCloseTo(7.2, 9);
    expect(ieee1789Risk(2000, 100)).toMatchObject({ lowRiskLimitPct: null, risk: "low-risk" });
    expect(ieee1789Risk(3001, 100)).toMatchObject({ noEffectLimitPct: null, risk: "no-observable-effect" });
  });
});

describe("camera banding bound", () => {
  it("20 kHz, D = 0.5, 1/1000 s → ≤ 2.5 %", () => {
    // Source: derived bound (1 − D)/(f·tₑ), computed in references.md.
    expect(cameraBandingBoundPct(20_000, 0.5, 1 / 1000)).toBeCloseTo(2.5, 9);
  });

  it("grows as the exposure shortens and is capped at 100 %", () => {
    expect(cameraBandingBoundPct(20_000, 0.5, 1 / 8000)).toBeCloseTo(20, 9);
    expect(cameraBandingBoundPct(200, 0.5, 1 / 1000)).toBe(100);
    expect(cameraBandingBoundPct(1000, 1, 1 / 1000)).toBe(0);
    expect(() => cameraBandingBoundPct(1000, 0.5, 0)).toThrow(RangeError);
  });
});
