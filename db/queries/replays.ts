import { and, desc, eq, lt, or, sql } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { replayJobs, ruleSets, ruleSetVersions, type ReplayJob } from "@/db/schema";
import { AppError } from "@/lib/errors";
import { compileGraph, type RuleJson } from "@/lib/rules/compile";
import { ruleGraphSchema } from "@/lib/rules/graph";
import type { ReplayResult } from "@/lib/replay/types";
import type { ReplayRequest, RuleSetChoice } from "@/lib/validation/events";
import { countEvents } from "./events";
import { getRuleSet, validateDraftGraph } from "./rule-sets";

/** A rule set resolved when the job is made: a later draft save or activation does not change a queued job. */
export type ResolvedRuleSet = { label: string; choice: RuleSetChoice; versionId: string | null; draftRevision: number | null; rules: RuleJson[] };
export type StoredReplayParams = { from: number; to: number; filter: { device?: string; zone?: string }; runs: ResolvedRuleSet[] };

export async function resolveRuleSet({ siteId, choice }: { siteId: string; choice: RuleSetChoice }): Promise<ResolvedRuleSet> {
  const db = getDb();
  if (choice.kind === "draft") {
    const { draftGraph, draftRevision } = await getRuleSet({ siteId });
    const problems = (await validateDraftGraph({ siteId, graph: draftGraph })).filter((p) => p.severity === "error");
    if (problems.length) throw new AppError("bad_request", `The draft has ${problems.length} problem${problems.length === 1 ? "" : "s"} to fix on the Canvas before it can be replayed.`, { problems });
    return { label: `Draft (revision ${draftRevision})`, choice, versionId: null, draftRevision, rules: compileGraph(ruleGraphSchema.parse(draftGraph)) };
  }
  let versionId: string | null;
  if (choice.kind === "active") {
    const [set] = await db.select({ activeVersionId: ruleSets.activeVersionId }).from(ruleSets).where(eq(ruleSets.siteId, siteId));
    versionId = set?.activeVersionId ?? null;
    if (!versionId) return { label: "Active rules (none yet)", choice, versionId: null, draftRevision: null, rules: [] };
  } else versionId = choice.versionId;
  const [v] = await db.select({ id: ruleSetVersions.id, number: ruleSetVersions.number, rules: ruleSetVersions.rules }).from(ruleSetVersions).where(and(eq(ruleSetVersions.siteId, siteId), eq(ruleSetVersions.id, versionId)));
  if (!v) throw new AppError("not_found", "No such version of this site's rules.");
  return { label: `${choice.kind === "active" ? "Active: " : ""}version ${v.number}`, choice, versionId: v.id, draftRevision: null, rules: v.rules as RuleJson[] };
}

/** Queues a Replay (one rule set) or a Compare (two); the replay worker runs it. */
export async function createReplayJob({ siteId, userId, request }: { siteId: string; userId: string | null; request: ReplayRequest }): Promise<ReplayJob> {
  const runs: ResolvedRuleSet[] = [];
  for (const choice of request.ruleSets) runs.push(await resolveRuleSet({ siteId, choice }));
  const params: StoredReplayParams = { from: request.from, to: request.to, filter: { device: request.device || undefined, zone: request.zone || undefined }, runs };
  const total = await countEvents({ siteId, filter: { from: request.from, to: request.to } });
  const [job] = await getDb().insert(replayJobs).values({ id: randomUUID(), siteId, createdBy: userId, params, total }).returning();
  return job;
}

/** A job as the console shows it: progress, labels and (when done) the result. */
export type ReplayJobView = Omit<ReplayJob, "params" | "result" | "leaseOwner" | "leaseUntil"> & {
  params: { from: number; to: number; filter: StoredReplayParams["filter"]; runs: { label: string; choice: RuleSetChoice }[] };
  result: ReplayResult | null;
};

function view(job: ReplayJob, withResult: boolean): ReplayJobView {
  const { leaseOwner: _o, leaseUntil: _u, params, result, ...rest } = job;
  const p = params as StoredReplayParams;
  return { ...rest, params: { from: p.from, to: p.to, filter: p.filter, runs: p.runs.map((r) => ({ label: r.label, choice: r.choice })) }, result: withResult ? ((result as ReplayResult | null) ?? null) : null };
}

export async function getReplayJob({ siteId, jobId }: { siteId: string; jobId: string }): Promise<ReplayJobView | undefined> {
  const [job] = await getDb().select().from(replayJobs).where(and(eq(replayJobs.siteId, siteId), eq(replayJobs.id, jobId)));
  return job ? view(job, true) : undefined;
}

export async function listReplayJobs({ siteId, limit = 20 }: { siteId: string; limit?: number }): Promise<ReplayJobView[]> {
  const rows = await getDb()
    .select({
      id: replayJobs.id,
      siteId: replayJobs.siteId,
      createdBy: replayJobs.createdBy,
      status: replayJobs.status,
      params: replayJobs.params,
      processed: replayJobs.processed,
      total: replayJobs.total,
      cancelRequested: replayJobs.cancelRequested,
      error: replayJobs.error,
      result: sql<null>`null`,
      leaseOwner: replayJobs.leaseOwner,
      leaseUntil: replayJobs.leaseUntil,
      createdAt: replayJobs.createdAt,
      startedAt: replayJobs.startedAt,
      finishedAt: replayJobs.finishedAt,
    })
    .from(replayJobs)
    .where(eq(replayJobs.siteId, siteId))
    .orderBy(desc(replayJobs.createdAt))
    .limit(limit);
  return rows.map((r) => view(r as ReplayJob, false));
}

/** Asks a job to stop; a job still queued is cancelled at once. */
export async function cancelReplayJob({ siteId, jobId }: { siteId: string; jobId: string }): Promise<ReplayJobView> {
  const db = getDb();
  const [job] = await db.select({ status: replayJobs.status }).from(replayJobs).where(and(eq(replayJobs.siteId, siteId), eq(replayJobs.id, jobId)));
  if (!job) throw new AppError("not_found", "No such replay.");
  await db
    .update(replayJobs)
    .set({ cancelRequested: true })
    .where(and(eq(replayJobs.id, jobId), or(eq(replayJobs.status, "queued"), eq(replayJobs.status, "running"))));
  await db
    .update(replayJobs)
    .set({ status: "cancelled", finishedAt: new Date() })
    .where(and(eq(replayJobs.id, jobId), eq(replayJobs.status, "queued")));
  return (await getReplayJob({ siteId, jobId }))!;
}

/**
 * Claims the oldest queued job (or one whose worker's lease ran out) for
 * `owner`. The conditional UPDATE is the claim: of two workers racing for one
 * job, only one sees its row come back.
 */
export async function claimReplayJob({ owner, now, leaseMs }: { owner: string; now: number; leaseMs: number }): Promise<ReplayJob | null> {
  const db = getDb();
  const claimable = and(eq(replayJobs.cancelRequested, false), or(eq(replayJobs.status, "queued"), and(eq(replayJobs.status, "running"), lt(replayJobs.leaseUntil, now))));
  const [candidate] = await db.select({ id: replayJobs.id }).from(replayJobs).where(claimable).orderBy(replayJobs.createdAt).limit(1);
  if (!candidate) {
    // A running job whose worker died after a cancel was asked: nobody will finish it, so close it.
    await db
      .update(replayJobs)
      .set({ status: "cancelled", finishedAt: new Date(now), leaseOwner: null, leaseUntil: null })
      .where(and(eq(replayJobs.status, "running"), eq(replayJobs.cancelRequested, true), lt(replayJobs.leaseUntil, now)));
    return null;
  }
  const [job] = await db
    .update(replayJobs)
    .set({ status: "running", leaseOwner: owner, leaseUntil: now + leaseMs, startedAt: new Date(now), processed: 0 })
    .where(and(eq(replayJobs.id, candidate.id), claimable))
    .returning();
  return job ?? null;
}

/** Records progress and renews the lease; says whether to go on (false: cancel asked, or the lease was lost). */
export async function reportReplayProgress({ jobId, owner, processed, now, leaseMs }: { jobId: string; owner: string; processed: number; now: number; leaseMs: number }): Promise<"go" | "cancel" | "lost"> {
  const [row] = await getDb()
    .update(replayJobs)
    .set({ processed, leaseUntil: now + leaseMs })
    .where(and(eq(replayJobs.id, jobId), eq(replayJobs.leaseOwner, owner), eq(replayJobs.status, "running")))
    .returning({ cancel: replayJobs.cancelRequested });
  if (!row) return "lost";
  return row.cancel ? "cancel" : "go";
}

export async function finishReplayJob({ jobId, owner, status, processed, result = null, error = null }: { jobId: string; owner: string; status: "done" | "failed" | "cancelled"; processed: number; result?: ReplayResult | null; error?: string | null }): Promise<boolean> {
  const rows = await getDb()
    .update(replayJobs)
    .set({ status, processed, result, error, finishedAt: new Date(), leaseOwner: null, leaseUntil: null })
    .where(and(eq(replayJobs.id, jobId), eq(replayJobs.leaseOwner, owner), eq(replayJobs.status, "running")))
    .returning({ id: replayJobs.id });
  return rows.length > 0;
}
