/**
 * Notice worker: works `notices_outbox`, which the rule engine fills.
 *
 *   npx tsx workers/notice-worker.ts
 *
 * Every ~500 ms it
 * 1. leases pending outbox rows and hands each on: the recipient (a role or
 *    people) becomes the site's members it means, each with a delivery per
 *    channel after their preferences (kinds, channels, quiet hours); in-app
 *    goes straight into the inbox. The row becomes "handed-on" in the same
 *    transaction, so it is expanded once however many workers run.
 * 2. leases deliveries that are due and sends them: push through web-push
 *    (VAPID, aes128gcm) to every browser the person subscribed, e-mail through
 *    lib/mail. A 404/410 from a push service removes that subscription; a
 *    timeout, 429 or 5xx is retried after 10 s, 30 s, 2 min, 10 min, 30 min and
 *    then given up (lib/notices/delivery-policy.ts). Per person and channel at
 *    most 3 messages a minute go out; what waits is sent as one message with a
 *    count, folding the waiting notices of the same kind into it.
 *
 * Duplicates: the outbox keeps one row per event, rule and recipient; a
 * delivery is unique per row, person and channel; leases keep two workers off
 * the same row; and each push carries a Topic, so a push service replaces an
 * undelivered copy if a send is repeated after an unclear timeout.
 *
 * DATABASE_URL, APP_URL, SMTP_URL and the VAPID settings come from lib/env.ts.
 */
import webpush from "web-push";
import type * as NoticeQueries from "@/db/queries/notices";
import type { DueDelivery, VapidKeys } from "@/db/queries/notices";
import type { PushSubscription } from "@/db/schema";
import { env } from "@/lib/env";
import { sendMail } from "@/lib/mail/send";
import { nextAttemptAt, RATE_LIMIT, rateDecision } from "@/lib/notices/delivery-policy";
import { linkForRole, noticeEmail, pushPayload } from "@/lib/notices/message";
import { isEntryModule, makeOwnerId, runWorkerMain, workerLog } from "./entry";
import type { WorkerLog } from "./outbox";

export const DEFAULT_INTERVAL_MS = 500;
export const DEFAULT_LEASE_MS = 60_000;
export const DEFAULT_PUSH_TIMEOUT_MS = 10_000;
/** How long a push service keeps an undelivered notice (RFC 8030 §5.2): after an hour it is old news. */
const PUSH_TTL_S = 3600;

const consoleLog: WorkerLog = workerLog("notice worker");

let noticeQueries: Promise<typeof NoticeQueries> | undefined;
const queries = () => (noticeQueries ??= import("@/db/queries/notices"));

export type WorkResult = { expanded: number; sent: number; retried: number; failed: number; skipped: number; deferred: number; collapsed: number };

export type WorkOptions = {
  owner: string;
  now: number;
  leaseMs?: number;
  pushTimeoutMs?: number;
  log?: WorkerLog;
  signal?: AbortSignal;
};

type Outcome = Parameters<(typeof NoticeQueries)["finishDelivery"]>[0]["outcome"];

/** One round: hand on what is new in the outbox, then send what is due. */
export async function workNoticesOnce({ owner, now, leaseMs = DEFAULT_LEASE_MS, pushTimeoutMs = DEFAULT_PUSH_TIMEOUT_MS, log = consoleLog, signal }: WorkOptions): Promise<WorkResult> {
  const q = await queries();
  const result: WorkResult = { expanded: 0, sent: 0, retried: 0, failed: 0, skipped: 0, deferred: 0, collapsed: 0 };

  // Everything new is handed on before anything is sent, so a burst is seen whole and folds into one message.
  const rows = [];
  for (let batch = 0; batch < 10; batch++) {
    const claimed = await q.claimOutbox({ owner, now, leaseMs, limit: 50 });
    rows.push(...claimed);
    if (claimed.length < 50) break;
  }
  for (const row of rows) {
    try {
      const done = await q.expandOutboxRow({ row, owner, now });
      if (done) {
        result.expanded++;
        log.info(`notice ${row.id} (${row.kind}, ${row.recipient}): ${done.recipients} recipient${done.recipients === 1 ? "" : "s"}, ${done.deliveries} deliver${done.deliveries === 1 ? "y" : "ies"}, ${done.inbox} in the inbox.`);
      }
    } catch (error) {
      log.error(`notice ${row.id}: handing on failed (its lease runs out and it is tried again): ${messageOf(error)}`);
    }
  }

  const claimedAt = performance.now();
  const due = await q.claimDueDeliveries({ owner, now, leaseMs, limit: 10 });
  let vapid: VapidKeys | null = null;
  for (const delivery of due) {
    const leaseLeft = leaseMs - (performance.now() - claimedAt);
    const isShort = leaseLeft < pushTimeoutMs * 2;
    if (signal?.aborted || isShort || !(await q.isStillHeld({ id: delivery.id, owner }))) {
      // Given back untouched: due again at once, for whoever claims it next.
      await q.finishDelivery({ delivery, owner, outcome: { status: "deferred", until: now } });
      continue;
    }
    try {
      const outcome = await deliver(delivery, { owner, now, pushTimeoutMs, log, vapid: async () => (vapid ??= await q.getVapidKeys()), result });
      await q.finishDelivery({ delivery, owner, outcome });
      if (outcome.status === "sent") result.sent++;
      else if (outcome.status === "retry") result.retried++;
      else if (outcome.status === "failed") result.failed++;
      else if (outcome.status === "skipped") result.skipped++;
      else result.deferred++;
      if (outcome.status === "retry" || outcome.status === "failed") log.error(`delivery ${delivery.id} (${delivery.channel} to ${delivery.userId}), attempt ${delivery.attempts + 1}: ${outcome.reason}${outcome.status === "retry" ? `; next try ${new Date(outcome.at).toISOString()}` : "; given up"}.`);
    } catch (error) {
      // Unexpected (database busy …): leave it pending; the lease runs out and it is tried again.
      log.error(`delivery ${delivery.id}: ${messageOf(error)}`);
    }
  }
  return result;
}

type DeliverContext = { owner: string; now: number; pushTimeoutMs: number; log: WorkerLog; vapid: () => Promise<VapidKeys>; result: WorkResult };

async function deliver(delivery: DueDelivery, ctx: DeliverContext): Promise<Outcome> {
  const q = await queries();
  if (delivery.channel === "in-app") return { status: "sent", now: ctx.now };
  const subscriptions = delivery.channel === "push" ? await q.listUserPushSubscriptions({ userId: delivery.userId }) : [];
  if (delivery.channel === "push" && subscriptions.length === 0) return { status: "skipped", now: ctx.now, reason: "no browser has notices turned on" };

  const rate = rateDecision(await q.recentSendTimes({ userId: delivery.userId, channel: delivery.channel, since: ctx.now - RATE_LIMIT.windowMs }), ctx.now);
  if (!rate.isAllowed) return { status: "deferred", until: rate.retryAt };
  const folded = await q.collapseInto({ delivery, owner: ctx.owner, now: ctx.now });
  ctx.result.collapsed += folded;
  const count = delivery.count + folded;

  const link = linkForRole(delivery.url, delivery.siteId, delivery.role);
  const failedAttempts = delivery.attempts + 1;
  const retryOrFail = (reason: string): Outcome => {
    const at = nextAttemptAt(failedAttempts, ctx.now);
    return at === null ? { status: "failed", now: ctx.now, reason } : { status: "retry", now: ctx.now, reason, at };
  };

  if (delivery.channel === "email") {
    const { APP_URL } = env();
    const mail = noticeEmail({ siteName: delivery.siteName, kind: delivery.kind, text: delivery.text, count, link: new URL(link, APP_URL).href, settingsLink: new URL("/account#notices", APP_URL).href });
    try {
      await sendMail({ to: delivery.email, ...mail });
      return { status: "sent", now: ctx.now };
    } catch (error) {
      const code = (error as { responseCode?: number }).responseCode;
      // A permanent SMTP refusal (5xx) will not change on retry.
      if (typeof code === "number" && code >= 500) return { status: "failed", now: ctx.now, reason: `mail server refused it (${code}): ${messageOf(error)}` };
      return retryOrFail(`mail not sent: ${messageOf(error)}`);
    }
  }

  const payload = JSON.stringify(pushPayload({ siteName: delivery.siteName, kind: delivery.kind, text: delivery.text, url: link, count, at: delivery.at, tag: `notice-${delivery.outboxId}` }));
  const vapid = await ctx.vapid();
  const outcomes = [];
  for (const sub of subscriptions) {
    const outcome = await pushTo(sub, payload, { vapid, topic: `d${delivery.id}`, urgency: delivery.kind === "emergency" ? "high" : "normal", timeoutMs: ctx.pushTimeoutMs });
    outcomes.push(outcome);
    if (outcome.kind === "ok") await q.markPushSubscriptionUsed({ id: sub.id, at: new Date(ctx.now) });
    if (outcome.kind === "gone") {
      await q.removePushSubscriptionById({ id: sub.id });
      ctx.log.info(`push subscription ${sub.id} (${hostOf(sub.endpoint)}) is gone (${outcome.detail}): removed.`);
    }
  }
  if (outcomes.some((o) => o.kind === "ok")) return { status: "sent", now: ctx.now };
  const summary = outcomes.map((o) => o.detail).join("; ");
  if (outcomes.some((o) => o.kind === "transient")) return retryOrFail(`push not accepted: ${summary}`);
  return { status: "failed", now: ctx.now, reason: `push refused: ${summary}` };
}

type PushOutcome = { kind: "ok" | "gone" | "transient" | "refused"; detail: string };

/**
 * One push message to one subscription. web-push builds the request (VAPID
 * JWT, aes128gcm body); fetch sends it, since web-push's own sender speaks
 * HTTPS only and the local push service is plain http on localhost.
 */
export async function pushTo(sub: Pick<PushSubscription, "endpoint" | "p256dh" | "auth">, payload: string, { vapid, topic, urgency, timeoutMs }: { vapid: VapidKeys; topic: string; urgency: "normal" | "high"; timeoutMs: number }): Promise<PushOutcome> {
  const details = webpush.generateRequestDetails({ endpoint: sub.endpoint, keys: { p256dh: sub.p256dh, auth: sub.auth } }, payload, {
    vapidDetails: { subject: vapid.subject, publicKey: vapid.publicKey, privateKey: vapid.privateKey },
    contentEncoding: "aes128gcm",
    TTL: PUSH_TTL_S,
    urgency,
    topic,
  });
  const headers = Object.fromEntries(Object.entries(details.headers).map(([k, v]) => [k, String(v)]));
  let res: Response;
  try {
    res = await fetch(details.endpoint, { method: "POST", headers, body: new Uint8Array(details.body), signal: AbortSignal.timeout(timeoutMs), redirect: "error" });
  } catch (error) {
    const isTimeout = error instanceof Error && (error.name === "TimeoutError" || error.name === "AbortError");
    return { kind: "transient", detail: isTimeout ? `no answer within ${timeoutMs} ms` : `could not reach ${hostOf(sub.endpoint)} (${causeOf(error)})` };
  }
  await res.body?.cancel().catch(() => undefined);
  const detail = `${hostOf(sub.endpoint)} answered ${res.status}`;
  if (res.ok) return { kind: "ok", detail };
  // RFC 8030 §7.3 / common practice: 404 and 410 mean the subscription no longer exists.
  if (res.status === 404 || res.status === 410) return { kind: "gone", detail };
  if (res.status === 429 || res.status >= 500) return { kind: "transient", detail };
  return { kind: "refused", detail };
}

function hostOf(endpoint: string): string {
  try {
    return new URL(endpoint).host;
  } catch {
    return "(bad endpoint)";
  }
}

function causeOf(error: unknown): string {
  const cause = (error as { cause?: { code?: string; message?: string } }).cause;
  return cause?.code ?? cause?.message ?? messageOf(error);
}

function messageOf(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

export type NoticeWorkerOptions = Partial<Omit<WorkOptions, "now">> & { intervalMs?: number; clock?: () => number; onTick?: (result: WorkResult) => void };

/** The worker loop; resolves once `signal` is aborted and the delivery in hand is done. */
export async function runNoticeWorker({ owner = makeOwnerId(), intervalMs = DEFAULT_INTERVAL_MS, clock = Date.now, log = consoleLog, signal, onTick, ...rest }: NoticeWorkerOptions = {}): Promise<void> {
  let failures = 0;
  while (!signal?.aborted) {
    const started = performance.now();
    try {
      // Not inside `onTick?.(…)`: optional chaining would skip the round itself when there is no onTick.
      const result = await workNoticesOnce({ owner, now: clock(), log, signal, ...rest });
      onTick?.(result);
      failures = 0;
    } catch (error) {
      failures++;
      if (failures === 1 || failures % 120 === 0) log.error(`a round failed (${failures}× in a row): ${messageOf(error)}`);
    }
    await new Promise<void>((resolve) => {
      const done = () => {
        clearTimeout(timer);
        signal?.removeEventListener("abort", done);
        resolve();
      };
      const timer = setTimeout(done, Math.max(0, intervalMs - (performance.now() - started)));
      signal?.addEventListener("abort", done, { once: true });
    });
  }
}

if (isEntryModule(import.meta.url)) {
  runWorkerMain({
    log: consoleLog,
    inHand: "the delivery in hand",
    describe: (owner) => `${owner}: working the notice outbox every ${DEFAULT_INTERVAL_MS} ms.`,
    run: (owner, signal) => runNoticeWorker({ owner, signal }),
  });
}
