import { beforeAll, describe, expect, it } from "vitest";
import { GET as getOverview } from "@/app/api/sites/[siteId]/overview/route";
import { GET as getSites } from "@/app/api/sites/route";
import { DEMO_SITE_ID, demoDevices, demoZones } from "@/db/seed/demo-site";
import type { SiteOverviewResponse } from "@/lib/validation/overview";
import { get, params, seedDemoSite, userWithSession } from "./helpers";

let integrator: string;
let occupant: string;

beforeAll(async () => {
  await seedDemoSite();
  integrator = (await userWithSession("it-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" })).cookie;
  occupant = (await userWithSession("it-occupant@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant", zoneIds: [`${DEMO_SITE_ID}-zone-flat`] })).cookie;
});

describe("GET /api/sites/{siteId}/overview", () => {
  it("lists the demo site's zones in order with their devices", async () => {
    const res = await getOverview(get(`/api/sites/${DEMO_SITE_ID}/overview`, { cookie: integrator }), params({ siteId: DEMO_SITE_ID }));
    expect(res.status).toBe(200);
    const body = (await res.json()) as SiteOverviewResponse;
    expect(body.site.name).toBe("Larch Lane Studio");
    expect(body.role).toBe("integrator");
    expect(body.zones.map((z) => z.name)).toEqual(demoZones.map((z) => z.name));
    const total = body.zones.reduce((n, z) => n + z.devices.length, 0) + body.unassigned.length;
    expect(total).toBe(demoDevices.length);
    const path = body.zones.find((z) => z.name === "Front path")!;
    expect(path.devices.map((d) => d.name)).toContain("Front path motion sensor");
    expect(path.groupAddress).toBe(0xc004);
  });

  it("shows an occupant only the zones on their membership", async () => {
    const res = await getOverview(get(`/api/sites/${DEMO_SITE_ID}/overview`, { cookie: occupant }), params({ siteId: DEMO_SITE_ID }));
    expect(res.status).toBe(200);
    const body = (await res.json()) as SiteOverviewResponse;
    expect(body.zones.map((z) => z.name)).toEqual(["Flat"]);
    expect(body.unassigned).toEqual([]);
  });

  it("answers 404 for a site that does not exist", async () => {
    const res = await getOverview(get("/api/sites/nowhere/overview", { cookie: integrator }), params({ siteId: "nowhere" }));
    expect(res.status).toBe(404);
    expect((await res.json()).error).toBe("not_found");
  });

  it("answers 422 with the field for a malformed id", async () => {
    const res = await getOverview(get("/api/sites/x/overview", { cookie: integrator }), params({ siteId: "../etc" }));
    expect(res.status).toBe(422);
    expect((await res.json()).fields).toHaveProperty("siteId");
  });
});

describe("GET /api/sites", () => {
  it("lists only the caller's sites, with the role on each", async () => {
    const res = await getSites(get("/api/sites", { cookie: integrator }));
    expect(res.status).toBe(200);
    expect((await res.json()).sites).toEqual([{ id: DEMO_SITE_ID, name: "Larch Lane Studio", role: "integrator" }]);
    const stranger = await userWithSession("it-stranger@example.invalid");
    const res2 = await getSites(get("/api/sites", { cookie: stranger.cookie }));
    expect((await res2.json()).sites).toEqual([]);
  });
});

describe("live state on the overview", () => {
  it("shows levels and the latched emergency after the fire input trips, and only the occupant's devices to an occupant", async () => {
    const { ingestEvents } = await import("@/db/queries/live");
    const at = Date.parse("2026-06-20T10:00:00Z");
    await ingestEvents({ siteId: DEMO_SITE_ID, batch: [{ id: "ov-fire-1", siteId: DEMO_SITE_ID, at, device: `${DEMO_SITE_ID}-dev-fire-input`, kind: "fire-alarm", value: "active" }], source: "gateway" });
    const res = await getOverview(get(`/api/sites/${DEMO_SITE_ID}/overview`, { cookie: integrator }), params({ siteId: DEMO_SITE_ID }));
    const body = (await res.json()) as SiteOverviewResponse;
    expect(body.live?.emergency.active).toBe(true);
    // The escape scene (9) puts the stairs downlight at 100 % and the shop off.
    expect(body.live?.levels[`${DEMO_SITE_ID}-dev-dl-escape-1`]).toBe(100);
    expect(body.live?.levels[`${DEMO_SITE_ID}-dev-dl-shop-1`] ?? 0).toBe(0);
    const occ = (await (await getOverview(get(`/api/sites/${DEMO_SITE_ID}/overview`, { cookie: occupant }), params({ siteId: DEMO_SITE_ID }))).json()) as SiteOverviewResponse;
    expect(Object.keys(occ.live!.levels).every((id) => id.includes("flat"))).toBe(true);
  });
});
