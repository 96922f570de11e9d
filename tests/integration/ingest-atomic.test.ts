import { asc, count, eq, inArray, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { getLiveState, ingestEvents, loadEngineInput, openLive } from "@/db/queries/live";
import { devices, engineStates, engineSteps, events, gatewayCommands } from "@/db/schema";
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
    await expect(ingestEvents({ siteId: DEMO_SITE_ID, batch, source: "gateway" })).rejects.toThrow(/simulated crash/);
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

describe("the store's plain-SQL writes", () => {
  it("read back exactly as Drizzle wrote them, numbered after every seq ever used (AUTOINCREMENT)", async () => {
    const db = getDb();
    // A step seq used and deleted before this batch must not come back, as SQLite's AUTOINCREMENT promises.
    const [gone] = await db.insert(engineSteps).values({ siteId: DEMO_SITE_ID, eventSeq: null, at: base, versionId: null, output: {} }).returning({ seq: engineSteps.seq });
    await db.delete(engineSteps).where(eq(engineSteps.seq, gone.seq));
    const list: DeviceEvent[] = [
      ev(40, "press", "call-counter", null),
      ev(41, "contact", "contact-back", "open"),
      ev(42, "motion", "sensor-path", true),
      ev(43, "temperature", "climate-workshop", 21.5),
      ev(44, "press", "rocker-shop-door", 1),
    ];
    const result = await ingestEvents({ siteId: DEMO_SITE_ID, batch: [...list].reverse(), source: "import" });
    expect(result.accepted.map((a) => a.id)).toEqual(list.map((e) => e.id));
    expect(result.accepted[0].stepSeq).toBe(gone.seq + 1);
    expect(result.accepted.map((a) => a.stepSeq)).toEqual(list.map((_, i) => gone.seq + 1 + i));

    // Through Drizzle's own column mapping: the JSON value column parses back to the value sent.
    const stored = await db.select().from(events).where(inArray(events.eventId, list.map((e) => e.id))).orderBy(asc(events.seq));
    expect(stored.map((r) => ({ id: r.eventId, at: r.at, device: r.device, kind: r.kind, value: r.value, source: r.source }))).toEqual(list.map((e) => ({ id: e.id, at: e.at, device: e.device, kind: e.kind, value: e.value, source: "import" })));
    expect(stored.every((r, i) => i === 0 || r.seq === stored[i - 1].seq + 1)).toBe(true);
    expect(typeof stored[0].receivedAt).toBe("number");
    // And byte for byte what Drizzle binds for a `mode: "json"` text column: JSON text, NULL for null.
    const raw = await db.$client.execute({ sql: `select value, typeof(value), typeof(at) from events where event_id in (${list.map(() => "?").join(",")}) order by seq`, args: list.map((e) => e.id) });
    expect(raw.rows.map((r) => [r[0], r[1], r[2]])).toEqual([
      [null, "null", "integer"],
      ['"open"', "text", "integer"],
      ["true", "text", "integer"],
      ["21.5", "text", "integer"],
      ["1", "text", "integer"],
    ]);

    const steps = await db.select().from(engineSteps).where(inArray(engineSteps.seq, result.accepted.map((a) => a.stepSeq))).orderBy(asc(engineSteps.seq));
    expect(steps.map((s) => s.eventSeq)).toEqual(stored.map((r) => r.seq));
    const version = (await loadEngineInput(DEMO_SITE_ID)).versionId;
    expect(steps.every((s) => s.versionId === version && s.siteId === DEMO_SITE_ID)).toBe(true);
    const outputs = steps.map((s) => s.output as { changes: unknown[]; commands: unknown[]; notices: unknown[]; trace: { ruleId?: string }[] });
    expect(Object.keys(outputs[0])).toEqual(["changes", "commands", "notices", "trace"]);
    // The rocker press recalls a scene: its commands are in the step and in gateway_commands, with the seqs the answer gave.
    expect(result.commands.length).toBeGreaterThan(0);
    const commands = await db.select().from(gatewayCommands).where(inArray(gatewayCommands.stepSeq, result.accepted.map((a) => a.stepSeq))).orderBy(asc(gatewayCommands.seq));
    expect(commands.map((c) => ({ ...(c.command as object), seq: c.seq }))).toEqual(result.commands);
    expect(outputs.flatMap((o) => o.commands)).toEqual(commands.map((c) => c.command));

    // A later Drizzle insert (advanceSite's path) carries on after the seqs numbered here.
    const [after] = await db.insert(engineSteps).values({ siteId: DEMO_SITE_ID, eventSeq: null, at: base, versionId: null, output: {} }).returning({ seq: engineSteps.seq });
    expect(after.seq).toBe(result.accepted.at(-1)!.stepSeq + 1);
    await db.delete(engineSteps).where(eq(engineSteps.seq, after.seq));
  });

  it("a fault in the commands INSERT, after events and steps went in, stores nothing", async () => {
    const db = getDb();
    const before = await counts();
    const state = await getLiveState({ siteId: DEMO_SITE_ID });
    await db.run(sql.raw("CREATE TRIGGER fail_commands BEFORE INSERT ON gateway_commands BEGIN SELECT RAISE(ABORT, 'simulated crash'); END"));
    try {
      await expect(ingestEvents({ siteId: DEMO_SITE_ID, batch: [ev(50, "press", "rocker-shop-door", 2)], source: "gateway" })).rejects.toThrow(/simulated crash/);
    } finally {
      await db.run(sql.raw("DROP TRIGGER fail_commands"));
    }
    expect(await counts()).toEqual(before);
    expect(await getLiveState({ siteId: DEMO_SITE_ID })).toEqual(state);
  });
});

describe("the live store's site input", () => {
  it("is loadEngineInput's (same lists, same order), reused while unchanged, rebuilt when a device changes", async () => {
    const db = getDb();
    const open = () => db.transaction((tx) => openLive(tx, DEMO_SITE_ID));
    const loaded = await loadEngineInput(DEMO_SITE_ID);
    const first = await open();
    expect(first.input).toEqual(loaded.input);
    expect(first.versionId).toBe(loaded.versionId);
    expect(first.rules.groups.size).toBeGreaterThan(0);
    const again = await open();
    expect(again.input).toBe(first.input);
    expect(again.rules).toBe(first.rules);

    const id = `${DEMO_SITE_ID}-dev-lux-window`;
    const [device] = await db.select().from(devices).where(eq(devices.id, id));
    await db.update(devices).set({ name: "Window light sensor (moved)" }).where(eq(devices.id, id));
    try {
      const changed = await open();
      expect(changed.input).not.toBe(first.input);
      expect(changed.input).toEqual((await loadEngineInput(DEMO_SITE_ID)).input);
      expect(changed.input.devices.find((d) => d.id === id)?.name).toBe("Window light sensor (moved)");
    } finally {
      await db.update(devices).set({ name: device.name }).where(eq(devices.id, id));
    }
    expect((await open()).input).toEqual(loaded.input);
  });
});
