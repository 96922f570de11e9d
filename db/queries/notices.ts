import { and, desc, eq, gte, inArray, isNotNull, isNull, lt, lte, ne, or, sql } from "drizzle-orm";
import webpush from "web-push";
import { getDb } from "@/db";
import { appSettings, inboxItems, memberships, noticeDeliveries, noticePreferences, noticesOutbox, pushSubscriptions, sites, users } from "@/db/schema";
import { env } from "@/lib/env";
import { AppError } from "@/lib/errors";
import type { Role } from "@/lib/auth/roles";
import { linkForRole } from "@/lib/notices/message";
import { DEFAULT_PREFS, planChannels, type NoticePrefs } from "@/lib/notices/preferences";
import { resolveRecipients } from "@/lib/notices/recipients";
import type { InboxItemJson, PushSubscriptionJson, PushSubscriptionRowJson } from "@/lib/validation/notices";

type Db = ReturnType<typeof getDb>;

// ---------------------------------------------------------------------------
// VAPID keys
// ---------------------------------------------------------------------------

export type VapidKeys = { publicKey: string; privateKey: string; subject: string };
const VAPID_SETTING = "vapid-keys";

/**
 * The server's VAPID key pair (RFC 8292): from the environment when both keys
 * are set, else generated once and kept in app_settings. Two processes racing
 * to create it both read back the one that was stored first.
 */
export async function getVapidKeys(): Promise<VapidKeys> {
  const { VAPID_PUBLIC_KEY, VAPID_PRIVATE_KEY, VAPID_SUBJECT } = env();
  if (VAPID_PUBLIC_KEY && VAPID_PRIVATE_KEY) return { publicKey: VAPID_PUBLIC_KEY, privateKey: VAPID_PRIVATE_KEY, subject: VAPID_SUBJECT };
  const db = getDb();
  const read = async () => {
    const [row] = await db.select({ value: appSettings.value }).from(appSettings).where(eq(appSettings.key, VAPID_SETTING));
    return row?.value as { publicKey: string; privateKey: string } | undefined;
  };
  let stored = await read();
  if (!stored) {
    await db.insert(appSettings).values({ key: VAPID_SETTING, value: webpush.generateVAPIDKeys() }).onConflictDoNothing();
    stored = await read();
  }
  if (!stored) throw new Error("Could not store the VAPID key pair.");
  return { publicKey: stored.publicKey, privateKey: stored.privateKey, subject: VAPID_SUBJECT };
}

// ---------------------------------------------------------------------------
// Push subscriptions (one per browser)
// ---------------------------------------------------------------------------

/**
 * Stores a browser's subscription for this person. The endpoint is unique: a
 * browser that a second person signs in on moves to that person.
 */
export async function savePushSubscription({ userId, subscription, origin, label }: { userId: string; subscription: PushSubscriptionJson; origin: "browser" | "demo"; label: string }): Promise<{ id: string }> {
  const values = { userId, endpoint: subscription.endpoint, p256dh: subscription.keys.p256dh, auth: subscription.keys.auth, origin, label };
  const [row] = await getDb()
    .insert(pushSubscriptions)
    .values({ id: crypto.randomUUID(), ...values })
    .onConflictDoUpdate({ target: pushSubscriptions.endpoint, set: { ...values, lastSuccessAt: null } })
    .returning({ id: pushSubscriptions.id });
  return row;
}

/** Removes this person's subscription for `endpoint`; returns it (null when it was not theirs or not there). */
export async function deletePushSubscription({ userId, endpoint }: { userId: string; endpoint: string }) {
  const [row] = await getDb()
    .delete(pushSubscriptions)
    .where(and(eq(pushSubscriptions.userId, userId), eq(pushSubscriptions.endpoint, endpoint)))
    .returning();
  return row ?? null;
}

export async function listPushSubscriptions({ userId }: { userId: string }): Promise<PushSubscriptionRowJson[]> {
  const rows = await getDb().select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId)).orderBy(desc(pushSubscriptions.createdAt));
  return rows.map((r) => ({ id: r.id, label: r.label, origin: r.origin, host: hostOf(r.endpoint), createdAt: r.createdAt.toISOString(), lastSuccessAt: r.lastSuccessAt?.toISOString() ?? null }));
}

export async function findPushSubscription({ userId, endpoint }: { userId: string; endpoint: string }) {
  const [row] = await getDb()
    .select()
    .from(pushSubscriptions)
    .where(and(eq(pushSubscriptions.userId, userId), eq(pushSubscriptions.endpoint, endpoint)));
  return row ?? null;
}

function hostOf(endpoint: string): string {
  try {
    return new URL(endpoint).host;
  } catch {
    return "";
  }
}

// ---------------------------------------------------------------------------
// Preferences (per person and site)
// ---------------------------------------------------------------------------

export async function getNoticePrefs({ siteId, userId }: { siteId: string; userId: string }): Promise<NoticePrefs> {
  const [row] = await getDb()
    .select()
    .from(noticePreferences)
    .where(and(eq(noticePreferences.siteId, siteId), eq(noticePreferences.userId, userId)));
  return row ? toPrefs(row) : { ...DEFAULT_PREFS, channels: [...DEFAULT_PREFS.channels] };
}

export async function saveNoticePrefs({ siteId, userId, prefs }: { siteId: string; userId: string; prefs: NoticePrefs }): Promise<NoticePrefs> {
  const values = { kinds: prefs.kinds, channels: prefs.channels, quietFrom: prefs.quietFrom, quietTo: prefs.quietTo, updatedAt: new Date() };
  await getDb()
    .insert(noticePreferences)
    .values({ siteId, userId, ...values })
    .onConflictDoUpdate({ target: [noticePreferences.siteId, noticePreferences.userId], set: values });
  return getNoticePrefs({ siteId, userId });
}

function toPrefs(row: typeof noticePreferences.$inferSelect): NoticePrefs {
  return { kinds: (row.kinds as NoticePrefs["kinds"]) ?? null, channels: row.channels as NoticePrefs["channels"], quietFrom: row.quietFrom, quietTo: row.quietTo };
}

// ---------------------------------------------------------------------------
// Inbox
// ---------------------------------------------------------------------------

/** The person's inbox, newest first, on the sites they are still a member of. */
export async function listInbox({ userId, siteId, show = "all", before, limit = 30 }: { userId: string; siteId?: string; show?: "all" | "unread"; before?: number; limit?: number }): Promise<InboxItemJson[]> {
  const rows = await getDb()
    .select({ item: inboxItems, siteName: sites.name })
    .from(inboxItems)
    .innerJoin(memberships, and(eq(memberships.siteId, inboxItems.siteId), eq(memberships.userId, inboxItems.userId)))
    .innerJoin(sites, eq(sites.id, inboxItems.siteId))
    .where(
      and(
        eq(inboxItems.userId, userId),
        siteId ? eq(inboxItems.siteId, siteId) : undefined,
        show === "unread" ? isNull(inboxItems.readAt) : undefined,
        before ? lt(inboxItems.id, before) : undefined,
      ),
    )
    .orderBy(desc(inboxItems.id))
    .limit(limit);
  return rows.map(({ item, siteName }) => ({ id: item.id, siteId: item.siteId, siteName, kind: item.kind, text: item.text, url: item.url, count: item.count, at: item.at, readAt: item.readAt?.toISOString() ?? null }));
}

export async function countUnread({ userId }: { userId: string }): Promise<number> {
  const [row] = await getDb()
    .select({ n: sql<number>`count(*)` })
    .from(inboxItems)
    .innerJoin(memberships, and(eq(memberships.siteId, inboxItems.siteId), eq(memberships.userId, inboxItems.userId)))
    .where(and(eq(inboxItems.userId, userId), isNull(inboxItems.readAt)));
  return Number(row?.n ?? 0);
}

/** Marks items read (only the person's own); returns how many changed. */
export async function markInboxRead({ userId, ids, siteId, now = new Date() }: { userId: string; ids?: number[]; siteId?: string; now?: Date }): Promise<number> {
  const rows = await getDb()
    .update(inboxItems)
    .set({ readAt: now })
    .where(and(eq(inboxItems.userId, userId), isNull(inboxItems.readAt), ids ? inArray(inboxItems.id, ids) : undefined, siteId ? eq(inboxItems.siteId, siteId) : undefined))
    .returning({ id: inboxItems.id });
  return rows.length;
}

// ---------------------------------------------------------------------------
// The outbox, worked by workers/notice-worker.ts
// ---------------------------------------------------------------------------

export type OutboxRow = typeof noticesOutbox.$inferSelect;

/** Leases up to `limit` pending outbox rows to `owner`; a lease left by a crashed worker runs out. */
export async function claimOutbox({ owner, now, leaseMs, limit = 20 }: { owner: string; now: number; leaseMs: number; limit?: number }): Promise<OutboxRow[]> {
  const db = getDb();
  const free = and(eq(noticesOutbox.status, "pending"), or(isNull(noticesOutbox.leaseUntil), lt(noticesOutbox.leaseUntil, now)));
  const due = await db.select({ id: noticesOutbox.id }).from(noticesOutbox).where(free).orderBy(noticesOutbox.id).limit(limit);
  if (!due.length) return [];
  return db
    .update(noticesOutbox)
    .set({ leaseOwner: owner, leaseUntil: now + leaseMs })
    .where(and(inArray(noticesOutbox.id, due.map((d) => d.id)), free))
    .returning();
}

export type Expansion = { recipients: number; deliveries: number; inbox: number };

/**
 * Hands one leased outbox row on: one delivery per person × channel, decided
 * by the people's preferences; in-app goes straight into the inbox. All in one
 * transaction, and only while this owner still holds the row, so a row is
 * expanded once however many workers run.
 */
export async function expandOutboxRow({ row, owner, now }: { row: OutboxRow; owner: string; now: number }): Promise<Expansion | null> {
  const db = getDb();
  const [site] = await db.select({ timeZone: sites.timeZone }).from(sites).where(eq(sites.id, row.siteId));
  const members = await db
    .select({ userId: users.id, email: users.email, role: memberships.role, zoneIds: memberships.zoneIds })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.siteId, row.siteId));
  // The engine notes the zone of the device that set the notice off (null for a clock or a named timer).
  const zoneId = row.zoneId;
  const userIds = site ? resolveRecipients({ recipient: row.recipient, kind: row.kind, zoneId, members }) : [];
  const prefRows = userIds.length ? await db.select().from(noticePreferences).where(and(eq(noticePreferences.siteId, row.siteId), inArray(noticePreferences.userId, userIds))) : [];
  const prefsOf = new Map(prefRows.map((p) => [p.userId, toPrefs(p)]));

  const deliveryRows: (typeof noticeDeliveries.$inferInsert)[] = [];
  const inboxRows: (typeof inboxItems.$inferInsert)[] = [];
  for (const userId of userIds) {
    const plans = planChannels({ kind: row.kind, channels: row.channels, prefs: prefsOf.get(userId) ?? DEFAULT_PREFS, timeZone: site!.timeZone, now });
    for (const plan of plans) {
      const isInApp = plan.channel === "in-app" && plan.status === "pending";
      deliveryRows.push({
        outboxId: row.id,
        userId,
        channel: plan.channel,
        status: isInApp ? "sent" : plan.status,
        attempts: isInApp ? 1 : 0,
        nextAttemptAt: now,
        lastError: plan.reason,
        sentAt: isInApp ? now : null,
      });
      const role = members.find((m) => m.userId === userId)?.role ?? null;
      if (isInApp) inboxRows.push({ userId, siteId: row.siteId, outboxId: row.id, kind: row.kind, text: row.text, url: linkForRole(row.url, row.siteId, role), at: row.at });
    }
  }
  const hasPending = deliveryRows.some((d) => d.status === "pending");

  return db.transaction(async (tx) => {
    const [held] = await tx
      .update(noticesOutbox)
      .set({ status: hasPending ? "handed-on" : "delivered", leaseOwner: null, leaseUntil: null })
      .where(and(eq(noticesOutbox.id, row.id), eq(noticesOutbox.status, "pending"), eq(noticesOutbox.leaseOwner, owner)))
      .returning({ id: noticesOutbox.id });
    if (!held) return null;
    if (deliveryRows.length) await tx.insert(noticeDeliveries).values(deliveryRows).onConflictDoNothing();
    if (inboxRows.length) await tx.insert(inboxItems).values(inboxRows).onConflictDoNothing();
    return { recipients: userIds.length, deliveries: deliveryRows.length, inbox: inboxRows.length };
  });
}

export type DueDelivery = {
  id: number;
  outboxId: number;
  userId: string;
  channel: "push" | "email" | "in-app";
  attempts: number;
  count: number;
  siteId: string;
  siteName: string;
  kind: string;
  text: string;
  url: string | null;
  at: number;
  email: string;
  /** The person's role on the site now (null if they left it since). */
  role: Role | null;
};

const deliveryFree = (now: number) => or(isNull(noticeDeliveries.leaseUntil), lt(noticeDeliveries.leaseUntil, now));

/** Leases up to `limit` deliveries that are due; oldest first. */
export async function claimDueDeliveries({ owner, now, leaseMs, limit = 20 }: { owner: string; now: number; leaseMs: number; limit?: number }): Promise<DueDelivery[]> {
  const db = getDb();
  const due = and(eq(noticeDeliveries.status, "pending"), lte(noticeDeliveries.nextAttemptAt, now), deliveryFree(now));
  const ids = await db.select({ id: noticeDeliveries.id }).from(noticeDeliveries).where(due).orderBy(noticeDeliveries.nextAttemptAt, noticeDeliveries.id).limit(limit);
  if (!ids.length) return [];
  const claimed = await db
    .update(noticeDeliveries)
    .set({ leaseOwner: owner, leaseUntil: now + leaseMs })
    .where(and(inArray(noticeDeliveries.id, ids.map((r) => r.id)), due))
    .returning({ id: noticeDeliveries.id });
  if (!claimed.length) return [];
  return loadDeliveries(claimed.map((c) => c.id));
}

async function loadDeliveries(ids: number[]): Promise<DueDelivery[]> {
  const rows = await getDb()
    .select({
      id: noticeDeliveries.id,
      outboxId: noticeDeliveries.outboxId,
      userId: noticeDeliveries.userId,
      channel: noticeDeliveries.channel,
      attempts: noticeDeliveries.attempts,
      count: noticeDeliveries.count,
      siteId: noticesOutbox.siteId,
      siteName: sites.name,
      kind: noticesOutbox.kind,
      text: noticesOutbox.text,
      url: noticesOutbox.url,
      at: noticesOutbox.at,
      email: users.email,
      role: memberships.role,
    })
    .from(noticeDeliveries)
    .innerJoin(noticesOutbox, eq(noticesOutbox.id, noticeDeliveries.outboxId))
    .innerJoin(sites, eq(sites.id, noticesOutbox.siteId))
    .innerJoin(users, eq(users.id, noticeDeliveries.userId))
    .leftJoin(memberships, and(eq(memberships.siteId, noticesOutbox.siteId), eq(memberships.userId, noticeDeliveries.userId)))
    .where(inArray(noticeDeliveries.id, ids))
    .orderBy(noticeDeliveries.nextAttemptAt, noticeDeliveries.id);
  return rows;
}

/** Whether `owner` still holds the delivery and it is still waiting (a collapse may have taken it meanwhile). */
export async function isStillHeld({ id, owner }: { id: number; owner: string }): Promise<boolean> {
  const [row] = await getDb()
    .select({ id: noticeDeliveries.id })
    .from(noticeDeliveries)
    .where(and(eq(noticeDeliveries.id, id), eq(noticeDeliveries.status, "pending"), eq(noticeDeliveries.leaseOwner, owner)));
  return Boolean(row);
}

/** When this person was last sent something on this channel, since `since` (for the rate limit). */
export async function recentSendTimes({ userId, channel, since }: { userId: string; channel: "push" | "email"; since: number }): Promise<number[]> {
  const rows = await getDb()
    .select({ sentAt: noticeDeliveries.sentAt })
    .from(noticeDeliveries)
    .where(and(eq(noticeDeliveries.userId, userId), eq(noticeDeliveries.channel, channel), eq(noticeDeliveries.status, "sent"), isNotNull(noticeDeliveries.sentAt), gte(noticeDeliveries.sentAt, since)));
  return rows.map((r) => r.sentAt!);
}

/**
 * Folds the person's other waiting deliveries of the same kind, site and
 * channel that are due (and not held by another worker) into this one. They
 * are marked "collapsed"; this one's count grows by as many, so nothing is lost.
 */
export async function collapseInto({ delivery, owner, now }: { delivery: DueDelivery; owner: string; now: number }): Promise<number> {
  const db = getDb();
  return db.transaction(async (tx) => {
    const sameKind = tx
      .select({ id: noticeDeliveries.id })
      .from(noticeDeliveries)
      .innerJoin(noticesOutbox, eq(noticesOutbox.id, noticeDeliveries.outboxId))
      .where(
        and(
          eq(noticeDeliveries.userId, delivery.userId),
          eq(noticeDeliveries.channel, delivery.channel),
          eq(noticeDeliveries.status, "pending"),
          ne(noticeDeliveries.id, delivery.id),
          lte(noticeDeliveries.nextAttemptAt, now),
          or(isNull(noticeDeliveries.leaseUntil), lt(noticeDeliveries.leaseUntil, now), eq(noticeDeliveries.leaseOwner, owner)),
          eq(noticesOutbox.siteId, delivery.siteId),
          eq(noticesOutbox.kind, delivery.kind),
        ),
      );
    const others = await sameKind;
    if (!others.length) return 0;
    const folded = await tx
      .update(noticeDeliveries)
      .set({ status: "collapsed", lastError: `collapsed into delivery ${delivery.id}`, leaseOwner: null, leaseUntil: null })
      .where(and(inArray(noticeDeliveries.id, others.map((o) => o.id)), eq(noticeDeliveries.status, "pending")))
      .returning({ id: noticeDeliveries.id, count: noticeDeliveries.count, outboxId: noticeDeliveries.outboxId });
    const added = folded.reduce((n, f) => n + f.count, 0);
    if (added) await tx.update(noticeDeliveries).set({ count: sql`${noticeDeliveries.count} + ${added}` }).where(eq(noticeDeliveries.id, delivery.id));
    for (const outboxId of new Set(folded.map((f) => f.outboxId))) await settleOutbox(tx, outboxId);
    return added;
  });
}

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** An outbox row whose deliveries are all done becomes "delivered", or "failed" when any delivery failed. */
async function settleOutbox(tx: Db | Tx, outboxId: number): Promise<void> {
  const rows = await tx.select({ status: noticeDeliveries.status }).from(noticeDeliveries).where(eq(noticeDeliveries.outboxId, outboxId));
  if (rows.some((r) => r.status === "pending")) return;
  await tx
    .update(noticesOutbox)
    .set({ status: rows.some((r) => r.status === "failed") ? "failed" : "delivered" })
    .where(and(eq(noticesOutbox.id, outboxId), eq(noticesOutbox.status, "handed-on")));
}

type Outcome =
  | { status: "sent"; now: number }
  | { status: "skipped" | "failed"; now: number; reason: string }
  | { status: "retry"; now: number; reason: string; at: number }
  | { status: "deferred"; until: number };

/** Records what happened to a delivery this owner holds, and settles its outbox row when it was the last. */
export async function finishDelivery({ delivery, owner, outcome }: { delivery: Pick<DueDelivery, "id" | "outboxId">; owner: string; outcome: Outcome }): Promise<boolean> {
  const db = getDb();
  const held = and(eq(noticeDeliveries.id, delivery.id), eq(noticeDeliveries.leaseOwner, owner), eq(noticeDeliveries.status, "pending"));
  const release = { leaseOwner: null, leaseUntil: null };
  const attempt = { attempts: sql`${noticeDeliveries.attempts} + 1` };
  return db.transaction(async (tx) => {
    let rows: { id: number }[];
    switch (outcome.status) {
      case "sent":
        rows = await tx.update(noticeDeliveries).set({ ...release, ...attempt, status: "sent", sentAt: outcome.now, lastError: null }).where(held).returning({ id: noticeDeliveries.id });
        break;
      case "skipped":
        rows = await tx.update(noticeDeliveries).set({ ...release, status: "skipped", lastError: outcome.reason }).where(held).returning({ id: noticeDeliveries.id });
        break;
      case "failed":
        rows = await tx.update(noticeDeliveries).set({ ...release, ...attempt, status: "failed", lastError: outcome.reason }).where(held).returning({ id: noticeDeliveries.id });
        break;
      case "retry":
        rows = await tx.update(noticeDeliveries).set({ ...release, ...attempt, nextAttemptAt: outcome.at, lastError: outcome.reason }).where(held).returning({ id: noticeDeliveries.id });
        break;
      case "deferred":
        rows = await tx.update(noticeDeliveries).set({ ...release, nextAttemptAt: outcome.until }).where(held).returning({ id: noticeDeliveries.id });
        break;
    }
    if (rows.length && outcome.status !== "retry" && outcome.status !== "deferred") await settleOutbox(tx, delivery.outboxId);
    return rows.length > 0;
  });
}

export async function listUserPushSubscriptions({ userId }: { userId: string }) {
  return getDb().select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId));
}

/** A push service said the subscription is gone (404/410, RFC 8030 §7.3): forget it. */
export async function removePushSubscriptionById({ id }: { id: string }): Promise<void> {
  await getDb().delete(pushSubscriptions).where(eq(pushSubscriptions.id, id));
}

export async function markPushSubscriptionUsed({ id, at }: { id: string; at: Date }): Promise<void> {
  await getDb().update(pushSubscriptions).set({ lastSuccessAt: at }).where(eq(pushSubscriptions.id, id));
}

/** Deliveries of one outbox row, for tests and the worker's log. */
export async function listDeliveries({ outboxId }: { outboxId: number }) {
  return getDb().select().from(noticeDeliveries).where(eq(noticeDeliveries.outboxId, outboxId)).orderBy(noticeDeliveries.id);
}

export function assertDemoEndpoint(endpoint: string): void {
  const base = env().PUSH_SERVICE_URL;
  if (!base || !endpoint.startsWith(`${new URL(base).origin}/`)) throw new AppError("bad_request", "That subscription did not come from this console's local push service.");
}
