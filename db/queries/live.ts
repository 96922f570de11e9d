import { and, asc, eq, gt, inArray, isNull, lt, lte, or, sql } from "drizzle-orm";
import { getDb } from "@/db";
import { devices, engineStates, engineSteps, events, gatewayCommands, noticesOutbox, ruleSets, ruleSetVersions, scenes, sites, zones } from "@/db/schema";
import { createEngine, type Engine } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import type { DeviceEvent, EngineState, GatewayCommand, Step } from "@/lib/bus/types";
import type { RuleJson } from "@/lib/rules/compile";
import { AppError } from "@/lib/errors";

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

/** The site as the engine sees it, and the active version's rules (none active: no rules). */
export async function loadEngineInput(siteId: string) {
  const db = getDb();
  const [site] = await db.select().from(sites).where(eq(sites.id, siteId));
  if (!site) throw new AppError("not_found", "No such site.");
  const [deviceRows, zoneRows, sceneRows, [ruleSet]] = await Promise.all([
    db.select().from(devices).where(eq(devices.siteId, siteId)),
    db.select().from(zones).where(eq(zones.siteId, siteId)),
    db.select().from(scenes).where(eq(scenes.siteId, siteId)),
    db.select().from(ruleSets).where(eq(ruleSets.siteId, siteId)),
  ]);
  const [version] = ruleSet?.activeVersionId ? await db.select().from(ruleSetVersions).where(eq(ruleSetVersions.id, ruleSet.activeVersionId)) : [];
  const input = toSiteInput({ site, devices: deviceRows, zones: zoneRows, scenes: sceneRows.map((s) => ({ number: s.number, name: s.name, fadeMs: s.fadeMs, levels: s.levels })) });
  return { input, rules: (version?.rules ?? []) as RuleJson[], versionId: version?.id ?? null, devices: deviceRows };
}

function nextDue(state: EngineState): number | null {
  let min: number | null = null;
  for (const t of state.timers.entries) if (min === null || t.due < min) min = t.due;
  return min;
}

/** Stores one step and what it produced; returns the commands with their sequence numbers. */
async function storeStep(tx: Tx, siteId: string, step: Step, eventSeq: number | null, versionId: string | null) {
  const [row] = await tx
    .insert(engineSteps)
    .values({ siteId, eventSeq, at: step.at, versionId, output: { changes: step.changes, commands: step.commands, notices: step.notices, trace: step.trace } })
    .returning({ seq: engineSteps.seq });
  const commands: (GatewayCommand & { seq: number })[] = [];
  for (const command of step.commands) {
    const [c] = await tx.insert(gatewayCommands).values({ siteId, stepSeq: row.seq, at: command.at, command }).returning({ seq: gatewayCommands.seq });
    commands.push({ ...command, seq: c.seq });
  }
  if (step.notices.length) {
    await tx
      .insert(noticesOutbox)
      .values(step.notices.map((n) => ({ siteId, dedupeKey: n.dedupeKey, recipient: n.recipient, channels: n.channels, text: n.text, at: n.at })))
      .onConflictDoNothing();
  }
  return { stepSeq: row.seq, commands };
}

// One write transaction at a time per process. The SQLite driver is synchronous,
// so a second BEGIN IMMEDIATE while the first awaits would spin in the busy
// handler on the main thread; queueing here costs nothing. (A coordination
// primitive, not shared data: other processes are serialised by the database.)
const holder = globalThis as unknown as { joulepathLiveLock?: Promise<unknown> };
function serialised<T>(work: () => Promise<T>): Promise<T> {
  const run = (holder.joulepathLiveLock ?? Promise.resolve()).then(work, work);
  holder.joulepathLiveLock = run.catch(() => undefined);
  return run;
}

/**
 * Runs `work` on the site's live engine inside one write transaction: state,
 * events, steps, commands and notices go in together or not at all, so a crash
 * mid-way loses nothing and applies nothing twice. Writers are serialised by the
 * database's write lock; the revision check guards against a stale read anyway.
 */
async function withLiveEngine<T>(siteId: string, work: (engine: Engine, tx: Tx, versionId: string | null) => Promise<T>): Promise<T> {
  return serialised(() => runLive(siteId, work));
}

async function runLive<T>(siteId: string, work: (engine: Engine, tx: Tx, versionId: string | null) => Promise<T>): Promise<T> {
  const loaded = await loadEngineInput(siteId);
  return getDb().transaction(async (tx) => {
    const [row] = await tx.select().from(engineStates).where(eq(engineStates.siteId, siteId));
    const engine = createEngine({ ...loaded.input, rules: loaded.rules, state: (row?.state as EngineState | undefined) ?? undefined });
    const result = await work(engine, tx, loaded.versionId);
    const state = engine.getState();
    const values = { state, versionId: loaded.versionId, nextTimerAt: nextDue(state), updatedAt: Date.now() };
    if (row) {
      const updated = await tx
        .update(engineStates)
        .set({ ...values, revision: row.revision + 1 })
        .where(and(eq(engineStates.siteId, siteId), eq(engineStates.revision, row.revision)))
        .returning({ siteId: engineStates.siteId });
      if (!updated.length) throw new AppError("conflict", "The site's state changed while this ran; try again.");
    } else {
      await tx.insert(engineStates).values({ siteId, ...values, revision: 1 });
    }
    return result;
  });
}

export type IngestResult = { accepted: { id: string; stepSeq: number }[]; duplicates: string[]; commands: (GatewayCommand & { seq: number })[] };

/** Stores new events (ids already seen are skipped) and runs each through the active rules in time order. */
export async function ingestEvents({ siteId, batch, source }: { siteId: string; batch: DeviceEvent[]; source: "gateway" | "bench" | "import" | "console" }): Promise<IngestResult> {
  const ordered = [...batch].sort((a, b) => a.at - b.at || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return withLiveEngine(siteId, async (engine, tx, versionId) => {
    const result: IngestResult = { accepted: [], duplicates: [], commands: [] };
    const receivedAt = Date.now();
    for (const event of ordered) {
      const [stored] = await tx
        .insert(events)
        .values({ siteId, eventId: event.id, at: event.at, device: event.device, kind: event.kind, value: event.value, source, receivedAt })
        .onConflictDoNothing()
        .returning({ seq: events.seq });
      if (!stored) {
        result.duplicates.push(event.id);
        continue;
      }
      const step = await engine.ingest(event);
      const { stepSeq, commands } = await storeStep(tx, siteId, step, stored.seq, versionId);
      result.accepted.push({ id: event.id, stepSeq });
      result.commands.push(...commands);
    }
    return result;
  });
}

/** Fires every timer due up to `to` (the worker, or a gateway heartbeat). */
export async function advanceSite({ siteId, to }: { siteId: string; to: number }): Promise<{ stepSeq: number | null; commands: (GatewayCommand & { seq: number })[] }> {
  return withLiveEngine(siteId, async (engine, tx, versionId) => {
    const step = await engine.advanceTo(to);
    if (!step.changes.length && !step.commands.length && !step.notices.length && !step.trace.length) return { stepSeq: null, commands: [] };
    return storeStep(tx, siteId, step, null, versionId);
  });
}

export async function listCommandsAfter({ siteId, after, limit = 500 }: { siteId: string; after: number; limit?: number }) {
  return getDb()
    .select({ seq: gatewayCommands.seq, at: gatewayCommands.at, command: gatewayCommands.command })
    .from(gatewayCommands)
    .where(and(eq(gatewayCommands.siteId, siteId), gt(gatewayCommands.seq, after)))
    .orderBy(asc(gatewayCommands.seq))
    .limit(limit);
}

export async function getLiveState({ siteId }: { siteId: string }): Promise<EngineState | null> {
  const [row] = await getDb().select({ state: engineStates.state }).from(engineStates).where(eq(engineStates.siteId, siteId));
  return (row?.state as EngineState | undefined) ?? null;
}

/**
 * Claims sites with a timer due, with a lease so that several workers never fire
 * the same site at once; a lease left by a crashed worker expires.
 */
export async function claimDueSites({ owner, now, leaseMs, limit = 20 }: { owner: string; now: number; leaseMs: number; limit?: number }): Promise<string[]> {
  const db = getDb();
  // A limit, so that with many sites due at once (09:00) several workers share them.
  const due = await db
    .select({ siteId: engineStates.siteId })
    .from(engineStates)
    .where(and(lte(engineStates.nextTimerAt, now), or(isNull(engineStates.leaseUntil), lt(engineStates.leaseUntil, now))))
    .orderBy(asc(engineStates.nextTimerAt))
    .limit(limit);
  if (!due.length) return [];
  const claimed = await db
    .update(engineStates)
    .set({ leaseOwner: owner, leaseUntil: now + leaseMs })
    .where(and(inArray(engineStates.siteId, due.map((d) => d.siteId)), lte(engineStates.nextTimerAt, now), or(isNull(engineStates.leaseUntil), lt(engineStates.leaseUntil, now))))
    .returning({ siteId: engineStates.siteId });
  return claimed.map((c) => c.siteId);
}

export async function releaseSite({ siteId, owner }: { siteId: string; owner: string }): Promise<void> {
  await getDb()
    .update(engineStates)
    .set({ leaseOwner: null, leaseUntil: null })
    .where(and(eq(engineStates.siteId, siteId), eq(engineStates.leaseOwner, owner)));
}

export async function countEvents({ siteId }: { siteId: string }): Promise<number> {
  const [row] = await getDb().select({ n: sql<number>`count(*)` }).from(events).where(eq(events.siteId, siteId));
  return row.n;
}

/**
 * After a new version goes live: let the worker run the site now, so the new
 * rules' schedules are set without waiting for the next device event. A site with
 * no live state yet starts with its first event (so a gateway replaying an
 * earlier day is not refused as late).
 */
export async function wakeSite({ siteId, now }: { siteId: string; now: number }): Promise<void> {
  await getDb().update(engineStates).set({ nextTimerAt: now }).where(eq(engineStates.siteId, siteId));
}
