import { count, eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { getLiveState, ingestEvents } from "@/db/queries/live";
import { engineStates, engineSteps, events } from "@/db/schema";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import type { DeviceEvent } from "@/lib/bus/types";
import { seedDemoSite } from "./helpers";

const base = Date.parse("2026-06-20T15:00:00Z");
const ev = (i: number, kind: string, device: string, value: DeviceEvent["value"]): DeviceEvent => ({ id: `atomic-${i}`, siteId: DEMO_SITE_ID, at: base + i * 60_000, device: `${DEMO_SITE_ID}-dev-${device}`, kind, value });
const batch = [ev(1, "temperature", "climate-workshop", 24), ev(2, "temperature", "climate-workshop", 29.5), ev(3, "press", "rocker-workshop", 1)];

async function counts() {
  const db = getDb();
  const [[e], [s], [st]] = await Promise.all([
    db.select({ n: count() }).from(events).where(eq(events.siteId, DEMO_SITE_ID)),
    db.select({ n: count() }).from(engineSteps).where(eq(engineSteps.siteId, DEMO_SITE_ID)),
    db.select({ revision: engineStates.revision }).from(engineStates).where(eq(engineStates.siteId, DEMO_SITE_ID)),
  ]);
  return { events: e.n, steps: s.n, revision: st?.revision ?? 0 };
}

beforeAll(async () => {
  await seedDemoSite();
});

describe("ingest is all or nothing", () => {
  it("a fault in the middle of a batch stores nothing; the resent batch is applied exactly once", async () => {
    const db = getDb();
    const before = await counts();
    // Fault injection in the database itself: the second event's step cannot be written.
    await db.run(sql.raw(`CREATE TRIGGER fail_second_step BEFORE INSERT ON engine_steps WHEN NEW.at = ${base + 2 * 60_000} BEGIN SELECT RAISE(ABORT, 'simulated crash'); END`));
    await expect(ingestEvents({ siteId: DEMO_SITE_ID, batch, source: "gateway" })).rejects.toThrow(/insert into "engine_steps"/);
    expect(await counts()).toEqual(before);
    expect(await getLiveState({ siteId: DEMO_SITE_ID })).toBeNull();

    await db.run(sql.raw("DROP TRIGGER fail_second_step"));
    const first = await ingestEvents({ siteId: DEMO_SITE_ID, batch, source: "gateway" });
    expect(first.accepted.map((a) => a.id)).toEqual(["atomic-1", "atomic-2", "atomic-3"]);
    const again = await ingestEvents({ siteId: DEMO_SITE_ID, batch, source: "gateway" });
    expect(again.accepted).toEqual([]);
    expect(again.duplicates).toEqual(["atomic-1", "atomic-2", "atomic-3"]);
    const after = await counts();
    expect(after.events - before.events).toBe(3);
    expect(after.steps - before.steps).toBe(3);
    // 29.5 °C crossed the 28 °C threshold once: the fan relay is on.
    expect((await getLiveState({ siteId: DEMO_SITE_ID }))?.relays[`${DEMO_SITE_ID}-dev-fan-workshop`]).toBe(true);
  });
});

describe("concurrent store calls in one process", () => {
  it("queue instead of fighting over the write lock (both succeed, quickly)", async () => {
    const { advanceSite } = await import("@/db/queries/live");
    const started = performance.now();
    const [a, b] = await Promise.allSettled([
      ingestEvents({ siteId: DEMO_SITE_ID, batch: [ev(10, "temperature", "climate-workshop", 25)], source: "gateway" }),
      advanceSite({ siteId: DEMO_SITE_ID, to: base + 11 * 60_000 }),
    ]);
    expect([a.status, b.status]).toEqual(["fulfilled", "fulfilled"]);
    // Without the queue the second BEGIN IMMEDIATE waited out the 5 s busy timeout and failed.
    expect(performance.now() - started).toBeLessThan(3000);
  });
});

describe("clearing a latched emergency in the console", () => {
  it("only managers and integrators may; it clears the latch and the Trace says who", async () => {
    const { POST } = await import("@/app/api/sites/[siteId]/emergency/clear/route");
    const { params, req, userWithSession } = await import("./helpers");
    const manager = await userWithSession("clear-m@example.invalid", { siteId: DEMO_SITE_ID, role: "manager" });
    const occupant = await userWithSession("clear-o@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant" });
    const site = params({ siteId: DEMO_SITE_ID });
    expect((await POST(req("POST", "/x", { cookie: manager.cookie }), site)).status).toBe(409);
    await ingestEvents({ siteId: DEMO_SITE_ID, batch: [ev(20, "fire-alarm", "fire-input", "active")], source: "gateway" });
    expect((await getLiveState({ siteId: DEMO_SITE_ID }))?.emergency.active).toBe(true);
    expect((await POST(req("POST", "/x", { cookie: occupant.cookie }), site)).status).toBe(403);
    expect((await POST(req("POST", "/x", { cookie: manager.cookie }), site)).status).toBe(200);
    expect((await getLiveState({ siteId: DEMO_SITE_ID }))?.emergency.active).toBe(false);
    const [last] = await getDb().select({ output: engineSteps.output }).from(engineSteps).where(eq(engineSteps.siteId, DEMO_SITE_ID)).orderBy(sql`seq desc`).limit(1);
    expect(JSON.stringify(last.output)).toMatch(/Cleared in the console by clear-m/);
  });
});
