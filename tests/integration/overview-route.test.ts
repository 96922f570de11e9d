import { beforeAll, describe, expect, it } from "vitest";
import { GET as getOverview } from "@/app/api/sites/[siteId]/overview/route";
import { GET as getSites } from "@/app/api/sites/route";
import { DEMO_SITE_ID, demoDevices, demoZones } from "@/db/seed/demo-site";
import type { SiteOverview } from "@/lib/validation/overview";
import { get, params, seedDemoSite } from "./helpers";

beforeAll(async () => {
  await seedDemoSite();
});

describe("GET /api/sites/{siteId}/overview", () => {
  it("lists the demo site's zones in order with their devices", async () => {
    const res = await getOverview(get(`/api/sites/${DEMO_SITE_ID}/overview`), params({ siteId: DEMO_SITE_ID }));
    expect(res.status).toBe(200);
    const body = (await res.json()) as SiteOverview;
    expect(body.site.name).toBe("Larch Lane Studio");
    expect(body.zones.map((z) => z.name)).toEqual(demoZones.map((z) => z.name));
    const total = body.zones.reduce((n, z) => n + z.devices.length, 0) + body.unassigned.length;
    expect(total).toBe(demoDevices.length);
    const path = body.zones.find((z) => z.name === "Front path")!;
    expect(path.devices.map((d) => d.name)).toContain("Front path motion sensor");
    expect(path.groupAddress).toBe(0xc004);
  });

  it("answers 404 for a site that does not exist", async () => {
    const res = await getOverview(get("/api/sites/nowhere/overview"), params({ siteId: "nowhere" }));
    expect(res.status).toBe(404);
    expect((await res.json()).error).toBe("not_found");
  });

  it("answers 422 with the field for a malformed id", async () => {
    const res = await getOverview(get("/api/sites/x/overview"), params({ siteId: "../etc" }));
    expect(res.status).toBe(422);
    expect((await res.json()).fields).toHaveProperty("siteId");
  });
});

describe("GET /api/sites", () => {
  it("lists sites by name", async () => {
    const res = await getSites();
    expect(res.status).toBe(200);
    expect((await res.json()).sites).toEqual([{ id: DEMO_SITE_ID, name: "Larch Lane Studio" }]);
  });
});
