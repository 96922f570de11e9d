import { asc, count, eq, inArray, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db";
import { getLiveState, ingestEvents, loadEngineInput, openLive, writeIngested } from "@/db/queries/live";
import { devices, engineStates, engineSteps, events, gatewayCommands, noticesOutbox, ruleSets, ruleSetVersions } from "@/db/schema";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import type { DeviceEvent, GatewayCommand, Notice, Step } from "@/lib/bus/types";
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

  it("store every text byte for byte as JSON.stringify and Drizzle would: unicode, quotes, backslashes, extreme numbers", async () => {
    const db = getDb();
    // Awkward text: quotes, backslashes, control and separator characters, accents, CJK, an astral emoji, a lone surrogate.
    const text = 'say "hi" \\ back\\slash \u0001 \u2028 \u00e9t\u00e9 \u65e5\u672c \u{1F600} lone \ud800 end';
    const numbers = [1e21, 5e-324, -0, 1.7976931348623157e308, 0.1 + 0.2, -123.456e-10, Number.MAX_SAFE_INTEGER];
    const at = base + 90 * 60_000;
    const command = { at, source: 1, destination: 0xc001, addressing: "group", message: { type: "scene-recall", scene: 3 }, tid: 7, ttl: 5, transition: null, bytes: "82 42", note: text, numbers } as unknown as GatewayCommand;
    const notice = { at, dedupeKey: `bytes-${text}`, recipient: "managers", channels: ["push", text], text, kind: "other", zoneId: null } as unknown as Notice;
    const step = (i: number): Step =>
      ({
        input: { eventId: `bytes-${i}` },
        at: at + i,
        isDuplicate: false,
        changes: [{ what: text, numbers }],
        commands: i === 0 ? [command] : [],
        notices: i === 0 ? [notice] : [],
        actions: [],
        fired: [],
        matched: 0,
        trace: [{ at, origin: text, trigger: { key: null, type: "event", device: null, value: numbers }, rules: [], actions: [], note: text }],
      }) as unknown as Step;
    const list: DeviceEvent[] = [
      { id: "bytes-0", siteId: DEMO_SITE_ID, at, device: `${DEMO_SITE_ID}-dev-climate-workshop`, kind: "temperature", value: 1e21 },
      { id: "bytes-1 lone \ud800", siteId: DEMO_SITE_ID, at: at + 1, device: `${DEMO_SITE_ID}-dev-contact-back`, kind: "contact", value: text },
    ];
    const steps = [step(0), step(1)];
    const written = await db.transaction((tx) => writeIngested(tx, { siteId: DEMO_SITE_ID, source: "import", versionId: null, events: list, steps, receivedAt: at }));
    const seqs = written.accepted.map((a) => a.stepSeq);
    const raw = async (sql: string, args: (string | number)[]) => (await db.$client.execute({ sql, args })).rows.map((r) => Array.from({ length: r.length }, (_, i) => r[i]));
    const stored = await raw(`select output, typeof(output) from engine_steps where seq in (${seqs.join(",")}) order by seq`, []);
    expect(stored).toEqual(steps.map((s) => [JSON.stringify({ changes: s.changes, commands: s.commands, notices: s.notices, trace: s.trace }), "text"]));
    expect(await raw("select command from gateway_commands where seq = ?", [written.commands[0].seq])).toEqual([[JSON.stringify(command)]]);
    // An event id with a lone surrogate is stored as binding stores it (U+FFFD, valid UTF-8) and reads back.
    expect(await raw("select event_id, value from events where site_id = ? and event_id like 'bytes-%' order by seq", [DEMO_SITE_ID])).toEqual([
      ["bytes-0", "1e+21"],
      ["bytes-1 lone \ufffd", JSON.stringify(text)],
    ]);

    // The outbox row is the one Drizzle writes for the same notice (but for id, the key and created_at).
    await db.insert(noticesOutbox).values({ siteId: DEMO_SITE_ID, dedupeKey: "bytes-drizzle", recipient: notice.recipient, channels: notice.channels, text: notice.text, at: notice.at, kind: notice.kind, zoneId: notice.zoneId, url: `/sites/${DEMO_SITE_ID}` });
    const outbox = await raw("select * from notices_outbox where dedupe_key in (?, ?) order by id", [notice.dedupeKey.toWellFormed(), "bytes-drizzle"]);
    const columns = (await db.$client.execute("select * from notices_outbox limit 0")).columns;
    const comparable = (row: unknown[]) => Object.fromEntries(columns.map((c, i) => [c, row[i]]).filter(([c]) => !["id", "dedupe_key", "created_at"].includes(c as string)));
    expect(outbox).toHaveLength(2);
    expect(comparable(outbox[0])).toEqual(comparable(outbox[1]));
    const createdAt = outbox.map((r) => Number(r[columns.indexOf("created_at")]));
    expect(Math.abs(createdAt[1] - createdAt[0])).toBeLessThan(60_000);
    // Sent again (a later batch with the same notice): ON CONFLICT keeps the first.
    const again = await db.transaction((tx) => writeIngested(tx, { siteId: DEMO_SITE_ID, source: "import", versionId: null, events: [{ ...list[0], id: "bytes-2", at: at + 2 }], steps: [{ ...step(0), commands: [] }], receivedAt: at }));
    expect(again.accepted).toHaveLength(1);
    expect(await raw("select count(*) from notices_outbox where dedupe_key = ?", [notice.dedupeKey.toWellFormed()])).toEqual([[1]]);
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
      // Same active version: its rules (never rewritten) are not read or indexed again.
      expect(changed.rules).toBe(first.rules);
    } finally {
      await db.update(devices).set({ name: device.name }).where(eq(devices.id, id));
    }
    expect((await open()).input).toEqual(loaded.input);
  });

  it("takes the rules of a newly activated version, and the old ones again when it is switched back", async () => {
    const db = getDb();
    const open = () => db.transaction((tx) => openLive(tx, DEMO_SITE_ID));
    const before = await open();
    const loaded = await loadEngineInput(DEMO_SITE_ID);
    const oneRule = loaded.rules.slice(0, 1);
    await db.insert(ruleSetVersions).values({ id: "live-input-v2", siteId: DEMO_SITE_ID, number: 999, graph: {}, rules: oneRule });
    await db.update(ruleSets).set({ activeVersionId: "live-input-v2" }).where(eq(ruleSets.siteId, DEMO_SITE_ID));
    try {
      const switched = await open();
      expect(switched.versionId).toBe("live-input-v2");
      expect(switched.rules.rules.map((r) => r.json)).toEqual(oneRule);
      expect(switched.input).toEqual(before.input);
    } finally {
      await db.update(ruleSets).set({ activeVersionId: loaded.versionId }).where(eq(ruleSets.siteId, DEMO_SITE_ID));
      await db.delete(ruleSetVersions).where(eq(ruleSetVersions.id, "live-input-v2"));
    }
    const back = await open();
    expect(back.versionId).toBe(loaded.versionId);
    expect(back.rules.rules.map((r) => r.json)).toEqual(loaded.rules);
  });
});
