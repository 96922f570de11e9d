/**
 * Notices wait in `notices_outbox` with status "pending" until the notices work
 * delivers them; nothing here delivers or changes a row. The engine worker only
 * says how many are waiting, at most once a minute, so a growing backlog shows
 * in its log without a line every tick.
 */
import { eq, sql } from "drizzle-orm";
import type { Database } from "@/db/client";
import { noticesOutbox } from "@/db/schema";

export type WorkerLog = { info(message: string): void; error(message: string): void };

export async function countPendingNotices(db: Database): Promise<number> {
  const [row] = await db.select({ n: sql<number>`count(*)` }).from(noticesOutbox).where(eq(noticesOutbox.status, "pending"));
  return Number(row?.n ?? 0);
}

export const OUTBOX_REPORT_EVERY_MS = 60_000;

/**
 * Returns a function to call every tick. At most once per `everyMs` it counts
 * pending notices and logs the number when there is something to say (some are
 * pending, or the backlog just emptied). A failed count is logged on the same
 * schedule and never stops the caller.
 */
export function createOutboxReporter({ db, log, everyMs = OUTBOX_REPORT_EVERY_MS, monotonicNow = () => performance.now() }: { db: () => Database; log: WorkerLog; everyMs?: number; monotonicNow?: () => number }) {
  let lastAt: number | null = null;
  let lastCount = 0;
  return async function report(): Promise<void> {
    const t = monotonicNow();
    if (lastAt !== null && t - lastAt < everyMs) return;
    lastAt = t;
    try {
      const count = await countPendingNotices(db());
      if (count > 0) log.info(`outbox: ${count} notice${count === 1 ? "" : "s"} pending, waiting for delivery.`);
      else if (lastCount > 0) log.info("outbox: no notices pending.");
      lastCount = count;
    } catch (error) {
      log.error(`outbox: could not count pending notices: ${error instanceof Error ? error.message : String(error)}`);
    }
  };
}
