import { readdirSync, readFileSync } from "node:fs";
import { beforeAll, describe, expect, it } from "vitest";
import * as planRoute from "@/app/api/sites/[siteId]/floors/[floorId]/plan/route";
import * as floorRoute from "@/app/api/sites/[siteId]/floors/[floorId]/route";
import * as floorsRoute from "@/app/api/sites/[siteId]/floors/route";
import { getDb } from "@/db";
import { uploads } from "@/db/schema";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { params, seedDemoSite, userWithSession } from "./helpers";

let integrator: string;
const site = params({ siteId: DEMO_SITE_ID });
const plan = readFileSync("db/seed/plans/upper-floor.png");

function upload(name: string, file: { bytes: Uint8Array; filename: string; type: string } | null, cookie = integrator): Request {
  const form = new FormData();
  form.set("name", name);
  if (file) form.set("plan", new File([new Uint8Array(file.bytes)], file.filename, { type: file.type }));
  return new Request("http://localhost:3000/x", { method: "POST", headers: { cookie, origin: "http://localhost:3000" }, body: form });
}

const storedFiles = () => readdirSync(process.env.UPLOAD_DIR!).length;

beforeAll(async () => {
  await seedDemoSite();
  integrator = (await userWithSession("floors-i@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" })).cookie;
});

describe("floor plans", () => {
  it("stores a PNG under a random name, sniffed from its content even when named .jpg, and serves it to members", async () => {
    const res = await floorsRoute.POST(upload("Loft", { bytes: plan, filename: "loft.jpg", type: "image/jpeg" }), site);
    expect(res.status).toBe(201);
    const { floor } = await res.json();
    const [row] = await getDb().select().from(uploads).where((await import("drizzle-orm")).eq(uploads.id, floor.planUploadId));
    expect(row.mimeType).toBe("image/png");
    expect(row.storedName).toMatch(/^[0-9a-f]{32}\.png$/);
    expect([row.width, row.height]).toEqual([600, 450]);
    const img = await planRoute.GET(new Request("http://localhost:3000/x", { headers: { cookie: integrator } }), params({ siteId: DEMO_SITE_ID, floorId: floor.id }));
    expect(img.headers.get("content-type")).toBe("image/png");
    expect(img.headers.get("x-content-type-options")).toBe("nosniff");
    expect(Buffer.from(await img.arrayBuffer()).equals(plan)).toBe(true);
  });

  it("sets the scale from two points and a distance", async () => {
    const res = await floorRoute.PATCH(
      new Request("http://localhost:3000/x", { method: "PATCH", headers: { cookie: integrator, origin: "http://localhost:3000", "content-type": "application/json" }, body: JSON.stringify({ scale: { a: { x: 0, y: 0 }, b: { x: 300, y: 400 }, distanceM: 10 } }) }),
      params({ siteId: DEMO_SITE_ID, floorId: `${DEMO_SITE_ID}-floor-upper` }),
    );
    // 500 px between the points over 10 m → 50 px/m (Pythagoras, common practice).
    expect((await res.json()).floor.pixelsPerMetre).toBe(50);
  });

  it("refuses a text file named .png and a truncated PNG, and stores nothing", async () => {
    const rowsBefore = (await getDb().select().from(uploads)).length;
    const filesBefore = storedFiles();
    const text = await floorsRoute.POST(upload("Fake", { bytes: Buffer.from("not an image at all"), filename: "plan.png", type: "image/png" }), site);
    expect(text.status).toBe(400);
    expect((await text.json()).fields.plan[0]).toMatch(/not an image/);
    const cut = await floorsRoute.POST(upload("Cut", { bytes: plan.subarray(0, 200), filename: "cut.png", type: "image/png" }), site);
    expect(cut.status).toBe(400);
    expect((await getDb().select().from(uploads)).length).toBe(rowsBefore);
    expect(storedFiles()).toBe(filesBefore);
  });

  it("refuses an oversized upload with 413 before storing it", async () => {
    const big = new Uint8Array(9 * 1024 * 1024);
    big.set(plan.subarray(0, 64));
    const res = await floorsRoute.POST(upload("Huge", { bytes: big, filename: "huge.png", type: "image/png" }), site);
    expect(res.status).toBe(413);
  });

  it("refuses a duplicate floor name and removes the file it had saved", async () => {
    const filesBefore = storedFiles();
    const res = await floorsRoute.POST(upload("Ground floor", { bytes: plan, filename: "again.png", type: "image/png" }), site);
    expect(res.status).toBe(409);
    expect(storedFiles()).toBe(filesBefore);
  });
});
