import { randomUUID } from "node:crypto";
import { and, asc, eq, inArray, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { devices, engineStates, memberships, sites, zones, type Site } from "@/db/schema";
import type { EngineState } from "@/lib/bus/types";
import { AppError } from "@/lib/errors";
import type { OverviewDevice, SiteOverview } from "@/lib/validation/overview";


export async function listZoneChoices({ siteId }: { siteId: string }): Promise<{ id: string; name: string }[]> {
  return getDb().select({ id: zones.id, name: zones.name }).from(zones).where(eq(zones.siteId, siteId)).orderBy(asc(zones.sortOrder), asc(zones.name));
}

export async function getSite({ siteId }: { siteId: string }): Promise<Site | undefined> {
  const [row] = await getDb().select().from(sites).where(eq(sites.id, siteId)).limit(1);
  return row;
}

/** Creates a site and makes its creator the integrator, in one transaction. */
export async function createSite(input: { userId: string; name: string; address: string; timeZone: string; latitude: number; longitude: number }): Promise<Site> {
  const { userId, ...fields } = input;
  const slug = fields.name.toLowerCase().normalize("NFKD").replace(/[^a-z0-9]+/g, "-").replace(/^-+|-+$/g, "").slice(0, 40) || "site";
  return getDb().transaction(async (tx) => {
    const [site] = await tx
      .insert(sites)
      .values({ id: `${slug}-${randomUUID().slice(0, 8)}`, ...fields })
      .returning();
    await tx.insert(memberships).values({ siteId: site.id, userId, role: "integrator", zoneIds: null });
    return site;
  });
}

/**
 * A site's zones with their devices, and devices in no zone. Undefined when the
 * site does not exist. `zoneIds` narrows it to those zones (an occupant's view),
 * leaving out devices in no zone.
 */
export async function getSiteOverview({ siteId, zoneIds = null }: { siteId: string; zoneIds?: string[] | null }): Promise<SiteOverview | undefined> {
  const db = getDb();
  const site = await getSite({ siteId });
  if (!site) return undefined;
  const [zoneRows, deviceRows, [liveRow]] = await Promise.all([
    db
      .select({ id: zones.id, name: zones.name, groupAddress: zones.groupAddress })
      .from(zones)
      .where(zoneIds ? and(eq(zones.siteId, siteId), inArray(zones.id, zoneIds)) : eq(zones.siteId, siteId))
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
      .where(zoneIds ? and(eq(devices.siteId, siteId), inArray(devices.zoneId, zoneIds)) : eq(devices.siteId, siteId))
      .orderBy(asc(devices.unicastAddress)),
    db.select({ state: engineStates.state }).from(engineStates).where(eq(engineStates.siteId, siteId)),
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
    live: liveSummary(liveRow?.state as EngineState | undefined, new Set(deviceRows.map((d) => d.id))),
  };
}

/** Round trip to the database, in milliseconds. Throws when it cannot be reached. */
export async function pingDatabase(): Promise<number> {
  const started = performance.now();
  await getDb().run(sql`select 1`);
  return performance.now() - started;
}

export async function updateSite({ siteId, ...fields }: { siteId: string; name?: string; address?: string; timeZone?: string; latitude?: number; longitude?: number }): Promise<Site> {
  const [row] = await getDb().update(sites).set(fields).where(eq(sites.id, siteId)).returning();
  if (!row) throw new AppError("not_found", "No such site.");
  return row;
}

/** Only what the overview shows, and only for the devices the caller may see. */
function liveSummary(state: EngineState | undefined, visible: Set<string>) {
  if (!state) return null;
  const pick = <T,>(record: Record<string, T>) => Object.fromEntries(Object.entries(record).filter(([id]) => visible.has(id)));
  return { mode: state.mode, emergency: { active: state.emergency.active, since: state.emergency.since }, levels: pick(state.levels), relays: pick(state.relays), at: state.now };
}
