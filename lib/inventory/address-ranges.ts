import { firstFreeUnicast, rangesOverlap, type AddressRange } from "@/lib/mesh/allocate";
import { formatAddress, UNICAST_MAX, UNICAST_MIN } from "@/lib/mesh/address";

/**
 * A device owns the unicast addresses first … first + elementCount − 1 (one per
 * element, Mesh Profile 1.0.1 §3.4.2), so clashes are between ranges, not single
 * addresses. The gap search itself is lib/mesh/allocate's, shared with the device form.
 */
export type { AddressRange };
export type AddressedDevice = { unicastAddress: number; elementCount: number };

export const rangeOf = (d: AddressedDevice): AddressRange => ({ first: d.unicastAddress, last: d.unicastAddress + d.elementCount - 1 });
export const overlaps = rangesOverlap;
export const formatRange = (r: AddressRange) => (r.first === r.last ? formatAddress(r.first) : `${formatAddress(r.first)}–${formatAddress(r.last)}`);

export type Assignable = { line: number; unicastAddress: number | null; elementCount: number };
export type AssignError = { line: number; field: "unicast_address"; message: string };

/**
 * Gives every row without an address the lowest free range that fits its
 * element count, in row order (first fit). Rows that already have an address,
 * and `taken` (the site's devices), are never moved. Rows that find no room are
 * left out of `rows` and reported.
 */
export function assignUnicastAddresses<R extends Assignable>(
  rows: readonly R[],
  taken: readonly AddressedDevice[],
): { rows: (R & { unicastAddress: number })[]; errors: AssignError[] } {
  const busy: AddressRange[] = [...taken.map(rangeOf), ...rows.flatMap((r) => (r.unicastAddress === null ? [] : [rangeOf({ unicastAddress: r.unicastAddress, elementCount: r.elementCount })]))];
  const assigned: (R & { unicastAddress: number })[] = [];
  const errors: AssignError[] = [];
  for (const row of rows) {
    if (row.unicastAddress !== null) {
      assigned.push(row as R & { unicastAddress: number });
      continue;
    }
    const first = firstFreeUnicast(busy, row.elementCount);
    if (first === null) {
      errors.push({ line: row.line, field: "unicast_address", message: `no free run of ${row.elementCount} unicast addresses is left in ${formatAddress(UNICAST_MIN)}–${formatAddress(UNICAST_MAX)}` });
      continue;
    }
    busy.push({ first, last: first + row.elementCount - 1 });
    assigned.push({ ...row, unicastAddress: first });
  }
  return { rows: assigned, errors };
}
