import { and, asc, eq, gt, inArray, isNull, lt, lte, or } from "drizzle-orm";
import { getDb } from "@/db";
import { serialisedWrite } from "@/db/write-lock";
import { devices, engineStates, engineSteps, events, gatewayCommands, noticesOutbox, ruleSets, ruleSetVersions, scenes, sites, zones } from "@/db/schema";
import { createEngine, type Engine } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import type { DeviceEvent, EngineState, GatewayCommand, Notice, Step } from "@/lib/bus/types";
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
  // Only the compiled rules: the version's graph is for the Canvas, not the engine.
  const [version] = ruleSet?.activeVersionId ? await db.select({ id: ruleSetVersions.id, rules: ruleSetVersions.rules }).from(ruleSetVersions).where(eq(ruleSetVersions.id, ruleSet.activeVersionId)) : [];
  const input = toSiteInput({ site, devices: deviceRows, zones: zoneRows, scenes: sceneRows.map((s) => ({ number: s.number, name: s.name, fadeMs: s.fadeMs, levels: s.levels })) });
  return { input, rules: (version?.rules ?? []) as RuleJson[], versionId: version?.id ?? null, devices: deviceRows };
}

/** An outbox row for one notice; a click on it opens the site's overview. */
function outboxRow(siteId: string, n: Notice) {
  return { siteId, dedupeKey: n.dedupeKey, recipient: n.recipient, channels: n.channels, text: n.text, at: n.at, kind: n.kind, zoneId: n.zoneId, url: `/sites/${siteId}` };
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
    .values({ siteId, eventSeq, at: step.at, versionId, output: outputOf(step) })
    .returning({ seq: engineSteps.seq });
  const commands: (GatewayCommand & { seq: number })[] = [];
  for (const command of step.commands) {
    const [c] = await tx.insert(gatewayCommands).values({ siteId, stepSeq: row.seq, at: command.at, command }).returning({ seq: gatewayCommands.seq });
    commands.push({ ...command, seq: c.seq });
  }
  if (step.notices.length) {
    await tx
      .insert(noticesOutbox)
      .values(step.notices.map((n) => outboxRow(siteId, n)))
      .onConflictDoNothing();
  }
  return { stepSeq: row.seq, commands };
}

/**
 * Runs `work` on the site's live engine inside one write transaction: state,
 * events, steps, commands and notices go in together or not at all, so a crash
 * mid-way loses nothing and applies nothing twice. Writers are serialised by the
 * database's write lock; the revision check guards against a stale read anyway.
 */
async function withLiveEngine<T>(siteId: string, work: (engine: Engine, tx: Tx, versionId: string | null) => Promise<T>): Promise<T> {
  return serialisedWrite(() => runLive(siteId, work));
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

/** Rows per multi-row INSERT: well under SQLite's 32,766 bound variables for the widest table. */
const CHUNK = 200;

async function insertChunked<T, R>(rows: T[], insert: (chunk: T[]) => Promise<R[]>): Promise<R[]> {
  const out: R[] = [];
  for (let i = 0; i < rows.length; i += CHUNK) out.push(...(await insert(rows.slice(i, i + CHUNK))));
  return out;
}

/**
 * Stores new events (ids already seen are skipped) and runs each through the
 * active rules in time order. The engine runs first; then events, steps,
 * commands and notices go in as multi-row INSERTs (a row per statement cost ~70 %
 * of a batch, bench/ingest.ts), all in the one transaction.
 */
export async function ingestEvents({ siteId, batch, source }: { siteId: string; batch: DeviceEvent[]; source: "gateway" | "bench" | "import" | "console" }): Promise<IngestResult> {
  const ordered = [...batch].sort((a, b) => a.at - b.at || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return withLiveEngine(siteId, async (engine, tx, versionId) => {
    const result: IngestResult = { accepted: [], duplicates: [], commands: [] };
    const receivedAt = Date.now();
    const ids = [...new Set(ordered.map((e) => e.id))];
    const seen = new Set<string>();
    for (let i = 0; i < ids.length; i += CHUNK) {
      const rows = await tx.select({ eventId: events.eventId }).from(events).where(and(eq(events.siteId, siteId), inArray(events.eventId, ids.slice(i, i + CHUNK))));
      for (const r of rows) seen.add(r.eventId);
    }
    const fresh: DeviceEvent[] = [];
    for (const event of ordered) {
      if (seen.has(event.id)) result.duplicates.push(event.id);
      else {
        seen.add(event.id);
        fresh.push(event);
      }
    }
    if (!fresh.length) return result;

    const steps: Step[] = [];
    for (const event of fresh) steps.push(await engine.ingest(event));

    const storedEvents = await insertChunked(fresh, (chunk) =>
      tx
        .insert(events)
        .values(chunk.map((e) => ({ siteId, eventId: e.id, at: e.at, device: e.device, kind: e.kind, value: e.value, source, receivedAt })))
        .returning({ seq: events.seq, eventId: events.eventId }),
    );
    const eventSeq = new Map(storedEvents.map((r) => [r.eventId, r.seq]));
    const storedSteps = await insertChunked(
      fresh.map((e, i) => ({ siteId, eventSeq: eventSeq.get(e.id)!, at: steps[i].at, versionId, output: outputOf(steps[i]) })),
      (chunk) => tx.insert(engineSteps).values(chunk).returning({ seq: engineSteps.seq, eventSeq: engineSteps.eventSeq }),
    );
    const stepSeqByEvent = new Map(storedSteps.map((r) => [r.eventSeq!, r.seq]));
    const commandRows = fresh.flatMap((e, i) => steps[i].commands.map((command) => ({ siteId, stepSeq: stepSeqByEvent.get(eventSeq.get(e.id)!)!, at: command.at, command })));
    // RETURNING order is not promised; inside this write transaction the new seqs are
    // consecutive in VALUES order, so sorting them lines them up with commandRows.
    const storedCommands = (await insertChunked(commandRows, (chunk) => tx.insert(gatewayCommands).values(chunk).returning({ seq: gatewayCommands.seq }))).sort((a, b) => a.seq - b.seq);
    const notices = steps.flatMap((st) => st.notices.map((n) => outboxRow(siteId, n)));
    await insertChunked(notices, async (chunk) => {
      await tx.insert(noticesOutbox).values(chunk).onConflictDoNothing();
      return [];
    });

    fresh.forEach((e) => result.accepted.push({ id: e.id, stepSeq: stepSeqByEvent.get(eventSeq.get(e.id)!)! }));
    commandRows.forEach((row, i) => result.commands.push({ ...(row.command as GatewayCommand), seq: storedCommands[i].seq }));
    return result;
  });
}

function outputOf(step: Step) {
  return { changes: step.changes, commands: step.commands, notices: step.notices, trace: step.trace };
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


/**
 * After a new version goes live: let the worker run the site now, so the new
 * rules' schedules are set without waiting for the next device event. A site with
 * no live state yet starts with its first event (so a gateway replaying an
 * earlier day is not refused as late).
 */
export async function wakeSite({ siteId, now }: { siteId: string; now: number }): Promise<void> {
  await getDb().update(engineStates).set({ nextTimerAt: now }).where(eq(engineStates.siteId, siteId));
}
