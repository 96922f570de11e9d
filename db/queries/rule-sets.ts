import { and, asc, desc, eq, inArray } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { devices, memberships, ruleSetActivations, ruleSets, ruleSetVersions, scenes, users, zones } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { compileGraph } from "@/lib/rules/compile";
import { ruleGraphSchema, type RuleGraph } from "@/lib/rules/graph";
import type { SiteNames } from "@/lib/rules/sentence";
import { validateGraph, type Problem } from "@/lib/rules/validate";
import { graphReferences, type DraftDto, type VersionDto } from "@/lib/validation/rules";
import { wakeSite } from "./live";

const EMPTY_GRAPH = { nodes: [], edges: [] };

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

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
  return getDb().transaction((tx) => writeDraft(tx, { siteId, graph, expectedRevision, userId }));
}

async function writeDraft(tx: Tx, { siteId, graph, expectedRevision, userId }: { siteId: string; graph: unknown; expectedRevision: number; userId: string | null }): Promise<number> {
  const [row] = await tx.select({ revision: ruleSets.draftRevision }).from(ruleSets).where(eq(ruleSets.siteId, siteId));
  const current = row?.revision ?? 0;
  if (current !== expectedRevision) throw new AppError("conflict", "Someone else saved this draft since you opened it.", { currentRevision: current, revision: current });
  if (row) await tx.update(ruleSets).set({ draftGraph: graph, draftRevision: current + 1, updatedAt: new Date(), updatedBy: userId }).where(eq(ruleSets.siteId, siteId));
  else await tx.insert(ruleSets).values({ siteId, draftGraph: graph, draftRevision: 1, updatedBy: userId });
  return current + 1;
}

/** A draft that points at devices or zones this site does not have (another site's, or deleted): refused, with a message per node. */
export class GraphReferenceError extends Error {
  constructor(readonly fields: Record<string, string[]>) {
    super("The graph refers to devices or zones that are not on this site.");
    this.name = "GraphReferenceError";
  }
}

/**
 * The Canvas save: checks, inside the same transaction as the write, that every
 * device and zone the graph names belongs to this site right now, then saves with
 * the revision check. Nothing is written when either check fails.
 */
export async function saveDraftGraph({ siteId, graph, expectedRevision, userId }: { siteId: string; graph: RuleGraph; expectedRevision: number; userId: string | null }): Promise<number> {
  const refs = graphReferences(graph);
  return getDb().transaction(async (tx) => {
    const deviceIds = [...new Set(refs.devices.map((r) => r.id))];
    const zoneIds = [...new Set(refs.zones.map((r) => r.id))];
    const [d, z] = await Promise.all([
      deviceIds.length ? tx.select({ id: devices.id }).from(devices).where(and(eq(devices.siteId, siteId), inArray(devices.id, deviceIds))) : [],
      zoneIds.length ? tx.select({ id: zones.id }).from(zones).where(and(eq(zones.siteId, siteId), inArray(zones.id, zoneIds))) : [],
    ]);
    const knownDevices = new Set(d.map((r) => r.id));
    const knownZones = new Set(z.map((r) => r.id));
    const fields: Record<string, string[]> = {};
    const index = new Map(graph.nodes.map((n, i) => [n.id, i]));
    for (const r of refs.devices) if (!knownDevices.has(r.id)) (fields[`graph.nodes.${index.get(r.nodeId)}.params`] ??= []).push(`The device “${r.id}” is not on this site (deleted, or another site's).`);
    for (const r of refs.zones) if (!knownZones.has(r.id)) (fields[`graph.nodes.${index.get(r.nodeId)}.params`] ??= []).push(`The zone “${r.id}” is not on this site (deleted, or another site's).`);
    if (Object.keys(fields).length) throw new GraphReferenceError(fields);
    return writeDraft(tx, { siteId, graph, expectedRevision, userId });
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

/** Names for sentences and diffs: devices, zones, scenes (by number) and the site's people. */
export async function getSiteNames({ siteId }: { siteId: string }): Promise<SiteNames> {
  const db = getDb();
  const [d, z, s, p] = await Promise.all([
    db.select({ id: devices.id, name: devices.name }).from(devices).where(eq(devices.siteId, siteId)),
    db.select({ id: zones.id, name: zones.name }).from(zones).where(eq(zones.siteId, siteId)),
    db.select({ number: scenes.number, name: scenes.name }).from(scenes).where(eq(scenes.siteId, siteId)),
    db.select({ id: users.id, name: users.name }).from(memberships).innerJoin(users, eq(users.id, memberships.userId)).where(eq(memberships.siteId, siteId)),
  ]);
  const table = <T extends { name: string }>(rows: T[], key: (r: T) => string | number) => Object.fromEntries(rows.map((r) => [String(key(r)), r.name]));
  return { devices: table(d, (r) => r.id), zones: table(z, (r) => r.id), scenes: table(s, (r) => r.number), people: table(p, (r) => r.id) };
}

/** The Canvas view: the draft (with who saved it last), the active version and the draft's problems. */
export async function getRulesView({ siteId }: { siteId: string }): Promise<{ draft: DraftDto; active: { versionId: string; number: number } | null; problems: Problem[] }> {
  const db = getDb();
  const [row] = await db
    .select({ graph: ruleSets.draftGraph, revision: ruleSets.draftRevision, updatedAt: ruleSets.updatedAt, updatedBy: users.name, activeVersionId: ruleSets.activeVersionId })
    .from(ruleSets)
    .leftJoin(users, eq(users.id, ruleSets.updatedBy))
    .where(eq(ruleSets.siteId, siteId));
  const [active] = row?.activeVersionId
    ? await db.select({ versionId: ruleSetVersions.id, number: ruleSetVersions.number }).from(ruleSetVersions).where(and(eq(ruleSetVersions.siteId, siteId), eq(ruleSetVersions.id, row.activeVersionId)))
    : [];
  const graph = (row?.graph ?? EMPTY_GRAPH) as RuleGraph;
  return {
    draft: { graph, revision: row?.revision ?? 0, updatedAt: row?.updatedAt?.toISOString() ?? null, updatedBy: row?.updatedBy ?? null },
    active: active ?? null,
    problems: await validateDraftGraph({ siteId, graph }),
  };
}

/**
 * Activate: the draft becomes the next numbered version, compiled to rule JSON,
 * if validation finds no error. With `expectedRevision`, only the draft the
 * caller saw (409 otherwise). Every activation is recorded.
 */
export async function activateDraft({ siteId, userId, expectedRevision }: { siteId: string; userId: string | null; expectedRevision?: number }): Promise<{ versionId: string; number: number }> {
  const { draftGraph, draftRevision } = await getRuleSet({ siteId });
  if (expectedRevision !== undefined && expectedRevision !== draftRevision) {
    throw new AppError("conflict", "The draft changed since you reviewed it; look at the changes again.", { currentRevision: draftRevision, revision: draftRevision });
  }
  const problems = (await validateDraftGraph({ siteId, graph: draftGraph })).filter((p) => p.severity === "error");
  if (problems.length) throw new AppError("bad_request", `The draft has ${problems.length} problem${problems.length === 1 ? "" : "s"} to fix before it can be activated.`, { problems });
  const rules = compileGraph(ruleGraphSchema.parse(draftGraph));
  const activated = await getDb().transaction(async (tx) => {
    const [still] = await tx.select({ revision: ruleSets.draftRevision }).from(ruleSets).where(eq(ruleSets.siteId, siteId));
    if ((still?.revision ?? 0) !== draftRevision) throw new AppError("conflict", "The draft changed while it was being activated; look at the changes again.", { currentRevision: still?.revision ?? 0, revision: still?.revision ?? 0 });
    const [last] = await tx.select({ number: ruleSetVersions.number }).from(ruleSetVersions).where(eq(ruleSetVersions.siteId, siteId)).orderBy(desc(ruleSetVersions.number)).limit(1);
    const number = (last?.number ?? 0) + 1;
    const id = randomUUID();
    await tx.insert(ruleSetVersions).values({ id, siteId, number, graph: draftGraph, rules, createdBy: userId });
    if (still) await tx.update(ruleSets).set({ activeVersionId: id }).where(eq(ruleSets.siteId, siteId));
    else await tx.insert(ruleSets).values({ siteId, draftGraph, draftRevision: 0, activeVersionId: id });
    await tx.insert(ruleSetActivations).values({ siteId, versionId: id, activatedBy: userId });
    return { versionId: id, number };
  });
  await wakeSite({ siteId, now: Date.now() });
  return activated;
}

/** Makes an earlier version active again (a rollback); its graph is not copied into the draft. */
export async function activateVersion({ siteId, versionId, userId = null }: { siteId: string; versionId: string; userId?: string | null }): Promise<{ versionId: string; number: number }> {
  const result = await getDb().transaction(async (tx) => {
    const [v] = await tx.select({ id: ruleSetVersions.id, number: ruleSetVersions.number }).from(ruleSetVersions).where(and(eq(ruleSetVersions.siteId, siteId), eq(ruleSetVersions.id, versionId)));
    if (!v) throw new AppError("not_found", "No such version of this site's rules.");
    await tx.update(ruleSets).set({ activeVersionId: versionId }).where(eq(ruleSets.siteId, siteId));
    await tx.insert(ruleSetActivations).values({ siteId, versionId, activatedBy: userId });
    return { versionId: v.id, number: v.number };
  });
  await wakeSite({ siteId, now: Date.now() });
  return result;
}

/** Versions newest first, who made each and when, and every time each was activated. */
export async function listVersions({ siteId }: { siteId: string }): Promise<VersionDto[]> {
  const db = getDb();
  const [rows, acts, [set]] = await Promise.all([
    db
      .select({ id: ruleSetVersions.id, number: ruleSetVersions.number, createdAt: ruleSetVersions.createdAt, createdBy: users.name })
      .from(ruleSetVersions)
      .leftJoin(users, eq(users.id, ruleSetVersions.createdBy))
      .where(eq(ruleSetVersions.siteId, siteId))
      .orderBy(desc(ruleSetVersions.number)),
    db
      .select({ versionId: ruleSetActivations.versionId, at: ruleSetActivations.activatedAt, by: users.name })
      .from(ruleSetActivations)
      .leftJoin(users, eq(users.id, ruleSetActivations.activatedBy))
      .where(eq(ruleSetActivations.siteId, siteId))
      .orderBy(asc(ruleSetActivations.id)),
    db.select({ activeVersionId: ruleSets.activeVersionId }).from(ruleSets).where(eq(ruleSets.siteId, siteId)),
  ]);
  return rows.map((v) => ({
    id: v.id,
    number: v.number,
    createdAt: v.createdAt.toISOString(),
    createdBy: v.createdBy ?? null,
    isActive: set?.activeVersionId === v.id,
    activations: acts.filter((a) => a.versionId === v.id).map((a) => ({ at: a.at.toISOString(), by: a.by ?? null })),
  }));
}

/** One side of a diff: "active", "draft" or a version id of this site (404 for another site's). */
export async function getGraphSide({ siteId, side }: { siteId: string; side: string }): Promise<{ graph: unknown; label: string }> {
  const db = getDb();
  const [set] = await db.select({ draftGraph: ruleSets.draftGraph, activeVersionId: ruleSets.activeVersionId }).from(ruleSets).where(eq(ruleSets.siteId, siteId));
  if (side === "draft") return { graph: set?.draftGraph ?? EMPTY_GRAPH, label: "the draft" };
  const versionId = side === "active" ? set?.activeVersionId : side;
  if (!versionId) return { graph: EMPTY_GRAPH, label: "no active rules" };
  const [v] = await db.select({ graph: ruleSetVersions.graph, number: ruleSetVersions.number }).from(ruleSetVersions).where(and(eq(ruleSetVersions.siteId, siteId), eq(ruleSetVersions.id, versionId)));
  if (!v) throw new AppError("not_found", "No such version of this site's rules.");
  return { graph: v.graph, label: `${side === "active" ? "the active version, " : ""}version ${v.number}` };
}
