import { and, asc, count, eq, ne } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { devices, zones, type Zone } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { formatAddress } from "@/lib/mesh/address";
import { firstFreeGroup } from "@/lib/mesh/allocate";

export type ZoneWithCount = Zone & { deviceCount: number };

export async function listZones({ siteId }: { siteId: string }): Promise<ZoneWithCount[]> {
  const db = getDb();
  const [rows, counts] = await Promise.all([
    db.select().from(zones).where(eq(zones.siteId, siteId)).orderBy(asc(zones.sortOrder), asc(zones.name)),
    db.select({ zoneId: devices.zoneId, n: count() }).from(devices).where(eq(devices.siteId, siteId)).groupBy(devices.zoneId),
  ]);
  const byZone = new Map(counts.map((c) => [c.zoneId, c.n]));
  return rows.map((z) => ({ ...z, deviceCount: byZone.get(z.id) ?? 0 }));
}

export async function createZone({ siteId, name, groupAddress }: { siteId: string; name: string; groupAddress?: number }): Promise<Zone> {
  return getDb().transaction(async (tx) => {
    const existing = await tx.select({ name: zones.name, groupAddress: zones.groupAddress, sortOrder: zones.sortOrder }).from(zones).where(eq(zones.siteId, siteId));
    if (existing.some((z) => z.name.toLowerCase() === name.toLowerCase())) throw new AppError("conflict", "A zone with this name exists.", { fields: { name: ["A zone with this name exists"] } });
    const address = groupAddress ?? firstFreeGroup(existing.map((z) => z.groupAddress));
    if (address === null) throw new AppError("conflict", "No free group address is left on this site.");
    const clash = existing.find((z) => z.groupAddress === address);
    if (clash) throw new AppError("conflict", `${formatAddress(address)} is already the group of ${clash.name}.`, { fields: { groupAddress: [`Already the group of ${clash.name}`] } });
    const [row] = await tx
      .insert(zones)
      .values({ id: randomUUID(), siteId, name, groupAddress: address, sortOrder: Math.max(-1, ...existing.map((z) => z.sortOrder)) + 1 })
      .returning();
    return row;
  });
}

export async function updateZone({ siteId, zoneId, name, groupAddress }: { siteId: string; zoneId: string; name?: string; groupAddress?: number }): Promise<Zone> {
  return getDb().transaction(async (tx) => {
    const others = await tx.select({ name: zones.name, groupAddress: zones.groupAddress }).from(zones).where(and(eq(zones.siteId, siteId), ne(zones.id, zoneId)));
    if (name && others.some((z) => z.name.toLowerCase() === name.toLowerCase())) throw new AppError("conflict", "A zone with this name exists.", { fields: { name: ["A zone with this name exists"] } });
    const clash = groupAddress === undefined ? undefined : others.find((z) => z.groupAddress === groupAddress);
    if (clash) throw new AppError("conflict", `${formatAddress(groupAddress!)} is already the group of ${clash.name}.`, { fields: { groupAddress: [`Already the group of ${clash.name}`] } });
    const [row] = await tx
      .update(zones)
      .set({ ...(name ? { name } : {}), ...(groupAddress !== undefined ? { groupAddress } : {}) })
      .where(and(eq(zones.siteId, siteId), eq(zones.id, zoneId)))
      .returning();
    if (!row) throw new AppError("not_found", "No such zone on this site.");
    return row;
  });
}

/** Devices in the zone stay on the site, in no zone. */
export async function deleteZone({ siteId, zoneId }: { siteId: string; zoneId: string }): Promise<void> {
  const rows = await getDb()
    .delete(zones)
    .where(and(eq(zones.siteId, siteId), eq(zones.id, zoneId)))
    .returning({ id: zones.id });
  if (!rows.length) throw new AppError("not_found", "No such zone on this site.");
}
