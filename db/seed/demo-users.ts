import type { Role } from "../../lib/auth/roles";
import { DEMO_SITE_ID } from "./demo-site";

/**
 * Sign-ins for the local demo only (printed by `npm run demo`). They are demo
 * data, not secrets: never seed them into a production database.
 */
export const DEMO_PASSWORD = "larch-lane-demo";

export const demoUsers: { id: string; email: string; name: string; role: Role; zoneIds: string[] | null }[] = [
  { id: "demo-integrator", email: "integrator@larch-lane.invalid", name: "Demo integrator", role: "integrator", zoneIds: null },
  { id: "demo-manager", email: "manager@larch-lane.invalid", name: "Demo facilities manager", role: "manager", zoneIds: null },
  {
    id: "demo-occupant",
    email: "occupant@larch-lane.invalid",
    name: "Demo occupant (flat)",
    role: "occupant",
    zoneIds: [`${DEMO_SITE_ID}-zone-flat`, `${DEMO_SITE_ID}-zone-path`, `${DEMO_SITE_ID}-zone-back`],
  },
];
