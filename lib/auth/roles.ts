/** Roles are per site: one person can be integrator on one site and occupant on another. */
export const ROLES = ["integrator", "manager", "occupant"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABEL: Record<Role, string> = {
  integrator: "Integrator",
  manager: "Facilities manager",
  occupant: "Occupant",
};
