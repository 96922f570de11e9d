import { beforeAll, describe, expect, it } from "vitest";
import * as deviceRoute from "@/app/api/sites/[siteId]/devices/[deviceId]/route";
import * as bulkRoute from "@/app/api/sites/[siteId]/devices/bulk-zone/route";
import * as devicesRoute from "@/app/api/sites/[siteId]/devices/route";
import * as sceneRoute from "@/app/api/sites/[siteId]/scenes/[sceneId]/route";
import * as scenesRoute from "@/app/api/sites/[siteId]/scenes/route";
import * as zonesRoute from "@/app/api/sites/[siteId]/zones/route";
import { listDevices } from "@/db/queries/devices";
import { createSite } from "@/db/queries/sites";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { params, req, seedDemoSite, userWithSession } from "./helpers";

let integrator: string;
let occupant: string;
const site = params({ siteId: DEMO_SITE_ID });

beforeAll(async () => {
  await seedDemoSite();
  integrator = (await userWithSession("inv-i@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" })).cookie;
  occupant = (await userWithSession("inv-o@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant", zoneIds: [`${DEMO_SITE_ID}-zone-flat`] })).cookie;
});

describe("devices", () => {
  it("assigns the lowest free unicast range that fits the element count", async () => {
    const res = await devicesRoute.POST(req("POST", "/x", { cookie: integrator, body: { name: "Gallery rocker", kind: "kinetic-rocker", elementCount: 2, profile: { buttons: 4 } } }), site);
    expect(res.status).toBe(201);
    const { device } = await res.json();
    // Demo devices use 0x0001–0x001E; the next free pair starts at 0x001F.
    expect(device.unicastAddress).toBe(0x001f);
  });

  it("refuses an address range overlapping another device (409, names the device) and writes nothing", async () => {
    const before = (await listDevices({ siteId: DEMO_SITE_ID })).length;
    const res = await devicesRoute.POST(req("POST", "/x", { cookie: integrator, body: { name: "Clash", kind: "mesh-luminaire", unicastAddress: "0x0019", elementCount: 2 } }), site);
    expect(res.status).toBe(409);
    expect((await res.json()).fields.unicastAddress[0]).toMatch(/overlaps Exit passage downlight/);
    expect((await listDevices({ siteId: DEMO_SITE_ID })).length).toBe(before);
  });

  it("refuses addresses outside the unicast range (Mesh Profile 1.0.1 §3.4.2) with a field message", async () => {
    for (const unicastAddress of ["0x0000", "0x8000", "0xC000"]) {
      const res = await devicesRoute.POST(req("POST", "/x", { cookie: integrator, body: { name: `Bad ${unicastAddress}`, kind: "mesh-luminaire", unicastAddress } }), site);
      expect(res.status).toBe(422);
      expect((await res.json()).fields.unicastAddress[0]).toMatch(/0x0001 and 0x7FFF/);
    }
  });

  it("refuses a zone of another site", async () => {
    const other = await userWithSession("inv-other@example.invalid");
    await createSite({ userId: other.userId, name: "Other", address: "", timeZone: "UTC", latitude: 0, longitude: 0 });
    const res = await devicesRoute.POST(req("POST", "/x", { cookie: integrator, body: { name: "Stray", kind: "mesh-luminaire", zoneId: "not-a-zone-here" } }), site);
    expect(res.status).toBe(400);
  });

  it("moves several devices into a zone at once, all or nothing", async () => {
    const ids = [`${DEMO_SITE_ID}-dev-dl-flat-1`, `${DEMO_SITE_ID}-dev-dl-flat-2`];
    const ok = await bulkRoute.POST(req("POST", "/x", { cookie: integrator, body: { deviceIds: ids, zoneId: `${DEMO_SITE_ID}-zone-shop` } }), site);
    expect((await ok.json()).updated).toBe(2);
    const bad = await bulkRoute.POST(req("POST", "/x", { cookie: integrator, body: { deviceIds: [ids[0], "missing-device"], zoneId: `${DEMO_SITE_ID}-zone-flat` } }), site);
    expect(bad.status).toBe(404);
    const after = await listDevices({ siteId: DEMO_SITE_ID });
    expect(after.find((d) => d.id === ids[0])?.zoneId).toBe(`${DEMO_SITE_ID}-zone-shop`);
    await bulkRoute.POST(req("POST", "/x", { cookie: integrator, body: { deviceIds: ids, zoneId: `${DEMO_SITE_ID}-zone-flat` } }), site);
  });

  it("edits and deletes a device; the occupant cannot", async () => {
    const id = `${DEMO_SITE_ID}-dev-panel-flat`;
    const p = params({ siteId: DEMO_SITE_ID, deviceId: id });
    expect((await deviceRoute.PATCH(req("PATCH", "/x", { cookie: occupant, body: { name: "x" } }), p)).status).toBe(403);
    const res = await deviceRoute.PATCH(req("PATCH", "/x", { cookie: integrator, body: { name: "Flat notice screen" } }), p);
    expect((await res.json()).device.name).toBe("Flat notice screen");
    expect((await deviceRoute.DELETE(req("DELETE", "/x", { cookie: integrator }), p)).status).toBe(200);
    expect((await deviceRoute.GET(req("GET", "/x", { cookie: integrator }), p)).status).toBe(404);
  });
});

describe("zones", () => {
  it("gives a new zone the next free group address and refuses a taken one", async () => {
    const res = await zonesRoute.POST(req("POST", "/x", { cookie: integrator, body: { name: "Kiln corner" } }), site);
    expect((await res.json()).zone.groupAddress).toBe(0xc008);
    const taken = await zonesRoute.POST(req("POST", "/x", { cookie: integrator, body: { name: "Another", groupAddress: "0xC000" } }), site);
    expect(taken.status).toBe(409);
    const fixed = await zonesRoute.POST(req("POST", "/x", { cookie: integrator, body: { name: "All nodes", groupAddress: "0xFFFF" } }), site);
    expect(fixed.status).toBe(422);
  });
});

describe("scenes", () => {
  it("refuses scene number 0 (Mesh Model §5.1.3.1) and a duplicate number, storing nothing", async () => {
    const zero = await scenesRoute.POST(req("POST", "/x", { cookie: integrator, body: { number: 0, name: "Zero", fadeMs: 0, levels: [] } }), site);
    expect(zero.status).toBe(422);
    expect((await zero.json()).fields.number[0]).toMatch(/prohibited/);
    const dup = await scenesRoute.POST(req("POST", "/x", { cookie: integrator, body: { number: 1, name: "Another first", fadeMs: 0, levels: [] } }), site);
    expect(dup.status).toBe(409);
    const list = await (await scenesRoute.GET(req("GET", "/x", { cookie: integrator }), site)).json();
    expect(list.scenes.map((s: { name: string }) => s.name)).not.toContain("Zero");
  });

  it("creates and updates a scene with levels per zone and luminaire", async () => {
    const body = { number: 20, name: "Late viewing", fadeMs: 90_000, isOccupantRecallable: false, levels: [{ zoneId: `${DEMO_SITE_ID}-zone-textile`, level: 30 }] };
    const res = await scenesRoute.POST(req("POST", "/x", { cookie: integrator, body }), site);
    expect(res.status).toBe(201);
    const { scene } = await res.json();
    const upd = await sceneRoute.PUT(req("PUT", "/x", { cookie: integrator, body: { ...body, levels: [...body.levels, { deviceId: `${DEMO_SITE_ID}-dev-track-shop-1`, level: 55 }] } }), params({ siteId: DEMO_SITE_ID, sceneId: scene.id }));
    expect((await upd.json()).scene.levels).toHaveLength(2);
    const badLevel = await scenesRoute.POST(req("POST", "/x", { cookie: integrator, body: { ...body, number: 21, name: "Too bright", levels: [{ zoneId: `${DEMO_SITE_ID}-zone-shop`, level: 140 }] } }), site);
    expect(badLevel.status).toBe(422);
  });

  it("shows an occupant only scenes marked for occupants that stay within their zones", async () => {
    const res = await scenesRoute.GET(req("GET", "/x", { cookie: occupant }), site);
    const names = (await res.json()).scenes.map((s: { name: string }) => s.name);
    // Path welcome is recallable but reaches the front path, which is not this occupant's zone.
    expect(names).toEqual(["Flat evening", "Flat off"]);
    const create = await scenesRoute.POST(req("POST", "/x", { cookie: occupant, body: { number: 30, name: "Mine", fadeMs: 0, levels: [] } }), site);
    expect(create.status).toBe(403);
  });
});

describe("device PATCH changes only what it names", () => {
  it("moving a device on the plan keeps its zone, address and profile", async () => {
    const id = `${DEMO_SITE_ID}-dev-dl-shop-2`;
    const p = params({ siteId: DEMO_SITE_ID, deviceId: id });
    const before = (await (await deviceRoute.GET(req("GET", "/x", { cookie: integrator }), p)).json()).device;
    const res = await deviceRoute.PATCH(req("PATCH", "/x", { cookie: integrator, body: { floorId: `${DEMO_SITE_ID}-floor-ground`, x: 4.5, y: 6.25 } }), p);
    expect(res.status).toBe(200);
    const after = (await res.json()).device;
    expect(after).toMatchObject({ zoneId: before.zoneId, unicastAddress: before.unicastAddress, x: 4.5, y: 6.25 });
    expect(after.profile).toEqual(before.profile);
  });

  it("rejects an invalid profile value with the field's path and stores nothing", async () => {
    const id = `${DEMO_SITE_ID}-dev-sensor-path`;
    const p = params({ siteId: DEMO_SITE_ID, deviceId: id });
    const res = await deviceRoute.PATCH(req("PATCH", "/x", { cookie: integrator, body: { profile: { energy: { storage: { vMin: -3 } } } } }), p);
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(Object.keys(body.fields).join(" ")).toMatch(/profile\.energy\.storage/);
  });
});

describe("site settings", () => {
  it("changes only the fields sent and refuses an unknown time zone", async () => {
    const route = await import("@/app/api/sites/[siteId]/route");
    const res = await route.PATCH(req("PATCH", "/x", { cookie: integrator, body: { latitude: 51.3 } }), site);
    const { site: updated } = await res.json();
    expect(updated.latitude).toBe(51.3);
    expect(updated.address).toBe("4 Larch Lane (invented)");
    const bad = await route.PATCH(req("PATCH", "/x", { cookie: integrator, body: { timeZone: "Nowhere/Else" } }), site);
    expect(bad.status).toBe(422);
  });
});
