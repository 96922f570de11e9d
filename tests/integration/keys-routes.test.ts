import { randomUUID } from "node:crypto";
import { eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import * as keysRoute from "@/app/api/sites/[siteId]/keys/route";
import * as keyRoute from "@/app/api/sites/[siteId]/keys/[keyId]/route";
import { POST as postEvents } from "@/app/api/v1/sites/[siteId]/events/route";
import { MAX_ACTIVE_KEYS, type KeyCreatedResponse, type KeysResponse } from "@/lib/validation/keys";
import { getDb } from "@/db";
import { createApiKey } from "@/db/queries/api-keys";
import { createSite } from "@/db/queries/sites";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { apiKeys } from "@/db/schema";
import { BASE, get, params, req, seedDemoSite, userWithSession } from "./helpers";

type Who = "integrator" | "manager" | "occupant" | "outsider" | "signedOut";
const cookies = {} as Record<Who, string | null>;
let integratorId = "";

const site = (siteId = DEMO_SITE_ID) => params({ siteId });
const keyParams = (keyId: string, siteId = DEMO_SITE_ID) => params({ siteId, keyId });

async function create(name: unknown, cookie = cookies.integrator, siteId = DEMO_SITE_ID) {
  return keysRoute.POST(req("POST", `/api/sites/${siteId}/keys`, { cookie, body: { name } }), site(siteId));
}

async function list(cookie = cookies.integrator): Promise<KeysResponse> {
  const res = await keysRoute.GET(get(`/api/sites/${DEMO_SITE_ID}/keys`, { cookie }), site());
  expect(res.status).toBe(200);
  return (await res.json()) as KeysResponse;
}

function revoke(keyId: string, cookie = cookies.integrator, siteId = DEMO_SITE_ID) {
  return keyRoute.DELETE(req("DELETE", `/api/sites/${siteId}/keys/${keyId}`, { cookie }), keyParams(keyId, siteId));
}

/** One gateway call with the key, as a gateway would make it. */
function gatewayCall(key: string, id: string) {
  const body = { events: [{ id, at: Date.UTC(2026, 5, 18, 9), device: `${DEMO_SITE_ID}-dev-lux-window`, kind: "light-level", value: 300 }] };
  return postEvents(new Request(new URL(`/api/v1/sites/${DEMO_SITE_ID}/events`, BASE), { method: "POST", headers: { authorization: `Bearer ${key}`, "content-type": "application/json" }, body: JSON.stringify(body) }), site());
}

beforeAll(async () => {
  await seedDemoSite();
  const integrator = await userWithSession("keys-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" });
  integratorId = integrator.userId;
  cookies.integrator = integrator.cookie;
  cookies.manager = (await userWithSession("keys-manager@example.invalid", { siteId: DEMO_SITE_ID, role: "manager" })).cookie;
  cookies.occupant = (await userWithSession("keys-occupant@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant" })).cookie;
  cookies.outsider = (await userWithSession("keys-outsider@example.invalid")).cookie;
  cookies.signedOut = null;
});

describe("gateway keys: create, list, revoke", () => {
  it("creates a key, answers it once, and lists only its prefix", async () => {
    const res = await create("  Shop gateway  ");
    expect(res.status).toBe(201);
    expect(res.headers.get("cache-control")).toBe("no-store");
    const body = (await res.json()) as KeyCreatedResponse;
    // 32 random bytes in base64url without padding are 43 characters (RFC 4648 §5).
    expect(body.key).toMatch(/^jpk_[A-Za-z0-9_-]{43}$/);
    expect(body.row).toMatchObject({ name: "Shop gateway", prefix: body.key.slice(0, 10), lastUsedAt: null, revokedAt: null });
    expect(Number.isNaN(Date.parse(body.row.createdAt))).toBe(false);

    const listed = await list();
    expect(listed.keys.map((k) => k.id)).toContain(body.row.id);
    const text = JSON.stringify(listed);
    expect(text).not.toContain(body.key);
    expect(text).not.toMatch(/keyHash|key_hash/);
    expect(Object.keys(listed.keys[0]).sort()).toEqual(["createdAt", "id", "lastUsedAt", "name", "prefix", "revokedAt"]);

    // The key works for the gateway API, and the list then shows when it was last used.
    expect((await gatewayCall(body.key, "k-1")).status).toBe(200);
    expect((await list()).keys.find((k) => k.id === body.row.id)!.lastUsedAt).not.toBeNull();

    const [stored] = await getDb().select().from(apiKeys).where(eq(apiKeys.id, body.row.id));
    expect(stored.createdBy).toBe(integratorId);
    expect(stored.keyHash).not.toContain(body.key.slice(4));
  });

  it("revokes a key: the gateway gets 401 at once, the row stays listed as revoked, a second revoke is 404", async () => {
    const { key, row } = (await (await create("Workshop gateway")).json()) as KeyCreatedResponse;
    expect((await gatewayCall(key, "k-2")).status).toBe(200);
    const res = await revoke(row.id);
    expect(res.status).toBe(200);
    expect((await gatewayCall(key, "k-3")).status).toBe(401);
    expect((await list()).keys.find((k) => k.id === row.id)!.revokedAt).not.toBeNull();
    const again = await revoke(row.id);
    expect(again.status).toBe(404);
    expect((await again.json()).error).toBe("not_found");
  });

  it("answers 404 for an unknown key id or another site's key, and 422 for a malformed key id", async () => {
    expect((await revoke(randomUUID())).status).toBe(404);
    const other = await createSite({ userId: integratorId, name: "Wrenfield Annex", address: "", timeZone: "UTC", latitude: 50, longitude: 0 });
    const { row, key } = await createApiKey({ siteId: other.id, name: "Annex gateway", createdBy: integratorId });
    // The integrator is a member of both sites, but the key id is looked up on the site in the URL only.
    expect((await revoke(row.id)).status).toBe(404);
    expect((await gatewayCall(key, "k-4")).status).toBe(401);
    const bad = await revoke("../../members");
    expect(bad.status).toBe(422);
    expect((await bad.json()).fields).toHaveProperty("keyId");
  });

  it("checks the name with field messages and refuses unknown fields, bad JSON and cross-site requests", async () => {
    for (const [name, message] of [
      ["", "Name the key, e.g. after the gateway it goes in"],
      ["   ", "Name the key, e.g. after the gateway it goes in"],
      ["x".repeat(61), "Use at most 60 characters"],
      [42, "Name the key"],
    ] as const) {
      const res = await create(name);
      expect(res.status, JSON.stringify(name)).toBe(422);
      expect((await res.json()).fields, JSON.stringify(name)).toEqual({ name: [message] });
    }
    const extra = await keysRoute.POST(req("POST", `/api/sites/${DEMO_SITE_ID}/keys`, { cookie: cookies.integrator, body: { name: "ok", siteId: "other" } }), site());
    expect(extra.status).toBe(422);
    const notJson = await keysRoute.POST(new Request(new URL(`/api/sites/${DEMO_SITE_ID}/keys`, BASE), { method: "POST", headers: { cookie: cookies.integrator!, origin: BASE, "content-type": "application/json" }, body: "{name" }), site());
    expect(notJson.status).toBe(400);
    const crossSite = await keysRoute.POST(req("POST", `/api/sites/${DEMO_SITE_ID}/keys`, { cookie: cookies.integrator, body: { name: "ok" }, origin: "http://evil.invalid" }), site());
    expect(crossSite.status).toBe(403);
    const noOrigin = await keyRoute.DELETE(req("DELETE", `/api/sites/${DEMO_SITE_ID}/keys/${randomUUID()}`, { cookie: cookies.integrator, origin: null }), keyParams(randomUUID()));
    expect(noOrigin.status).toBe(403);
  });

  it(`allows at most ${MAX_ACTIVE_KEYS} active keys; revoking one makes room`, async () => {
    const active = (await list()).keys.filter((k) => k.revokedAt === null);
    for (let i = active.length; i < MAX_ACTIVE_KEYS; i++) expect((await create(`Spare ${i}`)).status).toBe(201);
    const refused = await create("One too many");
    expect(refused.status).toBe(409);
    expect((await refused.json()).message).toMatch(/revoke one/);
    const victim = (await list()).keys.find((k) => k.revokedAt === null)!;
    expect((await revoke(victim.id)).status).toBe(200);
    expect((await create("Replacement")).status).toBe(201);
  });
});

describe("gateway keys: who may", () => {
  // Integrators only (lib/auth/permissions.ts "gateway-keys.manage"); non-members see no site (404), signed out 401.
  const expected: Record<Who, number> = { integrator: 200, manager: 403, occupant: 403, outsider: 404, signedOut: 401 };
  const WHO = Object.keys(expected) as Who[];

  it("GET /api/sites/{siteId}/keys", async () => {
    for (const who of WHO) {
      const res = await keysRoute.GET(get(`/api/sites/${DEMO_SITE_ID}/keys`, { cookie: cookies[who] }), site());
      expect(res.status, who).toBe(expected[who]);
    }
  });

  it("POST /api/sites/{siteId}/keys", async () => {
    // Make room first so the integrator's create is not refused by the cap.
    for (const k of (await list()).keys.filter((x) => x.revokedAt === null)) await revoke(k.id);
    for (const who of WHO) {
      const res = await create(`By ${who}`, cookies[who]);
      expect(res.status, who).toBe(who === "integrator" ? 201 : expected[who]);
    }
    const names = (await list()).keys.map((k) => k.name);
    expect(names.filter((n) => n.startsWith("By "))).toEqual(["By integrator"]);
  });

  it("DELETE /api/sites/{siteId}/keys/{keyId}", async () => {
    const { row } = await createApiKey({ siteId: DEMO_SITE_ID, name: "Target", createdBy: null });
    for (const who of WHO.filter((w) => w !== "integrator")) {
      const res = await revoke(row.id, cookies[who]);
      expect(res.status, who).toBe(expected[who]);
    }
    expect((await list()).keys.find((k) => k.id === row.id)!.revokedAt).toBeNull();
    expect((await revoke(row.id, cookies.integrator)).status).toBe(200);
  });
});
