import { and, asc, eq, inArray, ne } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { devices, floors, zones, type Device } from "@/db/schema";
import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import { parseProfile } from "@/lib/catalogue/profiles";
import { AppError } from "@/lib/errors";
import { formatAddress } from "@/lib/mesh/address";
import { firstFreeUnicast, rangesOverlap, type AddressRange } from "@/lib/mesh/allocate";

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

export type DeviceFields = {
  name: string;
  kind: DeviceKind;
  zoneId: string | null;
  unicastAddress?: number;
  elementCount: number;
  profile: Record<string, unknown>;
  floorId: string | null;
  x: number | null;
  y: number | null;
};

export async function listDevices({ siteId }: { siteId: string }): Promise<Device[]> {
  return getDb().select().from(devices).where(eq(devices.siteId, siteId)).orderBy(asc(devices.unicastAddress));
}

export async function getDevice({ siteId, deviceId }: { siteId: string; deviceId: string }): Promise<Device | undefined> {
  const [row] = await getDb()
    .select()
    .from(devices)
    .where(and(eq(devices.siteId, siteId), eq(devices.id, deviceId)));
  return row;
}

async function takenRanges(tx: Tx, siteId: string, exceptId?: string): Promise<(AddressRange & { name: string })[]> {
  const rows = await tx
    .select({ name: devices.name, first: devices.unicastAddress, count: devices.elementCount })
    .from(devices)
    .where(exceptId ? and(eq(devices.siteId, siteId), ne(devices.id, exceptId)) : eq(devices.siteId, siteId));
  return rows.map((r) => ({ name: r.name, first: r.first, last: r.first + r.count - 1 }));
}

/** Zone and floor ids must belong to the same site: another site's ids are refused as unknown. */
async function assertOwnRefs(tx: Tx, siteId: string, zoneIds: (string | null | undefined)[], floorIds: (string | null | undefined)[]) {
  const z = [...new Set(zoneIds.filter((v): v is string => Boolean(v)))];
  const f = [...new Set(floorIds.filter((v): v is string => Boolean(v)))];
  if (z.length) {
    const found = await tx.select({ id: zones.id }).from(zones).where(and(eq(zones.siteId, siteId), inArray(zones.id, z)));
    if (found.length !== z.length) throw new AppError("bad_request", "That zone is not on this site.", { fields: { zoneId: ["Choose a zone of this site"] } });
  }
  if (f.length) {
    const found = await tx.select({ id: floors.id }).from(floors).where(and(eq(floors.siteId, siteId), inArray(floors.id, f)));
    if (found.length !== f.length) throw new AppError("bad_request", "That floor is not on this site.", { fields: { floorId: ["Choose a floor of this site"] } });
  }
}

/** A profile must fit its kind; stored complete (typical values filled in and marked), so what is shown is what is used. */
function checkedProfile(kind: DeviceKind, profile: Record<string, unknown>): Record<string, unknown> {
  const result = parseProfile(kind, profile);
  if (result.ok) return result.profile as Record<string, unknown>;
  const fields = Object.fromEntries(result.errors.map((e) => [`profile${e.path ? `.${e.path}` : ""}`, [e.message]]));
  throw new AppError("bad_request", `The device profile is not valid: ${result.errors[0].path || "profile"} ${result.errors[0].message}.`, { fields });
}

function placeAddress(taken: (AddressRange & { name: string })[], fields: { unicastAddress?: number; elementCount: number }): number {
  if (fields.unicastAddress === undefined) {
    const free = firstFreeUnicast(taken, fields.elementCount);
    if (free === null) throw new AppError("conflict", "No free unicast range is left on this site.");
    return free;
  }
  const mine = { first: fields.unicastAddress, last: fields.unicastAddress + fields.elementCount - 1 };
  if (mine.last > 0x7fff) throw new AppError("bad_request", "The device's elements run past 0x7FFF.", { fields: { unicastAddress: ["The elements run past 0x7FFF, the last unicast address"] } });
  const clash = taken.find((t) => rangesOverlap(t, mine));
  if (clash) {
    const message = `${formatAddress(mine.first)}${mine.last > mine.first ? `–${formatAddress(mine.last)}` : ""} overlaps ${clash.name} (${formatAddress(clash.first)}–${formatAddress(clash.last)})`;
    throw new AppError("conflict", message, { fields: { unicastAddress: [message] } });
  }
  return fields.unicastAddress;
}

export async function createDevice({ siteId, fields }: { siteId: string; fields: DeviceFields }): Promise<Device> {
  return getDb().transaction(async (tx) => {
    await assertOwnRefs(tx, siteId, [fields.zoneId], [fields.floorId]);
    const unicastAddress = placeAddress(await takenRanges(tx, siteId), fields);
    const [row] = await tx
      .insert(devices)
      .values({ id: randomUUID(), siteId, ...fields, profile: checkedProfile(fields.kind, fields.profile), unicastAddress })
      .returning();
    return row;
  });
}

export async function updateDevice({ siteId, deviceId, patch: input }: { siteId: string; deviceId: string; patch: Partial<DeviceFields> }): Promise<Device> {
  let patch = input;
  return getDb().transaction(async (tx) => {
    const [current] = await tx.select().from(devices).where(and(eq(devices.siteId, siteId), eq(devices.id, deviceId)));
    if (!current) throw new AppError("not_found", "No such device on this site.");
    await assertOwnRefs(tx, siteId, [patch.zoneId], [patch.floorId]);
    const next = { ...current, ...patch };
    if (patch.profile !== undefined || patch.kind !== undefined) patch = { ...patch, profile: checkedProfile(next.kind, next.profile) };
    const unicastAddress =
      patch.unicastAddress !== undefined || patch.elementCount !== undefined
        ? placeAddress(await takenRanges(tx, siteId, deviceId), { unicastAddress: next.unicastAddress, elementCount: next.elementCount })
        : current.unicastAddress;
    const [row] = await tx
      .update(devices)
      .set({ ...patch, unicastAddress })
      .where(and(eq(devices.siteId, siteId), eq(devices.id, deviceId)))
      .returning();
    return row;
  });
}

export async function deleteDevice({ siteId, deviceId }: { siteId: string; deviceId: string }): Promise<void> {
  const rows = await getDb()
    .delete(devices)
    .where(and(eq(devices.siteId, siteId), eq(devices.id, deviceId)))
    .returning({ id: devices.id });
  if (!rows.length) throw new AppError("not_found", "No such device on this site.");
}

export async function assignZone({ siteId, deviceIds, zoneId }: { siteId: string; deviceIds: string[]; zoneId: string | null }): Promise<number> {
  return getDb().transaction(async (tx) => {
    await assertOwnRefs(tx, siteId, [zoneId], []);
    const rows = await tx
      .update(devices)
      .set({ zoneId })
      .where(and(eq(devices.siteId, siteId), inArray(devices.id, deviceIds)))
      .returning({ id: devices.id });
    if (rows.length !== new Set(deviceIds).size) throw new AppError("not_found", "Some selected devices are not on this site; nothing was changed.");
    return rows.length;
  });
}

/** All-or-nothing: every row goes in, or (on any clash) none does. */
export async function importDevices({ siteId, rows }: { siteId: string; rows: DeviceFields[] }): Promise<number> {
  return getDb().transaction(async (tx) => {
    await assertOwnRefs(tx, siteId, rows.map((r) => r.zoneId), rows.map((r) => r.floorId));
    const taken = await takenRanges(tx, siteId);
    const values = rows.map((r) => {
      const unicastAddress = placeAddress(taken, r);
      taken.push({ name: r.name, first: unicastAddress, last: unicastAddress + r.elementCount - 1 });
      return { id: randomUUID(), siteId, ...r, profile: checkedProfile(r.kind, r.profile), unicastAddress };
    });
    for (let i = 0; i < values.length; i += 200) await tx.insert(devices).values(values.slice(i, i + 200));
    return values.length;
  });
}
