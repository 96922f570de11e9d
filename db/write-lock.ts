// One write transaction at a time per process. The SQLite driver is synchronous,
// so a second BEGIN IMMEDIATE while the first awaits would spin in the busy
// handler on the main thread; queueing here costs nothing. (A coordination
// primitive, not shared data: other processes are serialised by the database.)
const holder = globalThis as unknown as { joulepathLiveLock?: Promise<unknown> };

/** Runs `work` after every write transaction queued before it in this process. */
export function serialisedWrite<T>(work: () => Promise<T>): Promise<T> {
  const run = (holder.joulepathLiveLock ?? Promise.resolve()).then(work, work);
  holder.joulepathLiveLock = run.catch(() => undefined);
  return run;
}
