import { GROUP_MAX, GROUP_MIN, UNICAST_MAX, UNICAST_MIN } from "./address";

export type AddressRange = { first: number; last: number };

/** The lowest free unicast range of `count` consecutive addresses, or null when the site is full. */
export function firstFreeUnicast(taken: AddressRange[], count: number): number | null {
  const sorted = [...taken].sort((a, b) => a.first - b.first);
  let candidate = UNICAST_MIN;
  for (const r of sorted) {
    if (r.last < candidate) continue;
    if (r.first - candidate >= count) break;
    candidate = Math.max(candidate, r.last + 1);
  }
  return candidate + count - 1 <= UNICAST_MAX ? candidate : null;
}

/** The lowest group address not yet used by a zone, or null when all are taken. */
export function firstFreeGroup(taken: number[]): number | null {
  const used = new Set(taken);
  for (let a = GROUP_MIN; a <= GROUP_MAX; a++) if (!used.has(a)) return a;
  return null;
}

export function rangesOverlap(a: AddressRange, b: AddressRange): boolean {
  return a.first <= b.last && b.first <= a.last;
}
