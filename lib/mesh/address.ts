/**
 * Bluetooth Mesh address ranges (Mesh Profile 1.0.1 §3.4.2).
 * Group and virtual addresses are destinations only.
 */
export const UNASSIGNED_ADDRESS = 0x0000;
export const UNICAST_MIN = 0x0001;
export const UNICAST_MAX = 0x7fff;
export const VIRTUAL_MIN = 0x8000;
export const VIRTUAL_MAX = 0xbfff;
export const GROUP_MIN = 0xc000;
/** 0xFF00–0xFFFB are reserved for future fixed groups; 0xFFFC–0xFFFF are the fixed groups. */
export const GROUP_MAX = 0xfeff;

export const FIXED_GROUPS = {
  allProxies: 0xfffc,
  allFriends: 0xfffd,
  allRelays: 0xfffe,
  allNodes: 0xffff,
} as const;

export type AddressType = "unassigned" | "unicast" | "virtual" | "group" | "fixed-group" | "reserved" | "invalid";

export function addressType(address: number): AddressType {
  if (!Number.isInteger(address) || address < 0 || address > 0xffff) return "invalid";
  if (address === UNASSIGNED_ADDRESS) return "unassigned";
  if (address <= UNICAST_MAX) return "unicast";
  if (address <= VIRTUAL_MAX) return "virtual";
  if (address <= GROUP_MAX) return "group";
  if (address >= FIXED_GROUPS.allProxies) return "fixed-group";
  return "reserved";
}

export const isUnicastAddress = (a: number) => addressType(a) === "unicast";
/** A group address a site may assign to a zone (not the fixed groups). */
export const isAssignableGroupAddress = (a: number) => addressType(a) === "group";

/** "0x00AF" style: four upper-case hex digits, as the trade writes mesh addresses. */
export function formatAddress(address: number): string {
  return `0x${address.toString(16).toUpperCase().padStart(4, "0")}`;
}

/** The unicast range a device with `elementCount` elements occupies, or null if it would leave the unicast range. */
export function unicastRange(first: number, elementCount: number): { first: number; last: number } | null {
  if (!isUnicastAddress(first) || !Number.isInteger(elementCount) || elementCount < 1) return null;
  const last = first + elementCount - 1;
  return last <= UNICAST_MAX ? { first, last } : null;
}
