import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as getConfig } from "@/app/api/push/config/route";
import { DELETE as deleteSubscription, GET as listSubscriptions, POST as postSubscription } from "@/app/api/push/subscriptions/route";
import { POST as postRead } from "@/app/api/notices/inbox/read/route";
import { GET as getInbox } from "@/app/api/notices/inbox/route";
import { GET as getUnread } from "@/app/api/notices/inbox/unread/route";
import { GET as getPrefs, PUT as putPrefs } from "@/app/api/notices/sites/[siteId]/preferences/route";
import { getDb } from "@/db";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { appSettings, inboxItems, noticesOutbox, pushSubscriptions } from "@/db/schema";
import { params, req, seedDemoSite, userWithSession } from "./helpers";

// RFC 8291 Appendix A's user-agent key and auth secret: a real P-256 point and a 16-octet secret.
const P256DH = "BCVxsr7N_eNgVRqvHtD0zTZsEc6-VV-JvLexhqUzORcxaOzi6-AYWXvTBHm4bjyPjs7Vd8pZGH6SRpkNtoIAiw4";
const AUTH = "BTBZMqHH6r4Tts7J_aSIgg";
const good = (endpoint = "https://push.example.invalid/send/abc123") => ({ subscription: { endpoint, expirationTime: null, keys: { p256dh: P256DH, auth: AUTH } } });

let cookie = "";
let otherCookie = "";
let userId = "";
const countSubs = async () => (await getDb().select().from(pushSubscriptions)).length;

beforeAll(async () => {
  await seedDemoSite();
  const me = await userWithSession("routes-occupant@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant", zoneIds: null });
  cookie = me.cookie;
  userId = me.userId;
  otherCookie = (await userWithSession("routes-other@example.invalid", { siteId: DEMO_SITE_ID, role: "manager" })).cookie;
});

describe("push subscriptions", () => {
  it("refuses a bad subscription object with 400 and the field, and stores nothing", async () => {
    const flipped = Buffer.from(P256DH, "base64url");
    flipped[64] ^= 1; // y no longer matches x: not a point on P-256
    const offCurve = flipped.toString("base64url");
    const bad: [unknown, string][] = [
      [{}, "subscription"],
      [{ subscription: { endpoint: "https://push.example.invalid/x" } }, "subscription.keys"],
      [{ subscription: { endpoint: "not a url", keys: { p256dh: P256DH, auth: AUTH } } }, "subscription.endpoint"],
      [{ subscription: { endpoint: "https://push.example.invalid/x", keys: { p256dh: P256DH.slice(0, 60), auth: AUTH } } }, "subscription.keys.p256dh"],
      [{ subscription: { endpoint: "https://push.example.invalid/x", keys: { p256dh: offCurve, auth: AUTH } } }, "subscription.keys.p256dh"],
      [{ subscription: { endpoint: "https://push.example.invalid/x", keys: { p256dh: P256DH, auth: "short" } } }, "subscription.keys.auth"],
      [{ subscription: { endpoint: "http://push.example.invalid/x", keys: { p256dh: P256DH, auth: AUTH } } }, "subscription.endpoint"],
      [{ ...good("https://push.example.invalid/y"), origin: "demo" }, "subscription.endpoint"],
      [{ ...good(), sneaky: true }, "_"],
    ];
    const before = await countSubs();
    for (const [body, field] of bad) {
      const res = await postSubscription(req("POST", "/api/push/subscriptions", { cookie, body }));
      expect(res.status, JSON.stringify(body)).toBe(400);
      const answer = (await res.json()) as { error: string; fields: Record<string, string[]> };
      expect(answer.error).toBe("bad_request");
      expect(Object.keys(answer.fields), JSON.stringify(body)).toContain(field);
    }
    const notJson = await postSubscription(new Request("http://localhost:3000/api/push/subscriptions", { method: "POST", headers: { cookie, origin: "http://localhost:3000" }, body: "{nope" }));
    expect(notJson.status).toBe(400);
    expect(await countSubs()).toBe(before);
  });

  it("stores a browser's subscription once per endpoint, lists it without the keys, and forgets it", async () => {
    const first = await postSubscription(req("POST", "/api/push/subscriptions", { cookie, body: { ...good(), label: "Phone" } }));
    expect(first.status).toBe(201);
    const again = await postSubscription(req("POST", "/api/push/subscriptions", { cookie, body: { ...good(), label: "Phone again" } }));
    expect(again.status).toBe(201);
    const rows = await getDb().select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId));
    expect(rows).toHaveLength(1);
    expect(rows[0]).toMatchObject({ label: "Phone again", origin: "browser", p256dh: P256DH });
    const listed = (await (await listSubscriptions(req("GET", "/api/push/subscriptions", { cookie }))).json()) as { subscriptions: Record<string, unknown>[] };
    expect(listed.subscriptions).toEqual([expect.objectContaining({ label: "Phone again", host: "push.example.invalid", origin: "browser" })]);
    expect(JSON.stringify(listed)).not.toContain(AUTH);

    // Somebody else cannot remove it.
    expect((await deleteSubscription(req("DELETE", "/api/push/subscriptions", { cookie: otherCookie, body: { endpoint: good().subscription.endpoint } }))).status).toBe(404);
    expect((await deleteSubscription(req("DELETE", "/api/push/subscriptions", { cookie, body: { endpoint: good().subscription.endpoint } }))).status).toBe(200);
    expect(await getDb().select().from(pushSubscriptions).where(eq(pushSubscriptions.userId, userId))).toEqual([]);
  });

  it("hands out one VAPID public key, generated once and kept", async () => {
    const a = (await (await getConfig(req("GET", "/api/push/config", { cookie }))).json()) as { publicKey: string; hasDemoService: boolean };
    const b = (await (await getConfig(req("GET", "/api/push/config", { cookie: otherCookie }))).json()) as { publicKey: string };
    // RFC 8292 §3.2: k is the uncompressed P-256 point, 65 octets → 87 base64url characters starting "B".
    expect(a.publicKey).toMatch(/^B[A-Za-z0-9_-]{86}$/);
    expect(b.publicKey).toBe(a.publicKey);
    expect(a.hasDemoService).toBe(false);
    expect(await getDb().select().from(appSettings).where(eq(appSettings.key, "vapid-keys"))).toHaveLength(1);
  });
});

describe("preferences per person and site", () => {
  const site = () => params({ siteId: DEMO_SITE_ID });
  it("starts from the defaults, refuses half-given quiet hours with the field, and keeps what is saved", async () => {
    const initial = (await (await getPrefs(req("GET", "/x", { cookie }), site())).json()) as { prefs: unknown };
    expect(initial.prefs).toEqual({ kinds: null, channels: ["push", "in-app", "email"], quietFrom: null, quietTo: null });
    const bad = await putPrefs(req("PUT", "/x", { cookie, body: { kinds: null, channels: ["push"], quietFrom: "22:00", quietTo: null } }), site());
    expect(bad.status).toBe(422);
    expect((await bad.json()).fields).toHaveProperty("quietTo");
    const badTime = await putPrefs(req("PUT", "/x", { cookie, body: { kinds: ["visitor", "gossip"], channels: ["pigeon"], quietFrom: "25:00", quietTo: "07:00" } }), site());
    expect(Object.keys((await badTime.json()).fields).sort()).toEqual(["channels.0", "kinds.1", "quietFrom"]);
    const ok = await putPrefs(req("PUT", "/x", { cookie, body: { kinds: ["visitor", "call"], channels: ["push", "in-app"], quietFrom: "22:00", quietTo: "07:00" } }), site());
    expect(ok.status).toBe(200);
    const saved = (await (await getPrefs(req("GET", "/x", { cookie }), site())).json()) as { prefs: unknown };
    expect(saved.prefs).toEqual({ kinds: ["visitor", "call"], channels: ["push", "in-app"], quietFrom: "22:00", quietTo: "07:00" });
    // Another person's preferences are their own.
    expect(((await (await getPrefs(req("GET", "/x", { cookie: otherCookie }), site())).json()) as { prefs: { kinds: unknown } }).prefs.kinds).toBeNull();
  });
});

describe("inbox", () => {
  it("lists newest first, counts unread, and marks only the person's own items read", async () => {
    const [n] = await getDb().insert(noticesOutbox).values({ siteId: DEMO_SITE_ID, dedupeKey: "inbox-test", recipient: "role:occupant", channels: ["in-app"], text: "x", at: 1 }).returning();
    const items = await getDb()
      .insert(inboxItems)
      .values([
        { userId, siteId: DEMO_SITE_ID, outboxId: n.id, kind: "visitor", text: "Someone is on the front path (18:00).", url: "/sites/larch-lane", at: 1000 },
        { userId, siteId: DEMO_SITE_ID, outboxId: null, kind: "door", text: "The back door has been open for 10 minutes (18:40).", url: null, at: 2000 },
      ])
      .returning();
    const unread = async (c = cookie) => ((await (await getUnread(req("GET", "/x", { cookie: c }))).json()) as { count: number }).count;
    expect(await unread()).toBe(2);
    const list = (await (await getInbox(req("GET", "/api/notices/inbox?show=unread", { cookie }))).json()) as { items: { id: number; text: string; siteName: string }[] };
    expect(list.items.map((i) => i.text)).toEqual(["The back door has been open for 10 minutes (18:40).", "Someone is on the front path (18:00)."]);
    expect(list.items[0].siteName).toBe("Larch Lane Studio");
    const older = (await (await getInbox(req("GET", `/api/notices/inbox?before=${list.items[0].id}`, { cookie }))).json()) as { items: { id: number }[] };
    expect(older.items.map((i) => i.id)).toEqual([items[0].id]);
    expect((await getInbox(req("GET", "/api/notices/inbox?limit=1000", { cookie }))).status).toBe(422);

    // Someone else's ids change nothing.
    expect(((await (await postRead(req("POST", "/x", { cookie: otherCookie, body: { ids: [items[0].id] } }))).json()) as { changed: number }).changed).toBe(0);
    expect(((await (await postRead(req("POST", "/x", { cookie, body: { ids: [items[0].id] } }))).json()) as { changed: number }).changed).toBe(1);
    expect(await unread()).toBe(1);
    expect(((await (await postRead(req("POST", "/x", { cookie, body: { all: true } }))).json()) as { changed: number }).changed).toBe(1);
    expect(await unread()).toBe(0);
    expect((await postRead(req("POST", "/x", { cookie, body: { ids: [] } }))).status).toBe(422);
  });
});
