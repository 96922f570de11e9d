import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { decodeTransitionTime, describeTransitionTime, encodeTransitionTime, MAX_TRANSITION_MS } from "@/lib/mesh/transition-time";

describe("transition time octet", () => {
  // Source: Mesh Model 1.0.1 §3.1.3 (layout); finest-resolution encoding is the convention in references.md.
  it.each([
    [0, 0x00],
    [2_500, 0x19],
    [6_200, 0x3e],
    [10_000, 0x4a],
    [62_000, 0x7e],
    [90_000, 0x89],
    [20 * 60_000, 0xc2],
    [620 * 60_000, 0xfe],
  ])("%d ms encodes as 0x%s", (ms, octet) => {
    expect(encodeTransitionTime(ms)).toBe(octet);
    expect(decodeTransitionTime(octet)).toBe(ms);
  });

  it("rounds to the nearest step of the finest resolution that fits", () => {
    // Mesh Model 1.0.1 §3.1.3: 6.26 s needs 63 steps of 100 ms, so it moves to 1 s steps: 6 s.
    expect(encodeTransitionTime(6_260)).toBe(0x46);
    expect(encodeTransitionTime(6_240)).toBe(0x3e);
    expect(encodeTransitionTime(49)).toBe(0x00);
    expect(encodeTransitionTime(50)).toBe(0x01);
    expect(encodeTransitionTime(63_000)).toBe(0x86); // 10 s steps: 6 × 10 s = 60 s
  });

  it("clamps anything beyond 620 min to 0xFE and refuses negatives", () => {
    expect(encodeTransitionTime(MAX_TRANSITION_MS + 1)).toBe(0xfe);
    expect(encodeTransitionTime(24 * 3_600_000)).toBe(0xfe);
    expect(() => encodeTransitionTime(-1)).toThrow(RangeError);
    expect(() => encodeTransitionTime(Number.NaN)).toThrow(RangeError);
  });

  it("decodes steps 0x3F at every resolution as unknown", () => {
    // Mesh Model 1.0.1 §3.1.3: 0x3F is "unknown" whatever the resolution bits.
    for (const octet of [0x3f, 0x7f, 0xbf, 0xff]) expect(decodeTransitionTime(octet)).toBeNull();
    expect(() => decodeTransitionTime(0x100)).toThrow(RangeError);
  });

  it("never encodes 'unknown' and comes back within half a step of what was asked", () => {
    fc.assert(
      fc.property(fc.integer({ min: 0, max: MAX_TRANSITION_MS }), (ms) => {
        const octet = encodeTransitionTime(ms);
        const back = decodeTransitionTime(octet);
        expect(back).not.toBeNull();
        const step = [100, 1_000, 10_000, 600_000][octet >> 6];
        expect(Math.abs(back! - ms)).toBeLessThanOrEqual(step / 2);
      }),
    );
  });

  it("describes what the luminaire will actually run", () => {
    expect(describeTransitionTime(0)).toBe("immediate");
    expect(describeTransitionTime(2_500)).toBe("2.5 s");
    expect(describeTransitionTime(90_000)).toBe("1 min 30 s");
    expect(describeTransitionTime(63_000)).toBe("1 min");
    expect(describeTransitionTime(620 * 60_000)).toBe("10 h 20 min");
  });
});
