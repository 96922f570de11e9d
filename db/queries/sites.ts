import { asc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { devices, sites, zones, type Site } from "@/db/schema";
import type { OverviewDevice, SiteOverview } from "@/lib/validation/overview";

export type SiteSummary = Pick<Site, "id" | "name">;

export async function listSites(): Promise<SiteSummary[]> {
  return getDb().select({ id: sites.id, name: sites.name }).from(sites).orderBy(asc(sites.name));
}

export async function getSite({ siteId }: { siteId: string }): Promise<Site | undefined> {
  const [row] = await getDb().select().from(sites).where(eq(sites.id, siteId)).limit(1);
  return row;
}

/** A site's zones with their devices, and devices in no zone. Undefined when the site does not exist. */
export async function getSiteOverview({ siteId }: { siteId: string }): Promise<SiteOverview | undefined> {
  const db = getDb();
  const site = await getSite({ siteId });
  if (!site) return undefined;
  const [zoneRows, deviceRows] = await Promise.all([
    db
      .select({ id: zones.id, name: zones.name, groupAddress: zones.groupAddress })
      .from(zones)
      .where(eq(zones.siteId, siteId))
      .orderBy(asc(zones.sortOrder), asc(zones.name)),
    db
      .select({
        id: devices.id,
        name: devices.name,
        kind: devices.kind,
        unicastAddress: devices.unicastAddress,
        elementCount: devices.elementCount,
        zoneId: devices.zoneId,
      })
      .from(devices)
      .where(eq(devices.siteId, siteId))
      .orderBy(asc(devices.unicastAddress)),
  ]);
  const byZone = new Map<string, OverviewDevice[]>();
  const unassigned: OverviewDevice[] = [];
  for (const d of deviceRows) {
    if (d.zoneId) (byZone.get(d.zoneId) ?? byZone.set(d.zoneId, []).get(d.zoneId)!).push(d);
    else unassigned.push(d);
  }
  return {
    site: { id: site.id, name: site.name, address: site.address, timeZone: site.timeZone, latitude: site.latitude, longitude: site.longitude },
    zones: zoneRows.map((z) => ({ ...z, devices: byZone.get(z.id) ?? [] })),
    unassigned,
  };
}

/** Round trip to the database, in milliseconds. Throws when it cannot be reached. */
export async function pingDatabase(): Promise<number> {
  const started = performance.now();
  await getDb().run(sql`select 1`);
  return performance.now() - started;
}
