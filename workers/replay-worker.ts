/**
 * Replay worker: runs queued Replays and Compares (`replay_jobs`) off the
 * request thread, so a year of events never holds up the console.
 *
 *   npx tsx workers/replay-worker.ts
 *
 * Every ~500 ms it claims the oldest queued job with a lease (30 s, renewed
 * with every progress report), reads the job's window of the Event log in
 * keyset pages on (site, at) — one page in memory at a time — through the
 * replay engine, writes progress about twice a second, and stops when the job
 * is cancelled or its lease is lost (another worker took it over after a
 * stall: the conditional UPDATE on the lease owner means only one of them can
 * finish it). A worker that dies mid-job leaves a lease that runs out; the
 * next claim starts that job again from the beginning.
 *
 * DATABASE_URL (and DATABASE_AUTH_TOKEN) come from lib/env.ts.
 */
import type * as ReplayLog from "@/db/queries/replay-log";
import type * as ReplayQueries from "@/db/queries/replays";
import type { StoredReplayParams } from "@/db/queries/replays";
import { isEntryModule, makeOwnerId, runWorkerMain, workerLog } from "./entry";
import type { WorkerLog } from "./outbox";

export const REPLAY_INTERVAL_MS = 500;
export const REPLAY_LEASE_MS = 30_000;
const PROGRESS_EVERY_MS = 400;

const consoleLog: WorkerLog = workerLog("replay worker");

let queries: Promise<typeof ReplayQueries> | undefined;
const replays = () => (queries ??= import("@/db/queries/replays"));
let logQueries: Promise<typeof ReplayLog> | undefined;
const replayLogQueries = () => (logQueries ??= import("@/db/queries/replay-log"));

export type RunOnceResult = { jobId: string; status: "done" | "failed" | "cancelled" | "lost"; processed: number } | null;

/** Claims one job and runs it to the end (or to a cancel); null when none was waiting. */
export async function runReplayJobOnce({ owner, leaseMs = REPLAY_LEASE_MS, clock = Date.now, log = consoleLog, pageSize, signal }: { owner: string; leaseMs?: number; clock?: () => number; log?: WorkerLog; pageSize?: number; signal?: AbortSignal }): Promise<RunOnceResult> {
  const { claimReplayJob, reportReplayProgress, finishReplayJob } = await replays();
  const { replayLog } = await replayLogQueries();
  const job = await claimReplayJob({ owner, now: clock(), leaseMs });
  if (!job) return null;
  const params = job.params as StoredReplayParams;
  log.info(`job ${job.id} (site ${job.siteId}): ${params.runs.map((r) => r.label).join(" vs ")}, ${job.total} events.`);
  let processed = 0;
  let stop: "cancel" | "lost" | null = null;
  let lastReport = performance.now();
  try {
    const result = await replayLog({
      siteId: job.siteId,
      params,
      pageSize,
      onPage: async (n) => {
        processed = n;
        // Stopping the worker leaves the job to its lease: another worker starts it again once that runs out.
        if (signal?.aborted) {
          stop = "lost";
          return false;
        }
        if (performance.now() - lastReport < PROGRESS_EVERY_MS) return true;
        lastReport = performance.now();
        const answer = await reportReplayProgress({ jobId: job.id, owner, processed: n, now: clock(), leaseMs });
        if (answer === "go") return true;
        stop = answer;
        return false;
      },
    });
    if (stop === "lost") {
      log.error(`job ${job.id}: ${signal?.aborted ? "worker stopping; the job is picked up again when its lease runs out" : "lease lost to another worker"}.`);
      return { jobId: job.id, status: "lost", processed };
    }
    if (!result || stop === "cancel") {
      await finishReplayJob({ jobId: job.id, owner, status: "cancelled", processed });
      log.info(`job ${job.id}: cancelled after ${processed} events.`);
      return { jobId: job.id, status: "cancelled", processed };
    }
    // The last progress check may be up to PROGRESS_EVERY_MS old: a cancel asked meanwhile still wins.
    const last = await reportReplayProgress({ jobId: job.id, owner, processed: result.events, now: clock(), leaseMs });
    if (last === "lost") return { jobId: job.id, status: "lost", processed: result.events };
    const status = last === "cancel" ? "cancelled" : "done";
    await finishReplayJob({ jobId: job.id, owner, status, processed: result.events, result: status === "done" ? result : null });
    log.info(`job ${job.id}: ${status}, ${result.events} events.`);
    return { jobId: job.id, status, processed: result.events };
  } catch (error) {
    const message = error instanceof Error ? error.message : String(error);
    log.error(`job ${job.id} failed: ${error instanceof Error && error.stack ? error.stack : message}`);
    await finishReplayJob({ jobId: job.id, owner, status: "failed", processed, error: "The replay stopped with an error on the server; it has been logged." }).catch(() => undefined);
    return { jobId: job.id, status: "failed", processed };
  }
}

/** The loop: resolves once `signal` is aborted and the job in hand has stopped. */
export async function runReplayWorker({ owner = makeOwnerId(), intervalMs = REPLAY_INTERVAL_MS, signal, log = consoleLog }: { owner?: string; intervalMs?: number; signal?: AbortSignal; log?: WorkerLog } = {}): Promise<void> {
  let failures = 0;
  while (!signal?.aborted) {
    try {
      const ran = await runReplayJobOnce({ owner, log, signal });
      failures = 0;
      if (ran) continue;
    } catch (error) {
      failures++;
      if (failures === 1 || failures % 120 === 0) log.error(`claiming a replay job failed (${failures}× in a row): ${error instanceof Error ? error.message : String(error)}`);
    }
    await new Promise<void>((resolve) => {
      // The listener goes when the pause ends, so a long-running loop does not pile them up on the signal.
      const done = () => {
        clearTimeout(t);
        signal?.removeEventListener("abort", done);
        resolve();
      };
      const t = setTimeout(done, intervalMs);
      signal?.addEventListener("abort", done, { once: true });
    });
  }
}

if (isEntryModule(import.meta.url)) {
  runWorkerMain({
    log: consoleLog,
    inHand: "the page in hand",
    describe: (owner) => `${owner}: running queued replays, lease ${REPLAY_LEASE_MS / 1000} s.`,
    run: (owner, signal) => runReplayWorker({ owner, signal }),
  });
}
