import type { Database } from "../client";
import { devices, sites, zones } from "../schema";
import { demoDevices, demoSite, demoZones } from "./demo-site";

export type SeedReport = { sites: number; zones: number; devices: number };

/**
 * Inserts the demo site. Idempotent: rows that already exist (by id) are left
 * as they are, so seeding again never duplicates or overwrites a user's edits.
 */
export async function seedDemo(db: Database): Promise<SeedReport> {
  return db.transaction(async (tx) => {
    const s = await tx.insert(sites).values(demoSite).onConflictDoNothing().returning({ id: sites.id });
    const z = await tx.insert(zones).values(demoZones).onConflictDoNothing().returning({ id: zones.id });
    const d = await tx.insert(devices).values(demoDevices).onConflictDoNothing().returning({ id: devices.id });
    return { sites: s.length, zones: z.length, devices: d.length };
  });
}
