/**
 * Engine timer worker: fires the rule engine's timers (vacancy, left-open,
 * schedules, hold ends …) when they fall due, with no event to carry them.
 *
 *   npx tsx workers/engine-worker.ts
 *
 * Every ~500 ms it claims the sites whose earliest timer is due
 * (`claimDueSites`, a lease of 15 s under a unique owner id), advances each
 * one to the present (`advanceSite`) one after the other, and releases it.
 * Nothing is kept in memory between ticks: the state, timers and outputs live
 * in the database, so a crash loses nothing and a restart carries on.
 *
 * Several instances may run at once. The lease keeps two of them off the same
 * site; if a lease runs out under a slow worker anyway, the store's write
 * transaction and revision check make the second advance find the timers
 * already fired, so nothing fires twice. A failed advance is logged, releases
 * its lease, and the site is retried with a growing pause. SIGTERM or SIGINT
 * stops the worker after the site in hand (a second one stops it at once).
 *
 * DATABASE_URL (and DATABASE_AUTH_TOKEN) come from lib/env.ts.
 */
import type * as LiveQueries from "@/db/queries/live";
import type { Database } from "@/db/client";
import { allowServerOnly, isEntryModule, makeOwnerId, messageOf, runWorkerMain, workerLog } from "./entry";
import { createOutboxReporter, type WorkerLog } from "./outbox";

export { allowServerOnly, makeOwnerId };

export type { WorkerLog } from "./outbox";

export const DEFAULT_INTERVAL_MS = 500;
export const DEFAULT_LEASE_MS = 15_000;
/** A site is not started when less than this is left of the tick's lease: it waits for a fresh claim. */
const LEASE_MARGIN_MS = 2_000;
/** Pause before retrying a site whose advance failed: doubles per failure, from 1 s up to 5 min. */
const RETRY_FIRST_MS = 1_000;
const RETRY_MAX_MS = 5 * 60_000;

const consoleLog: WorkerLog = workerLog("engine worker");

// db/queries/live.ts reaches the database through db/index.ts, which imports
// "server-only". Loaded on first use, so that the entry below can first let a
// plain Node process import it (see allowServerOnly); tests alias the package.
let liveQueries: Promise<typeof LiveQueries> | undefined;
const live = () => (liveQueries ??= import("@/db/queries/live"));
const database = async (): Promise<Database> => (await import("@/db")).getDb();

export type AdvancedSite = { siteId: string; stepSeq: number | null; commands: number };
export type FireResult = {
  /** Sites this owner claimed this round. */
  claimed: string[];
  /** Sites advanced to `now`; stepSeq is null when there was nothing left to fire (another worker was first). */
  advanced: AdvancedSite[];
  failed: { siteId: string; message: string }[];
  /** Claimed but given back untouched: stopping, lease running short, or waiting to retry. */
  returned: string[];
};

export type FireOptions = {
  /** Lease holder id; unique per worker process. */
  owner: string;
  /** The time timers are fired up to (ms since the epoch). */
  now: number;
  leaseMs?: number;
  /** Stop after the site in hand; the rest of the claim is given back. */
  signal?: AbortSignal;
  /** Sites to give back without advancing this round (the loop's retry pause). */
  skip?: (siteId: string) => boolean;
  log?: WorkerLog;
};

/**
 * One round: claim every site with a timer due at `now`, advance each in turn,
 * release each lease (also after a failure). Throws only when the claim itself
 * fails; per-site failures are logged and reported in `failed`.
 */
export async function fireDueOnce({ owner, now, leaseMs = DEFAULT_LEASE_MS, signal, skip, log = consoleLog }: FireOptions): Promise<FireResult> {
  const { claimDueSites, advanceSite, releaseSite } = await live();
  // The lease is counted from the claim on a monotonic clock, whatever `now` says.
  const claimedAt = performance.now();
  const claimed = await claimDueSites({ owner, now, leaseMs });
  const result: FireResult = { claimed, advanced: [], failed: [], returned: [] };

  const release = async (siteId: string) => {
    try {
      await releaseSite({ siteId, owner });
    } catch (error) {
      log.error(`site ${siteId}: could not release the lease (it lapses by itself within ${leaseMs} ms): ${messageOf(error)}`);
    }
  };

  for (const siteId of claimed) {
    const leaseLeft = leaseMs - (performance.now() - claimedAt);
    if (signal?.aborted || skip?.(siteId) || leaseLeft < Math.min(LEASE_MARGIN_MS, leaseMs / 2)) {
      result.returned.push(siteId);
      await release(siteId);
      continue;
    }
    try {
      const { stepSeq, commands } = await advanceSite({ siteId, to: now });
      result.advanced.push({ siteId, stepSeq, commands: commands.length });
      if (stepSeq !== null) log.info(`site ${siteId}: timers fired up to ${new Date(now).toISOString()} (step ${stepSeq}, ${commands.length} command${commands.length === 1 ? "" : "s"}).`);
    } catch (error) {
      result.failed.push({ siteId, message: messageOf(error) });
      log.error(`site ${siteId}: advancing to ${new Date(now).toISOString()} failed: ${messageOf(error, true)}`);
    } finally {
      await release(siteId);
    }
  }
  return result;
}

export type WorkerOptions = {
  owner?: string;
  intervalMs?: number;
  leaseMs?: number;
  /** Abort to stop: the loop finishes the site in hand, gives back the rest and resolves. */
  signal?: AbortSignal;
  /** Wall clock for firing timers; tests move it by hand. */
  clock?: () => number;
  log?: WorkerLog;
  /** Called after every round, for tests and diagnostics. */
  onTick?: (result: FireResult) => void;
};

/** The worker loop. Resolves once `signal` is aborted and the site in hand is done; a failing round is logged and the loop goes on. */
export async function runEngineWorker({
  owner = makeOwnerId(),
  intervalMs = DEFAULT_INTERVAL_MS,
  leaseMs = DEFAULT_LEASE_MS,
  signal,
  clock = Date.now,
  log = consoleLog,
  onTick,
}: WorkerOptions = {}): Promise<void> {
  const db = await database();
  const reportOutbox = createOutboxReporter({ db: () => db, log });
  // In memory only to space out retries; losing it on restart just retries sooner.
  const retry = new Map<string, { failures: number; at: number }>();
  let claimFailures = 0;

  while (!signal?.aborted) {
    const started = performance.now();
    try {
      const result = await fireDueOnce({ owner, now: clock(), leaseMs, signal, log, skip: (siteId) => (retry.get(siteId)?.at ?? 0) > performance.now() });
      claimFailures = 0;
      for (const { siteId } of result.advanced) retry.delete(siteId);
      for (const { siteId } of result.failed) {
        const failures = (retry.get(siteId)?.failures ?? 0) + 1;
        const pause = Math.min(RETRY_MAX_MS, RETRY_FIRST_MS * 2 ** (failures - 1));
        retry.set(siteId, { failures, at: performance.now() + pause });
        log.error(`site ${siteId}: ${failures} failure${failures === 1 ? "" : "s"} in a row; next try in ${Math.round(pause / 1000)} s.`);
      }
      onTick?.(result);
    } catch (error) {
      // The claim failed (database busy or gone): say so, keep going.
      claimFailures++;
      if (claimFailures === 1 || claimFailures % 120 === 0) log.error(`claiming due sites failed (${claimFailures}× in a row): ${messageOf(error, true)}`);
    }
    if (signal?.aborted) break;
    await reportOutbox();
    await sleep(Math.max(0, intervalMs - (performance.now() - started)), signal);
  }
}

function sleep(ms: number, signal?: AbortSignal): Promise<void> {
  return new Promise((resolve) => {
    if (signal?.aborted) return resolve();
    const done = () => {
      clearTimeout(timer);
      signal?.removeEventListener("abort", done);
      resolve();
    };
    const timer = setTimeout(done, ms);
    signal?.addEventListener("abort", done, { once: true });
  });
}

if (isEntryModule(import.meta.url)) {
  runWorkerMain({
    log: consoleLog,
    inHand: "the site in hand",
    describe: (owner, database) => `${owner} on ${database}: firing due timers every ${DEFAULT_INTERVAL_MS} ms, lease ${DEFAULT_LEASE_MS / 1000} s.`,
    run: (owner, signal) => runEngineWorker({ owner, signal }),
  });
}
