import { hashPassword } from "../../lib/auth/password";
import type { Database } from "../client";
import { devices, memberships, sites, users, zones } from "../schema";
import { demoDevices, demoSite, demoZones } from "./demo-site";
import { DEMO_PASSWORD, demoUsers } from "./demo-users";

export type SeedReport = { sites: number; zones: number; devices: number; users: number };

/**
 * Inserts the demo site and its demo sign-ins. Idempotent: rows that already
 * exist (by id) are left as they are, so seeding again never duplicates or
 * overwrites a user's edits.
 */
export async function seedDemo(db: Database, options: { withUsers?: boolean } = {}): Promise<SeedReport> {
  const withUsers = options.withUsers ?? true;
  const passwordHash = withUsers ? await hashPassword(DEMO_PASSWORD) : "";
  return db.transaction(async (tx) => {
    const s = await tx.insert(sites).values(demoSite).onConflictDoNothing().returning({ id: sites.id });
    const z = await tx.insert(zones).values(demoZones).onConflictDoNothing().returning({ id: zones.id });
    const d = await tx.insert(devices).values(demoDevices).onConflictDoNothing().returning({ id: devices.id });
    let u: { id: string }[] = [];
    if (withUsers) {
      u = await tx
        .insert(users)
        .values(demoUsers.map(({ id, email, name }) => ({ id, email, name, passwordHash })))
        .onConflictDoNothing()
        .returning({ id: users.id });
      const added = new Set(u.map((r) => r.id));
      const newMemberships = demoUsers.filter((x) => added.has(x.id)).map((x) => ({ siteId: demoSite.id, userId: x.id, role: x.role, zoneIds: x.zoneIds }));
      if (newMemberships.length) await tx.insert(memberships).values(newMemberships).onConflictDoNothing();
    }
    return { sites: s.length, zones: z.length, devices: d.length, users: u.length };
  });
}
