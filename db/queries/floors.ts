import { and, asc, eq } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { devices, floors, uploads, type Floor, type Upload } from "@/db/schema";
import { AppError } from "@/lib/errors";

export type FloorWithPlan = Floor & { plan: Pick<Upload, "id" | "width" | "height" | "mimeType"> | null };

export async function listFloors({ siteId }: { siteId: string }): Promise<FloorWithPlan[]> {
  const rows = await getDb()
    .select({ floor: floors, plan: { id: uploads.id, width: uploads.width, height: uploads.height, mimeType: uploads.mimeType } })
    .from(floors)
    .leftJoin(uploads, eq(uploads.id, floors.planUploadId))
    .where(eq(floors.siteId, siteId))
    .orderBy(asc(floors.sortOrder), asc(floors.name));
  return rows.map((r) => ({ ...r.floor, plan: r.plan?.id ? r.plan : null }));
}

export async function getPlanUpload({ siteId, floorId }: { siteId: string; floorId: string }): Promise<Upload | undefined> {
  const [row] = await getDb()
    .select({ upload: uploads })
    .from(floors)
    .innerJoin(uploads, eq(uploads.id, floors.planUploadId))
    .where(and(eq(floors.siteId, siteId), eq(floors.id, floorId)));
  return row?.upload;
}

export type NewPlan = { storedName: string; mimeType: string; byteSize: number; width: number; height: number; originalName: string };

async function insertUpload(tx: Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0], siteId: string, plan: NewPlan) {
  const [row] = await tx
    .insert(uploads)
    .values({ id: randomUUID(), siteId, ...plan })
    .returning();
  return row;
}

export async function createFloor({ siteId, name, plan }: { siteId: string; name: string; plan: NewPlan | null }): Promise<Floor> {
  return getDb().transaction(async (tx) => {
    const existing = await tx.select({ name: floors.name, sortOrder: floors.sortOrder }).from(floors).where(eq(floors.siteId, siteId));
    if (existing.some((f) => f.name.toLowerCase() === name.toLowerCase())) throw new AppError("conflict", "A floor with this name exists.", { fields: { name: ["A floor with this name exists"] } });
    const upload = plan ? await insertUpload(tx, siteId, plan) : null;
    const [row] = await tx
      .insert(floors)
      .values({ id: randomUUID(), siteId, name, planUploadId: upload?.id ?? null, sortOrder: Math.max(-1, ...existing.map((f) => f.sortOrder)) + 1 })
      .returning();
    return row;
  });
}

/** Replaces the plan; the scale is cleared because it belonged to the old image. Returns the old stored name to delete. */
export async function replacePlan({ siteId, floorId, plan }: { siteId: string; floorId: string; plan: NewPlan }): Promise<string | null> {
  return getDb().transaction(async (tx) => {
    const [floor] = await tx.select().from(floors).where(and(eq(floors.siteId, siteId), eq(floors.id, floorId)));
    if (!floor) throw new AppError("not_found", "No such floor on this site.");
    const upload = await insertUpload(tx, siteId, plan);
    await tx.update(floors).set({ planUploadId: upload.id, pixelsPerMetre: null }).where(eq(floors.id, floorId));
    if (!floor.planUploadId) return null;
    const [old] = await tx.delete(uploads).where(eq(uploads.id, floor.planUploadId)).returning({ storedName: uploads.storedName });
    return old?.storedName ?? null;
  });
}

export async function updateFloor({ siteId, floorId, name, pixelsPerMetre }: { siteId: string; floorId: string; name?: string; pixelsPerMetre?: number }): Promise<Floor> {
  const [row] = await getDb()
    .update(floors)
    .set({ ...(name ? { name } : {}), ...(pixelsPerMetre !== undefined ? { pixelsPerMetre } : {}) })
    .where(and(eq(floors.siteId, siteId), eq(floors.id, floorId)))
    .returning();
  if (!row) throw new AppError("not_found", "No such floor on this site.");
  return row;
}

/** Devices on the floor keep their zone but lose their position. Returns the plan's stored name to delete. */
export async function deleteFloor({ siteId, floorId }: { siteId: string; floorId: string }): Promise<string | null> {
  return getDb().transaction(async (tx) => {
    const [floor] = await tx.select().from(floors).where(and(eq(floors.siteId, siteId), eq(floors.id, floorId)));
    if (!floor) throw new AppError("not_found", "No such floor on this site.");
    await tx.update(devices).set({ floorId: null, x: null, y: null }).where(eq(devices.floorId, floorId));
    await tx.delete(floors).where(eq(floors.id, floorId));
    if (!floor.planUploadId) return null;
    const [old] = await tx.delete(uploads).where(eq(uploads.id, floor.planUploadId)).returning({ storedName: uploads.storedName });
    return old?.storedName ?? null;
  });
}
