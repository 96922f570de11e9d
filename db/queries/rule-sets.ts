import { and, desc, eq } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { devices, ruleSets, ruleSetVersions, scenes, zones } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { compileGraph } from "@/lib/rules/compile";
import { ruleGraphSchema } from "@/lib/rules/graph";
import { validateGraph, type Problem } from "@/lib/rules/validate";
import { wakeSite } from "./live";

const EMPTY_GRAPH = { nodes: [], edges: [] };

export async function getRuleSet({ siteId }: { siteId: string }) {
  const db = getDb();
  const [row] = await db.select().from(ruleSets).where(eq(ruleSets.siteId, siteId));
  const versions = await db
    .select({ id: ruleSetVersions.id, number: ruleSetVersions.number, createdAt: ruleSetVersions.createdAt, createdBy: ruleSetVersions.createdBy })
    .from(ruleSetVersions)
    .where(eq(ruleSetVersions.siteId, siteId))
    .orderBy(desc(ruleSetVersions.number));
  return { draftGraph: row?.draftGraph ?? EMPTY_GRAPH, draftRevision: row?.draftRevision ?? 0, activeVersionId: row?.activeVersionId ?? null, versions };
}

/** Saves the draft if nobody saved since `expectedRevision` (409 otherwise, so no one loses work silently). */
export async function saveDraft({ siteId, graph, expectedRevision, userId }: { siteId: string; graph: unknown; expectedRevision: number; userId: string | null }): Promise<number> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx.select({ revision: ruleSets.draftRevision }).from(ruleSets).where(eq(ruleSets.siteId, siteId));
    const current = row?.revision ?? 0;
    if (current !== expectedRevision) throw new AppError("conflict", "Someone else saved this draft since you opened it.", { currentRevision: current });
    if (row) await tx.update(ruleSets).set({ draftGraph: graph, draftRevision: current + 1, updatedAt: new Date(), updatedBy: userId }).where(eq(ruleSets.siteId, siteId));
    else await tx.insert(ruleSets).values({ siteId, draftGraph: graph, draftRevision: 1, updatedBy: userId });
    return current + 1;
  });
}

async function siteContext(siteId: string) {
  const db = getDb();
  const [d, z, s] = await Promise.all([
    db.select().from(devices).where(eq(devices.siteId, siteId)),
    db.select().from(zones).where(eq(zones.siteId, siteId)),
    db.select().from(scenes).where(eq(scenes.siteId, siteId)),
  ]);
  return { devices: d.map((x) => ({ id: x.id, kind: x.kind, zoneId: x.zoneId, name: x.name })), zones: z.map((x) => ({ id: x.id, name: x.name })), scenes: s.map((x) => ({ number: x.number, name: x.name, levels: x.levels })) };
}

export async function validateDraftGraph({ siteId, graph }: { siteId: string; graph: unknown }): Promise<Problem[]> {
  return validateGraph(graph, await siteContext(siteId));
}

/**
 * Activate: the draft becomes the next numbered version, compiled to rule JSON,
 * if validation finds no error. Returns the new version's number.
 */
export async function activateDraft({ siteId, userId }: { siteId: string; userId: string | null }): Promise<{ versionId: string; number: number }> {
  const { draftGraph } = await getRuleSet({ siteId });
  const problems = (await validateDraftGraph({ siteId, graph: draftGraph })).filter((p) => p.severity === "error");
  if (problems.length) throw new AppError("bad_request", `The draft has ${problems.length} problem${problems.length === 1 ? "" : "s"} to fix before it can be activated.`, { problems });
  const rules = compileGraph(ruleGraphSchema.parse(draftGraph));
  const activated = await getDb().transaction(async (tx) => {
    const [last] = await tx.select({ number: ruleSetVersions.number }).from(ruleSetVersions).where(eq(ruleSetVersions.siteId, siteId)).orderBy(desc(ruleSetVersions.number)).limit(1);
    const number = (last?.number ?? 0) + 1;
    const id = randomUUID();
    await tx.insert(ruleSetVersions).values({ id, siteId, number, graph: draftGraph, rules, createdBy: userId });
    await tx.update(ruleSets).set({ activeVersionId: id }).where(eq(ruleSets.siteId, siteId));
    return { versionId: id, number };
  });
  await wakeSite({ siteId, now: Date.now() });
  return activated;
}

/** Makes an earlier version active again (a rollback); its graph is not copied into the draft. */
export async function activateVersion({ siteId, versionId }: { siteId: string; versionId: string }): Promise<void> {
  const db = getDb();
  const [v] = await db.select({ id: ruleSetVersions.id }).from(ruleSetVersions).where(and(eq(ruleSetVersions.siteId, siteId), eq(ruleSetVersions.id, versionId)));
  if (!v) throw new AppError("not_found", "No such version of this site's rules.");
  await db.update(ruleSets).set({ activeVersionId: versionId }).where(eq(ruleSets.siteId, siteId));
  await wakeSite({ siteId, now: Date.now() });
}
