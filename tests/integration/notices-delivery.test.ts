import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, beforeEach, describe, expect, it } from "vitest";
import { POST as postDemo } from "@/app/api/push/demo/route";
import { POST as postReceive } from "@/app/api/push/demo/receive/route";
import { POST as postSubscription } from "@/app/api/push/subscriptions/route";
import { getDb } from "@/db";
import { runBenchAction } from "@/db/queries/bench";
import { ingestEvents } from "@/db/queries/live";
import { saveNoticePrefs } from "@/db/queries/notices";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { inboxItems, noticeDeliveries, noticesOutbox, pushSubscriptions } from "@/db/schema";
import type { PushPayload } from "@/lib/notices/message";
import type { PushServiceMessage } from "@/lib/push/service-client";
import { createPushServiceState, startPushService, type PushService } from "@/workers/push-service";
import { runNoticeWorker, workNoticesOnce } from "@/workers/notice-worker";
import { req, seedDemoSite, userWithSession } from "./helpers";

// The local push service, in-process on a free port; the app reaches it through PUSH_SERVICE_URL (read on first use).
const service = await startPushService({ port: 0 });
process.env.PUSH_SERVICE_URL = service.url;

const OCCUPANT = "demo-occupant";
const MANAGER = "demo-manager";
const silent = { info: () => undefined, error: () => undefined };
const dev = (key: string) => `${DEMO_SITE_ID}-dev-${key}`;
/** WET wall-clock time on Thursday 2026-06-18 (UTC+1 in summer, EU Directive 2000/84/EC). */
const local = (hh: number, mm = 0) => Date.UTC(2026, 5, 18, hh - 1, mm);

let occupantCookie = "";
/** The worker's clock: moved by hand, five minutes on between tests so the rate limit starts afresh. */
let clock = Date.now();
let seq = 0;

async function messages(base = service.url): Promise<PushServiceMessage[]> {
  return ((await (await fetch(`${base}/messages`)).json()) as { messages: PushServiceMessage[] }).messages;
}
const payloads = async (base?: string) => (await messages(base)).map((m) => m.payload as PushPayload);
const fault = (body: Record<string, unknown>, base = service.url) => fetch(`${base}/faults`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

/** Takes a demo subscription the way the account page does: from the local push service, then registered with the console. */
async function subscribeDemo(cookie: string): Promise<string> {
  const taken = await postDemo(req("POST", "/api/push/demo", { cookie }));
  expect(taken.status).toBe(201);
  const { subscription } = (await taken.json()) as { subscription: { endpoint: string } };
  const stored = await postSubscription(req("POST", "/api/push/subscriptions", { cookie, body: { subscription, origin: "demo", label: "Test browser" } }));
  expect(stored.status).toBe(201);
  return subscription.endpoint;
}

async function addNotice(values: Partial<typeof noticesOutbox.$inferInsert> = {}) {
  const [row] = await getDb()
    .insert(noticesOutbox)
    .values({ siteId: DEMO_SITE_ID, dedupeKey: `test-${++seq}/r/a/person:${OCCUPANT}`, recipient: `person:${OCCUPANT}`, channels: ["push"], text: `Test notice ${seq}.`, at: clock, kind: "call", url: `/sites/${DEMO_SITE_ID}`, ...values })
    .returning();
  return row;
}

const work = (owner = "worker-a", extra: { pushTimeoutMs?: number } = {}) => workNoticesOnce({ owner, now: clock, log: silent, ...extra });
const deliveriesOf = (outboxId: number) => getDb().select().from(noticeDeliveries).where(eq(noticeDeliveries.outboxId, outboxId));
const outboxRow = async (id: number) => (await getDb().select().from(noticesOutbox).where(eq(noticesOutbox.id, id)))[0];

beforeAll(async () => {
  await seedDemoSite();
  occupantCookie = (await userWithSession("occupant@larch-lane.invalid")).cookie;
  await subscribeDemo(occupantCookie);
});

beforeEach(async () => {
  clock += 5 * 60_000;
  await fetch(`${service.url}/messages`, { method: "DELETE" });
  await fetch(`${service.url}/faults`, { method: "DELETE" });
});

afterAll(async () => {
  await service.close();
});

describe("rule → outbox → web-push → local push service → the browser", () => {
  it("tells the demo occupant of a visitor on the front path after closing: one push, one inbox entry", async () => {
    // One batch: the path is still bright at 17:00, then motion at 18:00 after the 17:30 closing (lib/rules/demo-graph.ts).
    await ingestEvents({
      siteId: DEMO_SITE_ID,
      source: "gateway",
      batch: [
        { id: "n-path-lux-1700", siteId: DEMO_SITE_ID, at: local(17), device: dev("sensor-path"), kind: "light-level", value: 180 },
        { id: "n-path-motion-1800", siteId: DEMO_SITE_ID, at: local(18), device: dev("sensor-path"), kind: "motion", value: true },
      ],
    });
    const [notice] = await getDb().select().from(noticesOutbox).where(eq(noticesOutbox.recipient, "role:occupant"));
    expect(notice).toMatchObject({ text: "Someone is on the front path (18:00).", kind: "visitor", status: "pending" });

    const round = await work();
    expect(round).toMatchObject({ expanded: 1, sent: 1 });
    const got = await messages();
    expect(got).toHaveLength(1);
    // What the service decrypted (RFC 8291) under a VAPID JWT for its own origin (RFC 8292 §2).
    expect(got[0].payload).toMatchObject({ title: "Visitor · Larch Lane Studio", body: "Someone is on the front path (18:00).", url: `/sites/${DEMO_SITE_ID}` });
    expect(got[0].vapid.aud).toBe(service.url);
    expect(got[0].ttl).toBe(3600);
    expect(await getDb().select().from(inboxItems).where(eq(inboxItems.outboxId, notice.id))).toEqual([expect.objectContaining({ userId: OCCUPANT, text: "Someone is on the front path (18:00)." })]);
    expect((await outboxRow(notice.id)).status).toBe("delivered");

    // The browser takes it once through the console (the page hands it to its service worker).
    const endpoint = (await getDb().select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, OCCUPANT)))[0].endpoint;
    const take = () => postReceive(req("POST", "/api/push/demo/receive", { cookie: occupantCookie, body: { endpoint } }));
    expect(((await (await take()).json()) as { messages: PushPayload[] }).messages.map((m) => m.body)).toEqual(["Someone is on the front path (18:00)."]);
    expect(((await (await take()).json()) as { messages: unknown[] }).messages).toEqual([]);

    // Nothing more to do; the same event sent again adds no notice.
    expect(await work()).toMatchObject({ expanded: 0, sent: 0 });
    await ingestEvents({ siteId: DEMO_SITE_ID, source: "gateway", batch: [{ id: "n-path-motion-1800", siteId: DEMO_SITE_ID, at: local(18), device: dev("sensor-path"), kind: "motion", value: true }] });
    expect(await work()).toMatchObject({ expanded: 0, sent: 0 });
  });

  it("sends a notice to an occupant of other zones only when it concerns their zones (emergencies reach everyone)", async () => {
    const shop = await userWithSession("shop-occupant@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant", zoneIds: [`${DEMO_SITE_ID}-zone-shop`] });
    await ingestEvents({ siteId: DEMO_SITE_ID, source: "gateway", batch: [{ id: "n-path-motion-1810", siteId: DEMO_SITE_ID, at: local(18, 10), device: dev("sensor-path"), kind: "motion", value: true }] });
    await ingestEvents({ siteId: DEMO_SITE_ID, source: "gateway", batch: [{ id: "n-fire-1815", siteId: DEMO_SITE_ID, at: local(18, 15), device: dev("fire-input"), kind: "fire-alarm", value: "active" }] });
    await work();
    const inboxOf = async (userId: string) => (await getDb().select().from(inboxItems).where(eq(inboxItems.userId, userId))).map((i) => i.text);
    expect(await inboxOf(shop.userId)).toEqual([]);
    expect(await inboxOf(OCCUPANT)).toContain("Someone is on the front path (18:10).");
    // The fire notice to occupants is push-only (demo graph); both occupants have a push delivery for it.
    const [fire] = await getDb().select().from(noticesOutbox).where(and(eq(noticesOutbox.kind, "emergency"), eq(noticesOutbox.recipient, "role:occupant")));
    const fireDeliveries = await deliveriesOf(fire.id);
    expect(fireDeliveries.map((d) => [d.userId, d.channel]).sort()).toEqual([[OCCUPANT, "push"], [shop.userId, "push"]].sort());
    // The shop occupant has no browser subscribed: skipped, with the reason.
    expect(fireDeliveries.find((d) => d.userId === shop.userId)).toMatchObject({ status: "skipped", lastError: "no browser has notices turned on" });
    expect((await payloads()).map((p) => p.body)).toEqual(["Fire-alarm input active at 18:15: leave by the stairs.", "Someone is on the front path (18:10)."]);
  });
});

describe("the Test bench, delivering for real", () => {
  it("a visitor walked up the path after closing reaches the demo occupant, marked as a test", async () => {
    const who = { siteId: DEMO_SITE_ID, userId: MANAGER, person: "Demo facilities manager" };
    await runBenchAction({ ...who, deliverNotices: false, action: { type: "set-date", date: "2026-06-18", time: "18:00" } });
    await runBenchAction({ ...who, deliverNotices: true, action: { type: "walk-past", device: dev("sensor-path") } });
    expect(await work()).toMatchObject({ expanded: 1, sent: 1 });
    // The bench's notice is zoned like a live one: the path zone is one of the demo occupant's.
    expect((await payloads()).map((p) => p.body)).toEqual(["[Test bench] Someone is on the front path (18:00)."]);
    // The bench's link is for managers; the occupant's notice opens the site overview instead.
    expect((await payloads())[0].url).toBe(`/sites/${DEMO_SITE_ID}`);
    const recipients = (await getDb().select().from(inboxItems).where(eq(inboxItems.text, "[Test bench] Someone is on the front path (18:00).")));
    expect(recipients.map((i) => [i.userId, i.url])).toEqual([[OCCUPANT, `/sites/${DEMO_SITE_ID}`]]);
  });
});

describe("the worker loop", () => {
  it("works the outbox on its own until stopped (no onTick needed)", async () => {
    const n = await addNotice({ kind: "energy", text: "Loop test." });
    const controller = new AbortController();
    const loop = runNoticeWorker({ owner: "loop", intervalMs: 50, log: silent, signal: controller.signal, clock: () => clock });
    await expect.poll(async () => (await outboxRow(n.id)).status, { timeout: 5_000 }).toBe("delivered");
    controller.abort();
    await loop;
    expect((await payloads()).map((p) => p.body)).toEqual(["Loop test."]);
  });
});

describe("faults at the push service", () => {
  it("answers 500 twice: retried after 10 s and 30 s, delivered once, nothing lost", async () => {
    await fault({ status: 500, times: 2 });
    const n = await addNotice();
    expect(await work()).toMatchObject({ expanded: 1, retried: 1, sent: 0 });
    const [d1] = await deliveriesOf(n.id);
    expect(d1).toMatchObject({ status: "pending", attempts: 1, nextAttemptAt: clock + 10_000 });
    expect(d1.lastError).toMatch(/answered 500/);
    expect(await work()).toMatchObject({ retried: 0, sent: 0 }); // not due yet
    clock += 10_000;
    expect(await work()).toMatchObject({ retried: 1 });
    expect((await deliveriesOf(n.id))[0]).toMatchObject({ attempts: 2, nextAttemptAt: clock + 30_000 });
    clock += 30_000;
    expect(await work()).toMatchObject({ sent: 1 });
    expect((await deliveriesOf(n.id))[0]).toMatchObject({ status: "sent", attempts: 3 });
    expect((await payloads()).map((p) => p.body)).toEqual([n.text]);
    expect((await outboxRow(n.id)).status).toBe("delivered");
  });

  it("does not answer in time: retried, and the stalled attempt left no copy behind", async () => {
    await fault({ stallMs: 1_500, times: 1 });
    const n = await addNotice();
    expect(await work("worker-a", { pushTimeoutMs: 300 })).toMatchObject({ retried: 1 });
    expect((await deliveriesOf(n.id))[0].lastError).toMatch(/no answer within 300 ms/);
    await new Promise((r) => setTimeout(r, 1_400));
    clock += 10_000;
    expect(await work("worker-a", { pushTimeoutMs: 300 })).toMatchObject({ sent: 1 });
    expect((await payloads()).map((p) => p.body)).toEqual([n.text]);
  });

  it("is down: retried until it is back, then delivered once", async () => {
    const state = createPushServiceState();
    let spare: PushService = await startPushService({ port: 0, state });
    const port = spare.port;
    const sub = (await (await fetch(`${spare.url}/subscriptions`, { method: "POST" })).json()) as { endpoint: string; keys: { p256dh: string; auth: string } };
    const manager = await userWithSession("manager@larch-lane.invalid");
    await getDb().insert(pushSubscriptions).values({ id: crypto.randomUUID(), userId: MANAGER, endpoint: sub.endpoint, p256dh: sub.keys.p256dh, auth: sub.keys.auth });
    await spare.close();

    const n = await addNotice({ recipient: "role:manager", dedupeKey: `down-${seq}/r/a/role:manager` });
    expect(await work()).toMatchObject({ retried: 1 });
    expect((await deliveriesOf(n.id))[0].lastError).toMatch(/could not reach 127\.0\.0\.1:\d+ \(ECONNREFUSED\)/);
    spare = await startPushService({ port, state });
    clock += 10_000;
    expect(await work()).toMatchObject({ sent: 1 });
    expect((await payloads(spare.url)).map((p) => p.body)).toEqual([n.text]);
    await spare.close();
    expect(manager.userId).toBe(MANAGER);
    await getDb().delete(pushSubscriptions).where(eq(pushSubscriptions.userId, MANAGER));
  });

  it("keeps failing: given up after 6 attempts, the outbox row marked failed", async () => {
    await fault({ status: 503, times: 6 });
    const n = await addNotice();
    for (const wait of [0, 10_000, 30_000, 120_000, 600_000, 1_800_000]) {
      clock += wait;
      await work();
    }
    expect((await deliveriesOf(n.id))[0]).toMatchObject({ status: "failed", attempts: 6 });
    expect((await outboxRow(n.id)).status).toBe("failed");
    expect(await messages()).toEqual([]);
  });

  it("answers 410 for an unsubscribed browser: the subscription is removed, and 404 likewise", async () => {
    const cookie = (await userWithSession("gone@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant", zoneIds: null })).cookie;
    const endpoint = await subscribeDemo(cookie);
    const userId = (await getDb().select().from(pushSubscriptions).where(eq(pushSubscriptions.endpoint, endpoint)))[0].userId;
    await fetch(`${service.url}/subscriptions/${endpoint.split("/").pop()}`, { method: "DELETE" });
    const n = await addNotice({ recipient: `person:${userId}`, dedupeKey: `gone-${seq}/r/a/person:${userId}` });
    expect(await work()).toMatchObject({ failed: 1 });
    expect((await deliveriesOf(n.id))[0].lastError).toMatch(/answered 410/);
    expect(await getDb().select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId))).toEqual([]);

    // 404: a subscription the service never made.
    await getDb().insert(pushSubscriptions).values({ id: crypto.randomUUID(), userId, endpoint: `${service.url}/push/${crypto.randomUUID()}`, p256dh: "BCVxsr7N_eNgVRqvHtD0zTZsEc6-VV-JvLexhqUzORcxaOzi6-AYWXvTBHm4bjyPjs7Vd8pZGH6SRpkNtoIAiw4", auth: "BTBZMqHH6r4Tts7J_aSIgg" });
    const m = await addNotice({ recipient: `person:${userId}`, dedupeKey: `gone-${seq}/r/a/person:${userId}` });
    await work();
    expect((await deliveriesOf(m.id))[0].lastError).toMatch(/answered 404/);
    expect(await getDb().select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId))).toEqual([]);
  });
});

describe("duplicates, bursts and quiet hours", () => {
  it("two workers at once send a notice once", async () => {
    // Three kinds, so that none folds into another.
    const batch = await Promise.all((["call", "door", "care"] as const).map((kind) => addNotice({ kind })));
    const [a, b] = await Promise.all([work("worker-a"), work("worker-b")]);
    expect(a.expanded + b.expanded).toBe(3);
    expect(a.sent + b.sent).toBe(3);
    const bodies = (await payloads()).map((p) => p.body).sort();
    expect(bodies).toEqual(batch.map((n) => n.text).sort());
    expect(await getDb().select().from(noticeDeliveries).where(eq(noticeDeliveries.outboxId, batch[0].id))).toHaveLength(1);
  });

  it("folds 50 motion notices in a minute into one push that says how many", async () => {
    const burst = [];
    for (let i = 0; i < 50; i++) burst.push(await addNotice({ kind: "visitor", text: `Motion on the path ${i}.`, at: clock + i * 1000 }));
    const round = await work();
    expect(round).toMatchObject({ expanded: 50, sent: 1, collapsed: 49 });
    const got = await payloads();
    expect(got).toHaveLength(1);
    expect(got[0]).toMatchObject({ count: 50 });
    expect(got[0].body).toMatch(/\(\+49 more like it\)$/);
    const statuses = (await Promise.all(burst.map((n) => deliveriesOf(n.id)))).map((d) => d[0].status);
    expect(statuses.filter((s) => s === "sent")).toHaveLength(1);
    expect(statuses.filter((s) => s === "collapsed")).toHaveLength(49);
    // Every outbox row is settled: nothing left pending.
    expect(new Set((await Promise.all(burst.map((n) => outboxRow(n.id)))).map((r) => r.status))).toEqual(new Set(["delivered"]));
  });

  it("lets 3 pushes a minute through one at a time, and sends what waits after that as one", async () => {
    for (let i = 0; i < 10; i++) {
      await addNotice({ kind: "door", text: `Door ${i}.` });
      await work();
      clock += 5_000;
    }
    // At 0, 5 and 10 s: sent; 15–45 s: waiting for the window, due at 60 s.
    expect((await payloads()).map((p) => p.body).reverse()).toEqual(["Door 0.", "Door 1.", "Door 2."]);
    clock += 10_000;
    await work();
    const got = (await payloads()).reverse();
    expect(got).toHaveLength(4);
    expect(got[3]).toMatchObject({ count: 7 });
  });

  it("holds back the push in the occupant's quiet hours but keeps the inbox entry", async () => {
    // Quiet from an hour before to an hour after the worker's clock, on the site's wall clock (WET).
    const hhmm = (ms: number) => new Intl.DateTimeFormat("en-GB", { timeZone: "WET", hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(ms);
    await saveNoticePrefs({ siteId: DEMO_SITE_ID, userId: OCCUPANT, prefs: { kinds: null, channels: ["push", "in-app", "email"], quietFrom: hhmm(clock - 3600_000), quietTo: hhmm(clock + 3600_000) } });
    const n = await addNotice({ kind: "visitor", channels: ["push", "in-app"], text: "Someone is on the front path (quiet)." });
    await work();
    const ds = await deliveriesOf(n.id);
    expect(ds.find((d) => d.channel === "push")).toMatchObject({ status: "skipped" });
    expect(ds.find((d) => d.channel === "push")!.lastError).toMatch(/^quiet hours /);
    expect(await getDb().select().from(inboxItems).where(eq(inboxItems.outboxId, n.id))).toHaveLength(1);
    expect(await messages()).toEqual([]);
    await saveNoticePrefs({ siteId: DEMO_SITE_ID, userId: OCCUPANT, prefs: { kinds: null, channels: ["push", "in-app", "email"], quietFrom: null, quietTo: null } });
  });

  it("sends the e-mail channel through the mail sink", async () => {
    const n = await addNotice({ recipient: "role:manager", dedupeKey: `mail-${seq}/r/a/role:manager`, channels: ["email"], kind: "call", text: "Someone is waiting at the counter (10:15)." });
    expect(await work()).toMatchObject({ sent: 1 });
    const sink = (await (await fetch(`${process.env.MAIL_SINK_API_URL}/messages?to=manager@larch-lane.invalid`)).json()) as { messages: { subject: string; text: string }[] };
    expect(sink.messages[0].subject).toBe("Call button at Larch Lane Studio: Someone is waiting at the counter (10:15).");
    expect(sink.messages[0].text).toContain(`/sites/${DEMO_SITE_ID}`);
    expect((await outboxRow(n.id)).status).toBe("delivered");
  });
});
