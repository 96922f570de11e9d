import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { assignUnicastAddresses } from "@/lib/inventory/device-csv";
import { overlaps, rangeOf } from "@/lib/inventory/address-ranges";
import { UNICAST_MAX } from "@/lib/mesh/address";

const row = (line: number, unicastAddress: number | null, elementCount = 1) => ({ line, unicastAddress, elementCount });

describe("assignUnicastAddresses", () => {
  it("gives each unaddressed row the lowest free run that fits its elements, in row order", () => {
    // Taken: 0x0001–0x0002 (site), 0x0005 (file). Free: 0x0003–0x0004, 0x0006 …
    const { rows, errors } = assignUnicastAddresses([row(2, null, 3), row(3, 0x0005), row(4, null, 2), row(5, null, 1)], [{ unicastAddress: 1, elementCount: 2 }]);
    expect(errors).toEqual([]);
    expect(rows.map((r) => [r.line, r.unicastAddress])).toEqual([
      [2, 0x0006],
      [3, 0x0005],
      [4, 0x0003],
      [5, 0x0009],
    ]);
  });

  it("starts at 0x0001, never at 0x0000", () => {
    // Source: Mesh Profile 1.0.1 §3.4.2 — 0x0000 is the unassigned address.
    expect(assignUnicastAddresses([row(2, null)], []).rows[0].unicastAddress).toBe(1);
  });

  it("reports a row that finds no room below 0x7FFF", () => {
    // Source: Mesh Profile 1.0.1 §3.4.2 — unicast ends at 0x7FFF.
    const { rows, errors } = assignUnicastAddresses([row(2, null, 2), row(3, null, 1)], [{ unicastAddress: 1, elementCount: UNICAST_MAX - 1 }]);
    expect(errors).toEqual([expect.objectContaining({ line: 2, field: "unicast_address" })]);
    expect(rows.map((r) => [r.line, r.unicastAddress])).toEqual([[3, UNICAST_MAX]]);
  });

  it("never overlaps anything and keeps given addresses (property)", () => {
    const existing = fc.array(fc.record({ unicastAddress: fc.integer({ min: 1, max: 400 }), elementCount: fc.integer({ min: 1, max: 5 }) }), { maxLength: 20 });
    const counts = fc.array(fc.integer({ min: 1, max: 6 }), { maxLength: 40 });
    fc.assert(
      fc.property(existing, counts, (taken, elementCounts) => {
        const input = elementCounts.map((n, i) => row(i + 2, null, n));
        const { rows, errors } = assignUnicastAddresses(input, taken);
        expect(errors).toEqual([]);
        const ranges = rows.map((r) => rangeOf(r));
        ranges.forEach((range, i) => {
          expect(range.first).toBeGreaterThanOrEqual(1);
          for (const t of taken) expect(overlaps(range, rangeOf(t))).toBe(false);
          for (const other of ranges.slice(i + 1)) expect(overlaps(range, other)).toBe(false);
        });
      }),
    );
  });
});
