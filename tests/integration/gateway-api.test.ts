import { asc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as getOpenApi } from "@/app/api/v1/openapi.json/route";
import { GET as getCommands } from "@/app/api/v1/sites/[siteId]/commands/route";
import { POST as postEvents } from "@/app/api/v1/sites/[siteId]/events/route";
import { getDb } from "@/db";
import { createApiKey, listApiKeys, revokeApiKey } from "@/db/queries/api-keys";
import { createSite } from "@/db/queries/sites";
import { DEMO_SITE_ID, demoZones } from "@/db/seed/demo-site";
import { engineStates, engineSteps, events, noticesOutbox } from "@/db/schema";
import type { EngineState, TraceEntry } from "@/lib/bus/types";
import { buildGatewayOpenApi, commandsAnswerSchema, errorAnswerSchema, eventsAnswerSchema } from "@/lib/gateway/openapi";
import { BASE, params, seedDemoSite, userWithSession } from "./helpers";

type Event = { id: string; at: number | string; device: string; kind: string; value?: unknown };
type Answer = ReturnType<typeof eventsAnswerSchema.parse>;

const dev = (key: string) => `${DEMO_SITE_ID}-dev-${key}`;
const site = () => params({ siteId: DEMO_SITE_ID });
/**
 * Local time at the demo site on Thursday 2026-06-18. The site's zone is "WET",
 * which keeps European summer time: UTC+1 in June (EU Directive 2000/84/EC, last
 * Sunday of March to last Sunday of October).
 */
const local = (hh: number, mm = 0, ss = 0) => Date.UTC(2026, 5, 18, hh - 1, mm, ss);
const PATH_GROUP = demoZones.find((z) => z.id === `${DEMO_SITE_ID}-zone-path`)!.groupAddress;

let key = "";
let otherSiteKey = "";
/** Every command the POST answers carried, in the order they came. */
const answered: number[] = [];

function post(body: unknown, auth: string | null = key, siteId = DEMO_SITE_ID): Promise<Response> {
  const headers: Record<string, string> = { "content-type": "application/json" };
  if (auth !== null) headers.authorization = auth.startsWith("jpk_") ? `Bearer ${auth}` : auth;
  return postEvents(new Request(new URL(`/api/v1/sites/${siteId}/events`, BASE), { method: "POST", headers, body: typeof body === "string" ? body : JSON.stringify(body) }), params({ siteId }));
}

/** Posts a batch and checks the answer against the published answer schema (strict: a new field fails here first). */
async function send(list: Event[], expected = 200): Promise<Answer> {
  const res = await post({ events: list });
  const body: unknown = await res.json();
  expect(res.status, JSON.stringify(body)).toBe(expected);
  const answer = eventsAnswerSchema.parse(body);
  answered.push(...answer.commands.map((c) => c.seq));
  return answer;
}

function commands(query: string, auth: string | null = key): Promise<Response> {
  const headers: Record<string, string> = {};
  if (auth) headers.authorization = `Bearer ${auth}`;
  return getCommands(new Request(new URL(`/api/v1/sites/${DEMO_SITE_ID}/commands${query}`, BASE), { headers }), site());
}

async function storedIds(): Promise<string[]> {
  const rows = await getDb().select({ id: events.eventId }).from(events).where(eq(events.siteId, DEMO_SITE_ID)).orderBy(asc(events.seq));
  return rows.map((r) => r.id);
}

async function liveState(): Promise<EngineState> {
  const [row] = await getDb().select().from(engineStates).where(eq(engineStates.siteId, DEMO_SITE_ID));
  return row.state as EngineState;
}

/** The stored Trace of the step that handled one event. */
async function traceOf(eventId: string): Promise<TraceEntry[]> {
  const [ev] = await getDb().select({ seq: events.seq }).from(events).where(eq(events.eventId, eventId));
  const [step] = await getDb().select().from(engineSteps).where(eq(engineSteps.eventSeq, ev.seq));
  return (step.output as { trace: TraceEntry[] }).trace;
}

beforeAll(async () => {
  await seedDemoSite();
  ({ key } = await createApiKey({ siteId: DEMO_SITE_ID, name: "Test gateway", createdBy: null }));
  const { userId } = await userWithSession("gw-other@example.invalid");
  const other = await createSite({ userId, name: "Quillon Yard", address: "", timeZone: "UTC", latitude: 50, longitude: 0 });
  ({ key: otherSiteKey } = await createApiKey({ siteId: other.id, name: "Other site gateway", createdBy: userId }));
});

const oneEvent = { events: [{ id: "auth-probe", at: local(9, 30), device: dev("lux-window"), kind: "light-level", value: 500 }] };

describe("gateway authentication", () => {
  it("answers 401 without a key, with a malformed or wrong key, a revoked key, or another site's key, and stores nothing", async () => {
    const { key: revoked, row } = await createApiKey({ siteId: DEMO_SITE_ID, name: "Old gateway", createdBy: null });
    await revokeApiKey({ siteId: DEMO_SITE_ID, keyId: row.id });
    const wrong = `jpk_${"A".repeat(43)}`;
    const cases: [string, string | null][] = [
      ["no header", null],
      ["not Bearer", `Basic ${Buffer.from(`x:${key}`).toString("base64")}`],
      ["Bearer without jpk_", "Bearer abcdef"],
      ["truncated key", `Bearer ${key.slice(0, -1)}`],
      ["wrong key", wrong],
      ["revoked key", revoked],
      ["another site's key", otherSiteKey],
    ];
    for (const [name, auth] of cases) {
      const res = await post(oneEvent, auth);
      expect(res.status, name).toBe(401);
      expect(errorAnswerSchema.parse(await res.json()).error, name).toBe("unauthenticated");
      const polled = await commands("?after=0", auth?.startsWith("jpk_") ? auth : null);
      expect(polled.status, `${name} (commands)`).toBe(401);
    }
    expect(await storedIds()).toEqual([]);
  });

  it("the OpenAPI document is public and is the one lib/gateway/openapi.ts builds", async () => {
    const res = await getOpenApi();
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/application\/json/);
    const doc = await res.json();
    expect(doc.openapi).toBe("3.1.0");
    expect(doc).toEqual(JSON.parse(JSON.stringify(buildGatewayOpenApi({ serverUrl: "http://localhost:3000" }))));
  });
});

describe("POST /api/v1/sites/{siteId}/events: the batch", () => {
  it("refuses a batch of 501 events with 422 and the field (the route parses with gatewayBatchSchema, max 500)", async () => {
    const list = Array.from({ length: 501 }, (_, i) => ({ id: `big-${i}`, at: local(9, 0, i % 60), device: dev("lux-window"), kind: "light-level", value: 100 }));
    const res = await post({ events: list });
    expect(res.status).toBe(422);
    const body = errorAnswerSchema.parse(await res.json());
    expect(body.error).toBe("invalid_input");
    expect(body.fields).toEqual({ events: ["At most 500 events in one batch"] });
    expect(await storedIds()).toEqual([]);
  });

  it("answers 413 for a body over 2 MiB, 400 for a body that is not JSON, 422 for an empty batch", async () => {
    const huge = JSON.stringify({ events: [{ id: "x", at: 0, device: "d", kind: "k", value: "v".repeat(2 * 1024 * 1024) }] });
    expect((await post(huge)).status).toBe(413);
    expect((await post("{not json")).status).toBe(400);
    const empty = await post({ events: [] });
    expect(empty.status).toBe(422);
    expect(errorAnswerSchema.parse(await empty.json()).fields).toEqual({ events: ["Send at least one event"] });
    expect(await storedIds()).toEqual([]);
  });

  it("stores the valid items of a mixed batch and lists each bad one with its index and field", async () => {
    const farFuture = Date.now() + 24 * 3600_000;
    const batch: Event[] = [
      { id: "m-ok-window", at: local(10), device: dev("lux-window"), kind: "light-level", value: 650 },
      { id: "m-unknown-device", at: local(10), device: `${DEMO_SITE_ID}-dev-nowhere`, kind: "light-level", value: 10 },
      { id: "m-wrong-kind", at: local(10), device: dev("contact-back"), kind: "motion", value: true },
      { id: "m-negative-lux", at: local(10), device: dev("sensor-path"), kind: "light-level", value: -5 },
      { id: "m-future", at: farFuture, device: dev("sensor-path"), kind: "light-level", value: 50 },
      // By unicast address: the workshop climate sensor is the 14th element (0x000E) in the seed.
      { id: "m-ok-climate", at: "2026-06-18T10:00:05+01:00", device: "0x000E", kind: "temperature", value: 21.5 },
      { id: "m-unknown-address", at: local(10), device: "0x0F00", kind: "press", value: 1 },
      { id: "m-ok-window", at: local(10, 1), device: dev("lux-window"), kind: "light-level", value: 640 },
      { id: "m-no-kind", at: local(10), device: dev("lux-window") } as Event,
    ];
    const answer = await send(batch);
    expect(answer.accepted).toBe(2);
    expect(answer.duplicates).toEqual([]);
    expect(answer.rejected.map(({ index, id, field }) => ({ index, id, field }))).toEqual([
      { index: 1, id: "m-unknown-device", field: "device" },
      { index: 2, id: "m-wrong-kind", field: "kind" },
      { index: 3, id: "m-negative-lux", field: "value" },
      { index: 4, id: "m-future", field: "at" },
      { index: 6, id: "m-unknown-address", field: "device" },
      { index: 7, id: "m-ok-window", field: "id" },
      { index: 8, id: "m-no-kind", field: "kind" },
    ]);
    const message = (i: number) => answer.rejected.find((r) => r.index === i)!.message;
    expect(message(2)).toBe('Back door contact (Solar door/window contact) reports contact, not "motion"');
    expect(message(3)).toBe("-5 lx is outside what a sensor reports (0–200000 lx)");
    expect(message(4)).toMatch(/more than 5 minutes ahead of the server's clock/);
    expect(await storedIds()).toEqual(["m-ok-window", "m-ok-climate"]);
  });

  it("ignores a resent batch: the stored ids come back as duplicates and nothing runs twice", async () => {
    const before = await getDb().select().from(engineSteps);
    const answer = await send([
      { id: "m-ok-climate", at: "2026-06-18T10:00:05+01:00", device: "0x000E", kind: "temperature", value: 21.5 },
      { id: "m-ok-window", at: local(10), device: dev("lux-window"), kind: "light-level", value: 650 },
    ]);
    expect(answer).toMatchObject({ accepted: 0, rejected: [], commands: [] });
    expect(answer.duplicates.sort()).toEqual(["m-ok-climate", "m-ok-window"]);
    expect(await storedIds()).toEqual(["m-ok-window", "m-ok-climate"]);
    expect(await getDb().select().from(engineSteps)).toHaveLength(before.length);
  });

  it("answers 422 with every item listed when nothing in the batch is valid", async () => {
    const res = await post({ events: [{ id: "bad-1", at: local(10, 2), device: dev("lux-window"), kind: "light-level", value: "bright" }, { nope: true }, "hello"] });
    expect(res.status).toBe(422);
    const body = eventsAnswerSchema.parse(await res.json());
    expect(body.error).toBe("invalid_events");
    expect(body.accepted).toBe(0);
    expect(body.rejected.map((r) => [r.index, r.field])).toEqual([
      [0, "value"],
      [1, "id"],
      [2, "event"],
    ]);
    expect(await storedIds()).toEqual(["m-ok-window", "m-ok-climate"]);
  });
});

describe("the demo Rule set through the gateway API", () => {
  it("a visitor on the front path after the 17:30 closing lights the path zone by group and tells the flat", async () => {
    // Before closing: the path is bright, the site still open (the live engine starts in mode "open").
    const early = await send([{ id: "s-path-lux-1650", at: local(16, 50), device: dev("sensor-path"), kind: "light-level", value: 180 }]);
    expect(early.commands).toEqual([]);
    expect((await liveState()).mode).toBe("open");

    // 18:00: dark, then motion reported by the sensor's unicast address (0x0013 in the seed).
    const visit = await send([
      { id: "s-path-motion-1800", at: local(18, 0, 20), device: "0x0013", kind: "motion", value: true },
      { id: "s-path-lux-1800", at: local(18), device: dev("sensor-path"), kind: "light-level", value: 5 },
    ]);
    expect(visit.accepted).toBe(2);
    const state = await liveState();
    expect(state.mode).toBe("closed");

    // Light Lightness Set Unacknowledged is opcode 0x82 0x4D (Mesh Model 1.0.1 Table 7.1); 100 % is Actual 0xFFFF
    // (level → Actual per lib/mesh/lightness.ts), then TID, then the transition-time octet: 1 s = 10 steps of 100 ms = 0x0A
    // (Mesh Model 1.0.1 §3.1.3), then a delay of 0 (§3.2.1.2).
    const pathOn = visit.commands.filter((c) => c.destination === PATH_GROUP);
    expect(pathOn).toHaveLength(1);
    expect(PATH_GROUP).toBe(0xc004);
    expect(pathOn[0]).toMatchObject({ destination: 49156, addressing: "group", message: "light-lightness-set-unack", transition: 0x0a });
    expect(pathOn[0].bytes).toMatch(/^82 4D FF FF [0-9A-F]{2} 0A 00$/);
    expect(pathOn[0].bytes.split(" ")[4]).toBe(pathOn[0].tid.toString(16).toUpperCase().padStart(2, "0"));
    expect(pathOn[0].at).toBe(local(18, 0, 20));

    // The 17:30 schedule closed the site first: Scene Recall Unacknowledged (0x82 0x43, Mesh Model 1.0.1 Table 7.1) of scene 2, little-endian "02 00".
    const closing = visit.commands.filter((c) => c.at === local(17, 30));
    expect(closing.length).toBeGreaterThan(0);
    for (const c of closing) expect(c.bytes).toMatch(/^82 43 02 00 /);

    const notices = await getDb().select().from(noticesOutbox).where(eq(noticesOutbox.siteId, DEMO_SITE_ID));
    const visitor = notices.filter((n) => n.recipient === "role:occupant");
    expect(visitor).toHaveLength(1);
    expect(visitor[0]).toMatchObject({ text: "Someone is on the front path (18:00).", status: "pending", at: local(18, 0, 20), kind: "visitor", url: `/sites/${DEMO_SITE_ID}`, zoneId: `${DEMO_SITE_ID}-zone-path` });
    expect(visitor[0].channels).toEqual(["push", "in-app"]);

    // The Trace names the rules: compile.ts joins the trigger and gate node ids with ">" (lib/rules/compile.ts).
    const trace = await traceOf("s-path-motion-1800");
    const motion = trace.find((t) => t.trigger.type === "motion-detected")!;
    expect(motion.rules.map((r) => [r.ruleId, r.passed])).toEqual([
      ["t-path-motion>g-path-after-hours", true],
      ["t-path-motion>g-path-after-hours>g-path-dark", true],
    ]);
    expect(motion.actions.map((a) => [a.ruleId, a.actionId])).toEqual([
      ["t-path-motion>g-path-after-hours", "a-visitor-notice"],
      ["t-path-motion>g-path-after-hours>g-path-dark", "a-path-on"],
    ]);
  });

  it("the fire-alarm input latches the escape scene, which stays when the input clears, until the flat rocker's long press on button 4", async () => {
    const fire = await send([{ id: "s-fire-on", at: local(18, 10), device: dev("fire-input"), kind: "fire-alarm", value: "active" }]);
    // Scene 9 = escape route (lib/rules/demo-graph.ts DEMO_SCENES.escape), recalled with no fade: transition octet 0x00.
    const escape = fire.commands.filter((c) => c.message === "scene-recall-unack");
    expect(escape.length).toBeGreaterThan(0);
    for (const c of escape) expect(c.bytes).toMatch(/^82 43 09 00 [0-9A-F]{2} 00 00$/);
    expect(escape.map((c) => c.destination)).toContain(PATH_GROUP);
    expect((await liveState()).emergency).toMatchObject({ active: true, scene: 9, ruleId: "t-fire", since: local(18, 10) });

    const cleared = await send([{ id: "s-fire-off", at: local(18, 20), device: dev("fire-input"), kind: "fire-alarm", value: "cleared" }]);
    expect(cleared.commands).toEqual([]);
    expect((await liveState()).emergency.active).toBe(true);
    const managerNotices = await getDb().select().from(noticesOutbox).where(eq(noticesOutbox.recipient, "role:manager"));
    expect(managerNotices.map((n) => n.text)).toEqual(["Fire-alarm input active at 18:10: escape lighting latched on.", "Fire-alarm input cleared at 18:20. Escape lighting stays on until someone clears the emergency."]);

    // A short press does not clear it; the held button 4 on the flat rocker does. Its second element is 0x001B.
    await send([{ id: "s-flat-b4-short", at: local(18, 25), device: dev("rocker-flat"), kind: "press", value: 4 }]);
    await send([{ id: "s-flat-b4-short-up", at: local(18, 25, 0.3), device: dev("rocker-flat"), kind: "release", value: 4 }]);
    expect((await liveState()).emergency.active).toBe(true);
    const clear = await send([{ id: "s-flat-b4-long", at: local(18, 30), device: "0x001B", kind: "long-press", value: 4 }]);
    expect((await liveState()).emergency).toMatchObject({ active: false, scene: null });
    expect(clear.commands.length).toBeGreaterThan(0);
    const trace = await traceOf("s-flat-b4-long");
    expect(trace.flatMap((t) => t.actions.map((a) => [a.ruleId, a.actionId]))).toEqual([["t-flat-hold-4", "a-clear"]]);
  });

  it("GET commands?after=0 returns every command in order, and after=<last> returns none", async () => {
    expect(answered.length).toBeGreaterThan(3);
    const res = await commands("?after=0");
    expect(res.status).toBe(200);
    const all = commandsAnswerSchema.parse(await res.json());
    expect(all.commands.map((c) => c.seq)).toEqual(answered);
    expect(all.last).toBe(answered.at(-1));
    const path = all.commands.find((c) => c.destination === PATH_GROUP && c.message === "light-lightness-set-unack")!;
    expect(path).toMatchObject({ ruleId: "t-path-motion>g-path-after-hours>g-path-dark", actionId: "a-path-on", origin: "s-path-motion-1800", addressing: "group" });
    expect(path.devices).toEqual([dev("light-path-1"), dev("light-path-2")]);

    const none = commandsAnswerSchema.parse(await (await commands(`?after=${all.last}`)).json());
    expect(none).toEqual({ commands: [], last: all.last });

    const page = commandsAnswerSchema.parse(await (await commands(`?after=${answered[0]}&limit=2`)).json());
    expect(page.commands.map((c) => c.seq)).toEqual(answered.slice(1, 3));
    expect(page.last).toBe(answered[2]);

    for (const bad of ["?limit=501", "?limit=0", "?after=-1", "?after=1.5"]) expect((await commands(bad)).status, bad).toBe(422);
  });

  it("records when the key was last used", async () => {
    const keys = await listApiKeys({ siteId: DEMO_SITE_ID });
    const used = keys.find((k) => k.name === "Test gateway")!;
    expect(used.lastUsedAt).toBeInstanceOf(Date);
    expect(keys.find((k) => k.name === "Old gateway")!.revokedAt).toBeInstanceOf(Date);
  });
});
