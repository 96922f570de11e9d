import type { Role } from "./roles";

/**
 * The single permission table. Every route handler, server action and page asks
 * `can(role, permission)` on the server; hiding a button is never the check.
 */
export const PERMISSIONS = {
  /** See the site and its zones (occupants: their zones only). */
  "site.view": ["integrator", "manager", "occupant"],
  "site.edit": ["integrator"],
  "members.manage": ["integrator"],
  "devices.manage": ["integrator"],
  "gateway-keys.manage": ["integrator"],
  /** Addresses, device details, the whole inventory. */
  "inventory.view": ["integrator", "manager"],
  "scenes.edit": ["integrator", "manager"],
  "rules.edit": ["integrator", "manager"],
  "rules.activate": ["integrator", "manager"],
  "bench.use": ["integrator", "manager"],
  "replay.use": ["integrator", "manager"],
  /** Energy budget of the site's battery-free devices. */
  "energy.view": ["integrator", "manager"],
  "notices.settings": ["integrator", "manager"],
  "emergency.clear": ["integrator", "manager"],
  /** Only scenes marked occupant-recallable, in the occupant's zones. */
  "scenes.recall": ["integrator", "manager", "occupant"],
  "notices.receive": ["integrator", "manager", "occupant"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}
