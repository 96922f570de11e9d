import "server-only";
import { Worker } from "node:worker_threads";
import type { DeviceEvent, Step } from "@/lib/bus/types";
import { env } from "@/lib/env";
import { createReplay } from "@/lib/replay/run";
import type { ReplayResult, StepInput } from "@/lib/replay/types";
import { readLogPages } from "./events";
import { loadEngineInput } from "./live";
import type { StoredReplayParams } from "./replays";

/*
 * Kept apart from db/queries/replays.ts on purpose: route handlers import that
 * one, and only the replay worker (and its tests and bench) runs a replay, so
 * only they load the reader thread below.
 */

/** Pages read ahead of the engine: enough to keep both threads busy, few enough to keep memory flat. */
const PAGES_AHEAD = 3;

type ThreadPage = { kind: "page"; ids: string[]; times: Float64Array; devices: Uint32Array; kinds: Uint32Array; values: DeviceEvent["value"][]; newDevices: string[]; newKinds: string[] };
type ThreadMessage = ThreadPage | { kind: "end" } | { kind: "error"; message: string };

/**
 * The window of the log in time order, a page at a time, read by a worker
 * thread (db/log-reader-thread.mjs) with its own connection while this thread
 * runs the pages before: reading rows and running rules then take turns on two
 * cores instead of one. Same rows and order as readLogPages. The thread starts
 * at once (so it starts while the caller gets ready); leaving the loop early
 * stops it.
 */
export function readLogPagesAhead({ siteId, from, to, pageSize = 2000 }: { siteId: string; from: number; to: number; pageSize?: number }): AsyncGenerator<DeviceEvent[]> & { close(): Promise<void> } {
  const { DATABASE_URL, DATABASE_AUTH_TOKEN } = env();
  // A second connection to an in-memory database would see a different, empty one: read here.
  if (DATABASE_URL.includes(":memory:")) return Object.assign(readLogPages({ siteId, from, to, pageSize }), { close: async () => undefined });
  const worker = new Worker(new URL("../log-reader-thread.mjs", import.meta.url), {
    workerData: { url: DATABASE_URL, authToken: DATABASE_AUTH_TOKEN, siteId, from, to, pageSize, ahead: PAGES_AHEAD },
    // Plain JavaScript: none of this process's loader flags (tsx's would add a third of a second to its start).
    execArgv: [],
  });
  const inbox: ThreadMessage[] = [];
  let wake: (() => void) | null = null;
  let failure: Error | null = null;
  const notify = () => {
    const resolve = wake;
    wake = null;
    resolve?.();
  };
  worker.on("message", (m: ThreadMessage) => {
    inbox.push(m);
    notify();
  });
  worker.on("error", (error) => {
    failure = error;
    notify();
  });
  const exit = new Promise<void>((resolve) =>
    worker.on("exit", (code) => {
      if (code !== 0 && !failure) failure = new Error(`The log reader stopped (exit code ${code}).`);
      notify();
      resolve();
    }),
  );
  // Ask the thread to stop and wait until it has: it finishes the statement in
  // hand, closes its connection and exits by itself. Worker.terminate() would
  // abort the whole process when it lands while the SQLite client is busy (see
  // the note at the end of db/log-reader-thread.mjs).
  let closed = false;
  const stop = async () => {
    closed = true;
    worker.postMessage("stop"); // dropped if it has already exited
    await exit;
  };
  async function* pages(): AsyncGenerator<DeviceEvent[]> {
    const deviceNames: string[] = [];
    const kindNames: string[] = [];
    try {
      while (!closed) {
        while (!inbox.length && !failure) await new Promise<void>((resolve) => (wake = resolve));
        const m = inbox.shift();
        if (!m) throw failure!;
        if (m.kind === "end") return;
        if (m.kind === "error") throw new Error(`Reading the log failed: ${m.message}`);
        worker.postMessage("more");
        deviceNames.push(...m.newDevices);
        kindNames.push(...m.newKinds);
        const page: DeviceEvent[] = new Array(m.ids.length);
        for (let i = 0; i < m.ids.length; i++) page[i] = { id: m.ids[i], siteId, at: m.times[i], device: deviceNames[m.devices[i]], kind: kindNames[m.kinds[i]], value: m.values[i] };
        yield page;
      }
    } finally {
      await stop();
    }
  }
  // close(): for a caller that stops before its first page (a generator not started never reaches its finally).
  return Object.assign(pages(), { close: stop });
}

export type ReplayLogOptions = {
  siteId: string;
  params: StoredReplayParams;
  pageSize?: number;
  /** Called after each page; return false to stop (cancel or lost lease). */
  onPage?: (processed: number) => Promise<boolean>;
  onStep?: (run: number, input: StepInput, step: Step) => void;
};

/**
 * Runs a window of the stored log through the job's rule set(s): keyset pages
 * on (site, at) in time order, read ahead by a worker thread, a few pages in
 * memory at a time. Returns null when stopped early.
 */
export async function replayLog({ siteId, params, pageSize = 2000, onPage, onStep }: ReplayLogOptions): Promise<ReplayResult | null> {
  const pages = readLogPagesAhead({ siteId, from: params.from, to: params.to, pageSize });
  try {
    const loaded = await loadEngineInput(siteId);
    const replay = createReplay({
      input: loaded.input,
      runs: params.runs.map((r) => ({ label: r.label, rules: r.rules })),
      window: { from: params.from, to: params.to },
      filter: params.filter,
      onStep,
    });
    for await (const page of pages) {
      for (const e of page) replay.feed(e);
      if (onPage && !(await onPage(replay.processed))) return null;
    }
    return replay.finish();
  } finally {
    await pages.close();
  }
}
