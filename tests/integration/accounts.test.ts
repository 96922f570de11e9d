import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { POST as forgot } from "@/app/api/auth/forgot-password/route";
import { POST as reset } from "@/app/api/auth/reset-password/route";
import { POST as signInRoute } from "@/app/api/auth/sign-in/route";
import { POST as signOutEverywhere } from "@/app/api/auth/sign-out-everywhere/route";
import { POST as signOutRoute } from "@/app/api/auth/sign-out/route";
import { POST as signUpRoute } from "@/app/api/auth/sign-up/route";
import { POST as acceptRoute } from "@/app/api/invites/accept/route";
import { POST as inviteRoute } from "@/app/api/sites/[siteId]/invites/route";
import { GET as sitesRoute } from "@/app/api/sites/route";
import { getDb } from "@/db";
import { getMembership } from "@/db/queries/members";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { sessions, users } from "@/db/schema";
import { BAD_CREDENTIALS, resetPassword, signIn } from "@/lib/auth/accounts";
import { acceptInvitation } from "@/lib/auth/invitations";
import { listSinkMessages } from "@/lib/mail/sink-client";
import { cookieFrom, params, req, seedDemoSite, TEST_PASSWORD, userWithSession } from "./helpers";

const tokenIn = (text: string) => /token=([A-Za-z0-9_-]{43})/.exec(text)?.[1];

beforeAll(async () => {
  await seedDemoSite();
});

describe("sign up, sign in, sign out", () => {
  it("stores an Argon2id hash with the OWASP parameters and starts a session", async () => {
    const res = await signUpRoute(req("POST", "/api/auth/sign-up", { body: { name: "Ada Sparrow", email: " Ada@Example.Invalid ", password: "a long pass phrase" } }));
    expect(res.status).toBe(201);
    const cookie = cookieFrom(res);
    expect(res.headers.get("set-cookie")).toMatch(/HttpOnly/i);
    expect(res.headers.get("set-cookie")).toMatch(/SameSite=Lax/i);
    const [row] = await getDb().select().from(users).where(eq(users.email, "ada@example.invalid"));
    // Source: OWASP Password Storage Cheat Sheet — Argon2id, m=19456 KiB, t=2, p=1.
    const phc = /^\$argon2id\$v=19\$m=(\d+),t=(\d+),p=(\d+)\$/.exec(row.passwordHash);
    expect(phc?.slice(1).map(Number)).toEqual([19456, 2, 1]);
    expect(row.passwordHash).not.toContain("a long pass phrase");
    const me = await sitesRoute(req("GET", "/api/sites", { cookie }));
    expect(me.status).toBe(200);
  });

  it("refuses a second account for the same e-mail (409, field message)", async () => {
    const res = await signUpRoute(req("POST", "/api/auth/sign-up", { body: { name: "Again", email: "ada@example.invalid", password: "another pass phrase" } }));
    expect(res.status).toBe(409);
    expect((await res.json()).fields.email[0]).toMatch(/already exists/);
  });

  it("answers an unknown e-mail exactly like a wrong password", async () => {
    const wrong = await signInRoute(req("POST", "/api/auth/sign-in", { body: { email: "ada@example.invalid", password: "not the password" } }));
    const unknown = await signInRoute(req("POST", "/api/auth/sign-in", { body: { email: "nobody@example.invalid", password: "not the password" } }));
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(await wrong.json()).toEqual(await unknown.json());
    expect(BAD_CREDENTIALS).toMatch(/do not match/);
  });

  it("signs out: the session stops working", async () => {
    const res = await signInRoute(req("POST", "/api/auth/sign-in", { body: { email: "ada@example.invalid", password: "a long pass phrase" } }));
    expect(res.status).toBe(200);
    const cookie = cookieFrom(res);
    expect((await signOutRoute(req("POST", "/api/auth/sign-out", { cookie }))).status).toBe(200);
    expect((await sitesRoute(req("GET", "/api/sites", { cookie }))).status).toBe(401);
  });

  it("signs out everywhere: every session of the account ends", async () => {
    const a = await userWithSession("everywhere@example.invalid");
    const b = await userWithSession("everywhere@example.invalid");
    expect((await signOutEverywhere(req("POST", "/api/auth/sign-out-everywhere", { cookie: a.cookie }))).status).toBe(200);
    expect((await sitesRoute(req("GET", "/api/sites", { cookie: b.cookie }))).status).toBe(401);
    expect(await getDb().select().from(sessions).where(eq(sessions.userId, a.userId))).toEqual([]);
  });
});

describe("sign-in throttling", () => {
  it("after 5 failures in 15 minutes the account waits, even with the right password", async () => {
    await userWithSession("throttled@example.invalid");
    const t0 = new Date("2026-06-01T10:00:00Z");
    for (let i = 0; i < 5; i++) {
      await expect(signIn({ email: "throttled@example.invalid", password: "wrong", client: `10.0.0.${i}`, now: new Date(t0.getTime() + i * 1000) })).rejects.toMatchObject({ code: "unauthenticated" });
    }
    await expect(signIn({ email: "throttled@example.invalid", password: TEST_PASSWORD, client: "10.0.0.99", now: new Date(t0.getTime() + 60_000) })).rejects.toMatchObject({ code: "rate_limited" });
    // 15 minutes after the first failure the window has room again.
    const ok = await signIn({ email: "throttled@example.invalid", password: TEST_PASSWORD, client: "10.0.0.99", now: new Date(t0.getTime() + 15 * 60_000 + 1) });
    expect(ok.cookie).toMatch(/^jp_session=/);
  });

  it("throttles a client address that tries many accounts, with a clear 429", async () => {
    for (let i = 0; i < 5; i++) {
      await signInRoute(req("POST", "/api/auth/sign-in", { body: { email: `spray${i}@example.invalid`, password: "guess" }, headers: { "x-forwarded-for": "192.0.2.77" } }));
    }
    const res = await signInRoute(req("POST", "/api/auth/sign-in", { body: { email: "spray9@example.invalid", password: "guess" }, headers: { "x-forwarded-for": "192.0.2.77" } }));
    expect(res.status).toBe(429);
    const body = await res.json();
    expect(body.message).toMatch(/Too many failed sign-ins\. Wait/);
    expect(body.retryAfterSeconds).toBeGreaterThan(0);
  });
});

describe("password reset by e-mail", () => {
  it("mails a link, sets the new password once, and ends every old session", async () => {
    const old = await userWithSession("forgetful@example.invalid");
    const res = await forgot(req("POST", "/api/auth/forgot-password", { body: { email: "forgetful@example.invalid" } }));
    expect(res.status).toBe(200);
    const [mail] = await listSinkMessages({ to: "forgetful@example.invalid" });
    expect(mail.subject).toMatch(/password/i);
    const token = tokenIn(mail.text)!;
    expect(token).toBeDefined();

    const done = await reset(req("POST", "/api/auth/reset-password", { body: { token, password: "a brand new phrase" } }));
    expect(done.status).toBe(200);
    expect((await sitesRoute(req("GET", "/api/sites", { cookie: old.cookie }))).status).toBe(401);
    expect((await sitesRoute(req("GET", "/api/sites", { cookie: cookieFrom(done) }))).status).toBe(200);

    const again = await reset(req("POST", "/api/auth/reset-password", { body: { token, password: "yet another phrase" } }));
    expect(again.status).toBe(400);
    expect((await signInRoute(req("POST", "/api/auth/sign-in", { body: { email: "forgetful@example.invalid", password: "a brand new phrase" } }))).status).toBe(200);
  });

  it("answers the same for an unknown e-mail and sends nothing", async () => {
    const res = await forgot(req("POST", "/api/auth/forgot-password", { body: { email: "ghost@example.invalid" } }));
    expect(res.status).toBe(200);
    expect(await listSinkMessages({ to: "ghost@example.invalid" })).toEqual([]);
  });

  it("refuses a reset link after its hour", async () => {
    await userWithSession("slow@example.invalid");
    await forgot(req("POST", "/api/auth/forgot-password", { body: { email: "slow@example.invalid" } }));
    const [mail] = await listSinkMessages({ to: "slow@example.invalid" });
    const token = tokenIn(mail.text)!;
    await expect(resetPassword({ token, password: "too late phrase", now: new Date(Date.now() + 61 * 60_000) })).rejects.toMatchObject({ code: "bad_request" });
  });
});

describe("invitations", () => {
  it("invites by e-mail; the new person creates an account and gets the role; the link works once", async () => {
    const integrator = await userWithSession("inv-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" });
    const res = await inviteRoute(req("POST", `/api/sites/${DEMO_SITE_ID}/invites`, { cookie: integrator.cookie, body: { email: "newcomer@example.invalid", role: "occupant", zoneIds: [`${DEMO_SITE_ID}-zone-flat`] } }), params({ siteId: DEMO_SITE_ID }));
    expect(res.status).toBe(201);
    const [mail] = await listSinkMessages({ to: "newcomer@example.invalid" });
    expect(mail.text).toContain("Larch Lane Studio");
    const token = tokenIn(mail.text)!;

    const missing = await acceptRoute(req("POST", "/api/invites/accept", { body: { token } }));
    expect(missing.status).toBe(400);
    expect(Object.keys((await missing.json()).fields).sort()).toEqual(["name", "password"]);

    const ok = await acceptRoute(req("POST", "/api/invites/accept", { body: { token, name: "New Comer", password: "newcomer phrase" } }));
    expect(ok.status).toBe(200);
    const [user] = await getDb().select().from(users).where(eq(users.email, "newcomer@example.invalid"));
    const membership = await getMembership({ siteId: DEMO_SITE_ID, userId: user.id });
    expect(membership?.role).toBe("occupant");
    expect(membership?.zoneIds).toEqual([`${DEMO_SITE_ID}-zone-flat`]);

    const reuse = await acceptRoute(req("POST", "/api/invites/accept", { body: { token, name: "Someone", password: "someone phrase" } }));
    expect(reuse.status).toBe(400);
  });

  it("adds the role to an existing, signed-in account; refuses another account and an expired link", async () => {
    const integrator = await userWithSession("inv2-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" });
    const existing = await userWithSession("existing@example.invalid");
    const other = await userWithSession("someone-else@example.invalid");
    await inviteRoute(req("POST", `/api/sites/${DEMO_SITE_ID}/invites`, { cookie: integrator.cookie, body: { email: "existing@example.invalid", role: "manager" } }), params({ siteId: DEMO_SITE_ID }));
    const token = tokenIn((await listSinkMessages({ to: "existing@example.invalid" }))[0].text)!;

    await expect(acceptInvitation({ token, user: null, now: new Date(Date.now() + 8 * 24 * 3600_000) })).rejects.toMatchObject({ code: "bad_request" });
    const wrongUser = await acceptRoute(req("POST", "/api/invites/accept", { cookie: other.cookie, body: { token } }));
    expect(wrongUser.status).toBe(403);
    const notSignedIn = await acceptRoute(req("POST", "/api/invites/accept", { body: { token } }));
    expect(notSignedIn.status).toBe(401);

    const ok = await acceptRoute(req("POST", "/api/invites/accept", { cookie: existing.cookie, body: { token } }));
    expect(ok.status).toBe(200);
    expect((await getMembership({ siteId: DEMO_SITE_ID, userId: existing.userId }))?.role).toBe("manager");
  });
});
