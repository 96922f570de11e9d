import { describe, expect, it } from "vitest";
import { addressType, formatAddress, isAssignableGroupAddress, isUnicastAddress, unicastRange } from "@/lib/mesh/address";

describe("mesh address ranges", () => {
  // Source: Bluetooth Mesh Profile 1.0.1 §3.4.2 (0x0000 unassigned; 0x0001–0x7FFF unicast;
  // 0x8000–0xBFFF virtual; 0xC000–0xFEFF group; 0xFFFC–0xFFFF fixed groups).
  it.each([
    [0x0000, "unassigned"],
    [0x0001, "unicast"],
    [0x7fff, "unicast"],
    [0x8000, "virtual"],
    [0xbfff, "virtual"],
    [0xc000, "group"],
    [0xfeff, "group"],
    [0xff00, "reserved"],
    [0xfffb, "reserved"],
    [0xfffc, "fixed-group"],
    [0xffff, "fixed-group"],
    [0x10000, "invalid"],
    [-1, "invalid"],
    [1.5, "invalid"],
  ] as const)("0x%s is %s", (address, type) => {
    expect(addressType(address)).toBe(type);
  });

  it("only unicast addresses may name a device, only 0xC000–0xFEFF may be a zone's group", () => {
    // Source: Mesh Profile 1.0.1 §3.4.2 — group and virtual addresses are destinations only.
    expect(isUnicastAddress(0xc000)).toBe(false);
    expect(isUnicastAddress(0x0000)).toBe(false);
    expect(isAssignableGroupAddress(0xffff)).toBe(false);
    expect(isAssignableGroupAddress(0xc123)).toBe(true);
  });

  it("formats as four upper-case hex digits (common practice, no source)", () => {
    expect(formatAddress(0x1)).toBe("0x0001");
    expect(formatAddress(0xc00a)).toBe("0xC00A");
  });

  it("a multi-element device must fit inside the unicast range", () => {
    expect(unicastRange(0x0010, 3)).toEqual({ first: 0x0010, last: 0x0012 });
    expect(unicastRange(0x7fff, 1)).toEqual({ first: 0x7fff, last: 0x7fff });
    expect(unicastRange(0x7fff, 2)).toBeNull();
    expect(unicastRange(0x0000, 1)).toBeNull();
    expect(unicastRange(0x0005, 0)).toBeNull();
  });
});
