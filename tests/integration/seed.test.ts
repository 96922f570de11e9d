import { count, eq } from "drizzle-orm";
import { describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { devices, ruleSetActivations, sites, zones } from "@/db/schema";
import { DEMO_SITE_ID, demoDevices, demoZones } from "@/db/seed/demo-site";
import { seedDemoSite } from "./helpers";

describe("demo seed on a real SQLite file", () => {
  it("adds the demo site once and changes nothing the second time", async () => {
    const first = await seedDemoSite();
    expect(first).toEqual({ sites: 1, zones: demoZones.length, devices: demoDevices.length, users: 3 });
    const second = await seedDemoSite();
    expect(second).toEqual({ sites: 0, zones: 0, devices: 0, users: 0 });
    const db = getDb();
    const [[s], [z], [d]] = await Promise.all([
      db.select({ n: count() }).from(sites),
      db.select({ n: count() }).from(zones).where(eq(zones.siteId, DEMO_SITE_ID)),
      db.select({ n: count() }).from(devices).where(eq(devices.siteId, DEMO_SITE_ID)),
    ]);
    expect([s.n, z.n, d.n]).toEqual([1, demoZones.length, demoDevices.length]);
    // Version 1 went live once, by the seed: one activation row, however often the seed runs.
    const activations = await db.select().from(ruleSetActivations).where(eq(ruleSetActivations.siteId, DEMO_SITE_ID));
    expect(activations.map((a) => [a.versionId, a.activatedBy])).toEqual([[`${DEMO_SITE_ID}-rules-v1`, null]]);
  });

  it("keeps a user's edit when seeding again", async () => {
    const db = getDb();
    await seedDemoSite();
    await db.update(sites).set({ name: "Renamed by the integrator" }).where(eq(sites.id, DEMO_SITE_ID));
    await seedDemoSite();
    const [row] = await db.select({ name: sites.name }).from(sites).where(eq(sites.id, DEMO_SITE_ID));
    expect(row.name).toBe("Renamed by the integrator");
  });

  it("refuses two devices on one unicast address in a site", async () => {
    await seedDemoSite();
    const clash = { ...demoDevices[0], id: "clash" };
    await expect(getDb().insert(devices).values(clash)).rejects.toThrow();
  });
});
