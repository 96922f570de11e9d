import { describe, expect, it } from "vitest";
import {
  encodeGenericOnOffSetUnack,
  encodeLightLightnessSetUnack,
  encodeSceneRecallUnack,
  isRelayed,
  isValidSceneNumber,
  isValidTtl,
  maxRelays,
  nextTid,
  toHex,
  ttlAfterRelay,
  ttlForRelays,
} from "@/lib/mesh/commands";

describe("access messages", () => {
  // Source: Mesh Model 1.0.1 Table 7.1 (opcodes) and §3.2.1.2 / §6.3.1.3 / §5.2.2.5 (parameters); worked in references.md.
  it("encodes Generic OnOff Set Unacknowledged", () => {
    expect(toHex(encodeGenericOnOffSetUnack({ isOn: true, tid: 5, transitionMs: 2_500, delayMs: 0 }))).toBe("82 03 01 05 19 00");
    expect(toHex(encodeGenericOnOffSetUnack({ isOn: false, tid: 0 }))).toBe("82 03 00 00");
  });

  it("encodes Light Lightness Set Unacknowledged, lightness little-endian", () => {
    expect(toHex(encodeLightLightnessSetUnack({ lightness: 0x8000, tid: 7, transitionMs: 10_000 }))).toBe("82 4D 00 80 07 4A 00");
    expect(toHex(encodeLightLightnessSetUnack({ lightness: 0x1234, tid: 255 }))).toBe("82 4D 34 12 FF");
  });

  it("encodes Scene Recall Unacknowledged, omitting the optional transition and delay", () => {
    expect(toHex(encodeSceneRecallUnack({ scene: 1, tid: 9 }))).toBe("82 43 01 00 09");
    expect(toHex(encodeSceneRecallUnack({ scene: 0x0102, tid: 1, transitionMs: 0, delayMs: 50 }))).toBe("82 43 02 01 01 00 0A");
  });

  it("refuses a delay without a transition time, and out-of-range fields", () => {
    // Mesh Model 1.0.1 §3.2.1.2: Delay is present only when Transition Time is.
    expect(() => encodeSceneRecallUnack({ scene: 1, tid: 1, delayMs: 5 })).toThrow(RangeError);
    expect(() => encodeSceneRecallUnack({ scene: 0, tid: 1 })).toThrow(RangeError);
    expect(() => encodeLightLightnessSetUnack({ lightness: 0x10000, tid: 1 })).toThrow(RangeError);
    expect(() => encodeGenericOnOffSetUnack({ isOn: true, tid: 256 })).toThrow(RangeError);
    expect(() => encodeGenericOnOffSetUnack({ isOn: true, tid: 1, transitionMs: 0, delayMs: 1_280 })).toThrow(RangeError);
  });

  it("validates scene numbers: 0x0000 is prohibited", () => {
    // Source: Mesh Model 1.0.1 §5.1.3.1.
    expect(isValidSceneNumber(0)).toBe(false);
    expect(isValidSceneNumber(1)).toBe(true);
    expect(isValidSceneNumber(0xffff)).toBe(true);
    expect(isValidSceneNumber(0x10000)).toBe(false);
  });

  it("wraps TIDs at 255", () => {
    expect(nextTid(0)).toBe(1);
    expect(nextTid(254)).toBe(255);
    expect(nextTid(255)).toBe(0);
  });
});

describe("TTL", () => {
  // Source: Mesh Profile 1.0.1 §3.4.4.3 — 7 bits; 0 and 1 not relayed; 2–127 relayed and decremented; at most 126 relays.
  it("accepts 0–127 only", () => {
    expect(isValidTtl(0)).toBe(true);
    expect(isValidTtl(127)).toBe(true);
    expect(isValidTtl(128)).toBe(false);
    expect(isValidTtl(-1)).toBe(false);
  });

  it("relays only from TTL 2, one less at each hop", () => {
    expect(isRelayed(0)).toBe(false);
    expect(isRelayed(1)).toBe(false);
    expect(isRelayed(2)).toBe(true);
    expect(ttlAfterRelay(1)).toBeNull();
    expect(ttlAfterRelay(2)).toBe(1);
    expect(ttlAfterRelay(127)).toBe(126);
  });

  it("crosses at most TTL − 1 relays: 126 from 127", () => {
    expect(maxRelays(127)).toBe(126);
    expect(maxRelays(1)).toBe(0);
    expect(ttlForRelays(0)).toBe(0);
    expect(ttlForRelays(3)).toBe(4);
    expect(maxRelays(ttlForRelays(5))).toBe(5);
    expect(() => ttlForRelays(127)).toThrow(RangeError);
  });
});
