import { and, asc, eq, inArray, ne, or } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { devices, scenes, zones, type Scene, type SceneLevel } from "@/db/schema";
import { AppError } from "@/lib/errors";

export type SceneFields = { number: number; name: string; fadeMs: number; isOccupantRecallable: boolean; levels: SceneLevel[] };

export async function listScenes({ siteId }: { siteId: string }): Promise<Scene[]> {
  return getDb().select().from(scenes).where(eq(scenes.siteId, siteId)).orderBy(asc(scenes.number));
}

/** What an occupant may see: recallable scenes that touch only their zones. */
export function scenesForOccupant(all: Scene[], zoneIds: string[] | null, deviceZone: Map<string, string | null>): Scene[] {
  return all.filter((s) => {
    if (!s.isOccupantRecallable) return false;
    if (!zoneIds) return true;
    return s.levels.every((l) => (l.zoneId ? zoneIds.includes(l.zoneId) : zoneIds.includes(deviceZone.get(l.deviceId!) ?? "")));
  });
}

async function assertTargets(siteId: string, levels: SceneLevel[]) {
  const db = getDb();
  const zoneIds = [...new Set(levels.flatMap((l) => (l.zoneId ? [l.zoneId] : [])))];
  const deviceIds = [...new Set(levels.flatMap((l) => (l.deviceId ? [l.deviceId] : [])))];
  if (zoneIds.length) {
    const found = await db.select({ id: zones.id }).from(zones).where(and(eq(zones.siteId, siteId), inArray(zones.id, zoneIds)));
    if (found.length !== zoneIds.length) throw new AppError("bad_request", "A level names a zone that is not on this site.", { fields: { levels: ["A level names a zone that is not on this site"] } });
  }
  if (deviceIds.length) {
    const found = await db.select({ id: devices.id, kind: devices.kind }).from(devices).where(and(eq(devices.siteId, siteId), inArray(devices.id, deviceIds)));
    if (found.length !== deviceIds.length) throw new AppError("bad_request", "A level names a device that is not on this site.", { fields: { levels: ["A level names a device that is not on this site"] } });
  }
}

async function assertUnique(siteId: string, fields: Pick<SceneFields, "number" | "name">, exceptId?: string) {
  const rows = await getDb()
    .select({ number: scenes.number, name: scenes.name })
    .from(scenes)
    .where(and(eq(scenes.siteId, siteId), or(eq(scenes.number, fields.number), eq(scenes.name, fields.name)), exceptId ? ne(scenes.id, exceptId) : undefined));
  const fieldsErr: Record<string, string[]> = {};
  if (rows.some((r) => r.number === fields.number)) fieldsErr.number = [`Scene ${fields.number} already exists on this site`];
  if (rows.some((r) => r.name === fields.name)) fieldsErr.name = ["A scene with this name exists"];
  if (Object.keys(fieldsErr).length) throw new AppError("conflict", Object.values(fieldsErr)[0][0], { fields: fieldsErr });
}

export async function createScene({ siteId, fields }: { siteId: string; fields: SceneFields }): Promise<Scene> {
  await assertTargets(siteId, fields.levels);
  await assertUnique(siteId, fields);
  const [row] = await getDb()
    .insert(scenes)
    .values({ id: randomUUID(), siteId, ...fields })
    .returning();
  return row;
}

export async function updateScene({ siteId, sceneId, fields }: { siteId: string; sceneId: string; fields: SceneFields }): Promise<Scene> {
  await assertTargets(siteId, fields.levels);
  await assertUnique(siteId, fields, sceneId);
  const [row] = await getDb()
    .update(scenes)
    .set({ ...fields, updatedAt: new Date() })
    .where(and(eq(scenes.siteId, siteId), eq(scenes.id, sceneId)))
    .returning();
  if (!row) throw new AppError("not_found", "No such scene on this site.");
  return row;
}

export async function deleteScene({ siteId, sceneId }: { siteId: string; sceneId: string }): Promise<void> {
  const rows = await getDb()
    .delete(scenes)
    .where(and(eq(scenes.siteId, siteId), eq(scenes.id, sceneId)))
    .returning({ id: scenes.id });
  if (!rows.length) throw new AppError("not_found", "No such scene on this site.");
}
