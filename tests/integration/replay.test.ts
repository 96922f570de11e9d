import { and, asc, eq, isNotNull } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import * as replaysRoute from "@/app/api/sites/[siteId]/replays/route";
import * as replayRoute from "@/app/api/sites/[siteId]/replays/[jobId]/route";
import * as cancelRoute from "@/app/api/sites/[siteId]/replays/[jobId]/cancel/route";
import { getDb } from "@/db";
import { ingestEvents } from "@/db/queries/live";
import { readLogPages } from "@/db/queries/events";
import { readLogPagesAhead, replayLog } from "@/db/queries/replay-log";
import { claimReplayJob, finishReplayJob, reportReplayProgress, resolveRuleSet } from "@/db/queries/replays";
import { getRuleSet, saveDraft } from "@/db/queries/rule-sets";
import { engineSteps, events, replayJobs } from "@/db/schema";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import type { Step } from "@/lib/bus/types";
import { demoNightLog, NIGHT, NIGHT_WINDOW } from "@/lib/replay/demo-night";
import type { ReplayResult } from "@/lib/replay/types";
import { runReplayJobOnce } from "@/workers/replay-worker";
import { params, req, seedDemoSite, userWithSession } from "./helpers";

type Handler = (r: Request, c: { params: Promise<Record<string, string>> }) => Promise<Response>;
const h = (f: unknown) => f as Handler;
const site = () => params({ siteId: DEMO_SITE_ID });
const quiet = { info: () => undefined, error: () => undefined };
let cookie = "";

async function queue(body: unknown) {
  const res = await h(replaysRoute.POST)(req("POST", "/x", { cookie, body }), site());
  return { status: res.status, body: await res.json() };
}
async function job(id: string) {
  const res = await h(replayRoute.GET)(req("GET", "/x", { cookie }), params({ siteId: DEMO_SITE_ID, jobId: id }));
  return (await res.json()).job as { status: string; processed: number; total: number; result: ReplayResult | null };
}

beforeAll(async () => {
  await seedDemoSite();
  cookie = (await userWithSession("replay-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" })).cookie;
  // The night arrives live from the gateway, in three batches, through the active version.
  const log = demoNightLog();
  for (const slice of [log.slice(0, 5), log.slice(5, 11), log.slice(11)]) await ingestEvents({ siteId: DEMO_SITE_ID, batch: slice, source: "gateway" });
});

describe("replay of the live log", () => {
  it("with the version that was active reproduces every recorded step exactly (changes, commands with their TIDs, notices, Trace)", async () => {
    const stored = await getDb()
      .select({ eventId: events.eventId, output: engineSteps.output, versionId: engineSteps.versionId })
      .from(engineSteps)
      .innerJoin(events, eq(events.seq, engineSteps.eventSeq))
      .where(and(eq(engineSteps.siteId, DEMO_SITE_ID), isNotNull(engineSteps.eventSeq)))
      .orderBy(asc(engineSteps.seq));
    expect(stored).toHaveLength(demoNightLog().length);
    const { activeVersionId } = await getRuleSet({ siteId: DEMO_SITE_ID });
    expect(new Set(stored.map((s) => s.versionId))).toEqual(new Set([activeVersionId]));

    const replayed = new Map<string, Step>();
    const active = await resolveRuleSet({ siteId: DEMO_SITE_ID, choice: { kind: "active" } });
    const result = await replayLog({
      siteId: DEMO_SITE_ID,
      params: { from: NIGHT_WINDOW.from, to: NIGHT_WINDOW.to, filter: {}, runs: [active] },
      pageSize: 4,
      onStep: (_, input, step) => replayed.set(input.key, step),
    });
    expect(result!.events).toBe(stored.length);
    for (const s of stored) {
      const step = replayed.get(s.eventId)!;
      expect({ changes: step.changes, commands: step.commands, notices: step.notices, trace: step.trace }, s.eventId).toEqual(s.output);
    }
    // Not vacuous: the night did light things and send commands.
    expect(stored.some((s) => (s.output as Step).commands.length > 0)).toBe(true);
  });
});

describe("the reader thread", () => {
  it("hands over the same events, in the same order, as reading them here, across page boundaries and for every kind of value", async () => {
    // A second site with values of every shape a log holds, a few at the same instant (ordered by seq).
    const at0 = Date.UTC(2024, 0, 1);
    const values: unknown[] = [0, -0, 12.5, 1e21, 300, -40.25, true, false, null, "open", "closed", "-", "1e3", "0x10", " 7", { a: [1, "é\"\\"] }];
    const batch = values.map((value, i) => ({ id: `shape-${i}`, siteId: DEMO_SITE_ID, at: at0 + Math.floor(i / 3) * 1000, device: "larch-lane-dev-lux-window", kind: "light-level", value: value as number }));
    const db = getDb();
    await db.insert(events).values(batch.map((e) => ({ siteId: DEMO_SITE_ID, eventId: e.id, at: e.at, device: e.device, kind: e.kind, value: e.value, source: "import" as const, receivedAt: 0 })));
    const window = { siteId: DEMO_SITE_ID, from: at0, to: at0 + 3_600_000, pageSize: 4 };
    const here: unknown[] = [];
    for await (const page of readLogPages(window)) for (const { seq: _seq, ...e } of page) here.push(e);
    const ahead: unknown[] = [];
    let pages = 0;
    for await (const page of readLogPagesAhead(window)) {
      pages++;
      ahead.push(...page);
    }
    expect(pages).toBe(Math.ceil(values.length / 4));
    expect(ahead).toEqual(here);
    expect(ahead.map((e) => (e as { value: unknown }).value)).toEqual(values.map((v) => (Object.is(v, -0) ? 0 : v)));
    await db.delete(events).where(and(eq(events.siteId, DEMO_SITE_ID), eq(events.source, "import")));
  });

  it("stops when the reader leaves the loop early", async () => {
    const pages = readLogPagesAhead({ siteId: DEMO_SITE_ID, from: NIGHT_WINDOW.from, to: NIGHT_WINDOW.to, pageSize: 2 });
    for await (const page of pages) {
      expect(page.length).toBe(2);
      break;
    }
    // Closing again is harmless, and a closed reader hands over nothing more.
    await pages.close();
    expect((await pages.next()).done).toBe(true);
  });

  it("stops cleanly however early it is asked, while its connection is busy, time after time", async () => {
    // Stopping the thread by force while its SQLite client was mid-statement
    // aborted the whole process now and then; asked to stop, it finishes on its own.
    for (let round = 0; round < 12; round++) {
      const pages = readLogPagesAhead({ siteId: DEMO_SITE_ID, from: NIGHT_WINDOW.from, to: NIGHT_WINDOW.to, pageSize: 1 });
      if (round % 3 === 1) await new Promise((resolve) => setTimeout(resolve, round));
      if (round % 3 === 2) await pages.next();
      await pages.close();
      expect((await pages.next()).done).toBe(true);
    }
  });
});

describe("replay jobs", () => {
  it("a Compare of the active rules with a fixed draft shows the 03:12 event, and nothing else decides differently", async () => {
    const { draftGraph, draftRevision } = await getRuleSet({ siteId: DEMO_SITE_ID });
    const g = structuredClone(draftGraph) as { nodes: unknown[]; edges: { id: string; source: string; target: string }[] };
    g.nodes.push({ id: "g-path-waking-hours", kind: "gate", type: "time-window", params: { from: { kind: "fixed", time: "06:00" }, to: { kind: "fixed", time: "23:00" } } });
    g.edges = g.edges.filter((e) => !(e.source === "g-path-dark" && e.target === "a-path-on"));
    g.edges.push({ id: "fix-1", source: "g-path-dark", target: "g-path-waking-hours" }, { id: "fix-2", source: "g-path-waking-hours", target: "a-path-on" });
    await saveDraft({ siteId: DEMO_SITE_ID, graph: g, expectedRevision: draftRevision, userId: null });

    const { status, body } = await queue({ from: NIGHT_WINDOW.from, to: NIGHT_WINDOW.to, ruleSets: [{ kind: "active" }, { kind: "draft" }] });
    expect(status).toBe(201);
    expect(body.job).toMatchObject({ status: "queued", total: demoNightLog().length });
    expect((await job(body.job.id)).status).toBe("queued");

    const ran = await runReplayJobOnce({ owner: "test-worker", log: quiet, pageSize: 3 });
    expect(ran).toMatchObject({ jobId: body.job.id, status: "done", processed: demoNightLog().length });
    const done = await job(body.job.id);
    expect(done).toMatchObject({ status: "done", processed: demoNightLog().length });
    const compare = done.result!.compare!;
    expect(compare.differences.filter((d) => !d.isKnockOn).map((d) => d.key)).toEqual([NIGHT.falseTriggerId]);
    expect(done.result!.runs.map((r) => r.label)).toEqual(["Active: version 1", `Draft (revision ${draftRevision + 1})`]);
  });

  it("a queued job is cancelled at once; a running one stops at its next progress report", async () => {
    const a = await queue({ from: NIGHT_WINDOW.from, to: NIGHT_WINDOW.to, ruleSets: [{ kind: "active" }] });
    const cancelled = await h(cancelRoute.POST)(req("POST", "/x", { cookie }), params({ siteId: DEMO_SITE_ID, jobId: a.body.job.id }));
    expect((await cancelled.json()).job.status).toBe("cancelled");
    expect(await runReplayJobOnce({ owner: "test-worker", log: quiet })).toBeNull();

    const b = await queue({ from: NIGHT_WINDOW.from, to: NIGHT_WINDOW.to, ruleSets: [{ kind: "active" }] });
    const now = Date.now();
    const claimed = await claimReplayJob({ owner: "w1", now, leaseMs: 30_000 });
    expect(claimed?.id).toBe(b.body.job.id);
    await h(cancelRoute.POST)(req("POST", "/x", { cookie }), params({ siteId: DEMO_SITE_ID, jobId: b.body.job.id }));
    expect(await reportReplayProgress({ jobId: b.body.job.id, owner: "w1", processed: 3, now, leaseMs: 30_000 })).toBe("cancel");
    expect(await finishReplayJob({ jobId: b.body.job.id, owner: "w1", status: "cancelled", processed: 3 })).toBe(true);
    expect((await job(b.body.job.id)).status).toBe("cancelled");
  });

  it("a lease keeps a second worker off a job; once it runs out the job is taken over and the first worker can no longer finish it", async () => {
    const c = await queue({ from: NIGHT_WINDOW.from, to: NIGHT_WINDOW.to, ruleSets: [{ kind: "active" }] });
    const now = Date.now();
    expect((await claimReplayJob({ owner: "w1", now, leaseMs: 1000 }))?.id).toBe(c.body.job.id);
    expect(await claimReplayJob({ owner: "w2", now: now + 500, leaseMs: 1000 })).toBeNull();
    expect((await claimReplayJob({ owner: "w2", now: now + 2000, leaseMs: 30_000 }))?.id).toBe(c.body.job.id);
    expect(await reportReplayProgress({ jobId: c.body.job.id, owner: "w1", processed: 1, now: now + 2100, leaseMs: 1000 })).toBe("lost");
    expect(await finishReplayJob({ jobId: c.body.job.id, owner: "w1", status: "done", processed: 1 })).toBe(false);
    expect(await finishReplayJob({ jobId: c.body.job.id, owner: "w2", status: "done", processed: 16 })).toBe(true);
    const [row] = await getDb().select({ status: replayJobs.status, leaseOwner: replayJobs.leaseOwner }).from(replayJobs).where(eq(replayJobs.id, c.body.job.id));
    expect(row).toEqual({ status: "done", leaseOwner: null });
  });

  it("refuses a bad request with field messages, a draft with problems with the problems, another site's version with 404", async () => {
    const bad = await queue({ from: 10, to: 5, ruleSets: [] });
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.fields).sort()).toEqual(["ruleSets", "to"]);
    const missing = await queue({ from: 1, to: 5, ruleSets: [{ kind: "version", versionId: "not-here" }] });
    expect(missing.status).toBe(404);
    const { draftRevision } = await getRuleSet({ siteId: DEMO_SITE_ID });
    await saveDraft({ siteId: DEMO_SITE_ID, graph: { nodes: [{ id: "a", kind: "action", type: "relay-on", params: { device: "larch-lane-dev-gone" } }], edges: [] }, expectedRevision: draftRevision, userId: null });
    const draft = await queue({ from: 1, to: 5, ruleSets: [{ kind: "draft" }] });
    expect(draft.status).toBe(400);
    expect(draft.body.message).toMatch(/problem/);
    expect(draft.body.problems.length).toBeGreaterThan(0);
  });

  it("lists the site's jobs newest first, without their results", async () => {
    const res = await h(replaysRoute.GET)(req("GET", "/x", { cookie }), site());
    const { jobs } = await res.json();
    expect(jobs.length).toBeGreaterThanOrEqual(4);
    expect(jobs.every((j: { result: unknown }) => j.result === null)).toBe(true);
  });
});
