import { and, count, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import * as eventsRoute from "@/app/api/sites/[siteId]/events/route";
import * as eventRoute from "@/app/api/sites/[siteId]/events/[seq]/route";
import * as exportRoute from "@/app/api/sites/[siteId]/events/export/route";
import * as importRoute from "@/app/api/sites/[siteId]/events/import/route";
import { getDb } from "@/db";
import { importEventStream } from "@/db/queries/events";
import { getLiveState, ingestEvents } from "@/db/queries/live";
import { engineSteps, events } from "@/db/schema";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { CSV_HEADER, toCsvLine, toNdjsonLine } from "@/lib/eventlog/format";
import { demoNightLog, NIGHT, NIGHT_WINDOW } from "@/lib/replay/demo-night";
import { BASE, get, params, seedDemoSite, userWithSession } from "./helpers";

type Handler = (r: Request, c: { params: Promise<Record<string, string>> }) => Promise<Response>;
const h = (f: unknown) => f as Handler;
const site = () => params({ siteId: DEMO_SITE_ID });
let cookie = "";

function upload(query: string, text: string, type = "application/x-ndjson", headers: Record<string, string> = {}) {
  return h(importRoute.POST)(new Request(`${BASE}/api/sites/${DEMO_SITE_ID}/events/import?${query}`, { method: "POST", headers: { cookie, origin: BASE, "content-type": type, ...headers }, body: text }), site());
}
async function logCount() {
  const [row] = await getDb().select({ n: count() }).from(events).where(eq(events.siteId, DEMO_SITE_ID));
  return row.n;
}
const night = demoNightLog();
const ndjson = night.map(toNdjsonLine).join("");

beforeAll(async () => {
  await seedDemoSite();
  cookie = (await userWithSession("events-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" })).cookie;
});

describe("import", () => {
  it("check reads and reports without writing", async () => {
    const res = await upload("format=ndjson&mode=check", ndjson);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.report).toMatchObject({ valid: night.length, errorCount: 0, earliest: night[0].at });
    expect(await logCount()).toBe(0);
  });

  it("a bad line means nothing is written, unless the valid lines are asked for", async () => {
    const bad = ndjson.replace('"device":"larch-lane-dev-call-counter"', '"device":"larch-lane-dev-no-such-thing"') + '{"id":"cut","at":17';
    const refused = await upload("format=ndjson&mode=commit", bad);
    expect(refused.status).toBe(422);
    const body = await refused.json();
    expect(body.message).toMatch(/2 lines with problems; nothing was imported/);
    expect(body.report.errors.map((e: { line: number; field: string }) => [e.line, e.field])).toEqual([
      [5, "device"],
      [17, "line"],
    ]);
    expect(body.report.errors[1].message).toMatch(/cut off/);
    expect(await logCount()).toBe(0);

    const partial = await upload("format=ndjson&mode=commit&acceptValid=1", bad);
    expect(partial.status).toBe(201);
    expect(await partial.json()).toMatchObject({ inserted: night.length - 1, skipped: 0 });
    expect(await logCount()).toBe(night.length - 1);
  });

  it("is idempotent by event id: importing again adds only what is new", async () => {
    const res = await upload("format=ndjson&mode=commit", ndjson);
    expect(res.status).toBe(201);
    expect(await res.json()).toMatchObject({ inserted: 1, skipped: night.length - 1 });
    expect(await logCount()).toBe(night.length);
    const rows = await getDb().select({ source: events.source }).from(events).where(eq(events.siteId, DEMO_SITE_ID));
    expect(new Set(rows.map((r) => r.source))).toEqual(new Set(["import"]));
  });

  it("CSV with wrong columns is refused with the header's line", async () => {
    const res = await upload("format=csv&mode=commit", "id,time,device,kind\nx,1,d,press\n", "text/csv");
    expect(res.status).toBe(422);
    expect((await res.json()).report.errors[0]).toMatchObject({ line: 1, field: "header" });
  });

  it("refuses a file over the limit before reading it (413), and stops reading one that grows past it", async () => {
    const res = await upload("format=ndjson&mode=commit", ndjson, "application/x-ndjson", { "content-length": String(300 * 1024 * 1024) });
    expect(res.status).toBe(413);
    expect((await res.json()).message).toMatch(/at most 256 MiB/);
    const stream = new Response("x".repeat(5000)).body!;
    await expect(importEventStream({ siteId: DEMO_SITE_ID, body: stream, format: "ndjson", mode: "commit", acceptValid: true, maxBytes: 1000 })).rejects.toThrow(/larger than/);
  });

  it("imported history does not touch the live engine: no steps, no live state", async () => {
    const [steps] = await getDb().select({ n: count() }).from(engineSteps).where(eq(engineSteps.siteId, DEMO_SITE_ID));
    expect(steps.n).toBe(0);
    expect(await getLiveState({ siteId: DEMO_SITE_ID })).toBeNull();
  });
});

describe("the log", () => {
  const list = async (query: string) => {
    const res = await h(eventsRoute.GET)(get(`/api/sites/${DEMO_SITE_ID}/events?${query}`, { cookie }), site());
    expect(res.status).toBe(200);
    return res.json();
  };

  it("pages newest first with a keyset cursor, and filters by device, zone, kind and time", async () => {
    const first = await list("limit=5");
    expect(first.events.map((e: { eventId: string }) => e.eventId)).toEqual(night.slice(-5).reverse().map((e) => e.id));
    const second = await list(`limit=5&before=${first.nextCursor}`);
    expect(second.events.map((e: { eventId: string }) => e.eventId)).toEqual(night.slice(-10, -5).reverse().map((e) => e.id));

    expect((await list("device=larch-lane-dev-sensor-path")).events).toHaveLength(4);
    expect((await list("zone=larch-lane-zone-flat")).events).toHaveLength(4);
    expect((await list("kind=motion")).events.map((e: { eventId: string }) => e.eventId)).toEqual([NIGHT.falseTriggerId, NIGHT.visitorId]);
    const nightOnly = await list(`from=${NIGHT_WINDOW.to - 6 * 3600_000}&to=${NIGHT_WINDOW.to}`);
    expect(nightOnly.events.map((e: { eventId: string }) => e.eventId)).toEqual(["night-0730-workshop-temp", "night-0640-path-lux", NIGHT.falseTriggerId]);
    const bad = await h(eventsRoute.GET)(get(`/api/sites/${DEMO_SITE_ID}/events?from=10&to=5`, { cookie }), site());
    expect(bad.status).toBe(422);
    expect((await bad.json()).fields.to[0]).toMatch(/after its start/);
  });

  it("the live tail gives what arrived after a sequence number; a live event has its Trace, an imported one none", async () => {
    const { lastSeq } = await list("limit=1");
    const live = { id: "live-tail-1", siteId: DEMO_SITE_ID, at: NIGHT_WINDOW.to + 3600_000, device: "larch-lane-dev-rocker-workshop", kind: "press", value: 1 };
    await ingestEvents({ siteId: DEMO_SITE_ID, batch: [live], source: "gateway" });
    const tail = await list(`afterSeq=${lastSeq}`);
    expect(tail.events.map((e: { eventId: string }) => e.eventId)).toEqual(["live-tail-1"]);
    expect(tail.events[0].outcome).toMatchObject({ fired: 1, actions: 1 });

    const traced = await h(eventRoute.GET)(get("/x", { cookie }), params({ siteId: DEMO_SITE_ID, seq: String(tail.events[0].seq) }));
    const body = await traced.json();
    expect(body.step.trace[0].rules[0]).toMatchObject({ ruleId: "t-workshop-b1", passed: true });
    const [imported] = await getDb().select({ seq: events.seq }).from(events).where(and(eq(events.siteId, DEMO_SITE_ID), eq(events.eventId, NIGHT.falseTriggerId)));
    const none = await (await h(eventRoute.GET)(get("/x", { cookie }), params({ siteId: DEMO_SITE_ID, seq: String(imported.seq) }))).json();
    expect(none.step).toBeNull();
    expect((await h(eventRoute.GET)(get("/x", { cookie }), params({ siteId: DEMO_SITE_ID, seq: "999999" }))).status).toBe(404);
  });

  it("exports the filtered log as NDJSON and CSV that import back unchanged", async () => {
    const q = `from=${NIGHT_WINDOW.from}&to=${NIGHT_WINDOW.to}`;
    const nd = await h(exportRoute.GET)(get(`/x?${q}&format=ndjson`, { cookie }), site());
    expect(nd.headers.get("content-disposition")).toMatch(/larch-lane-studio-events-2024-11-12_2024-11-13\.ndjson/);
    expect(await nd.text()).toBe(ndjson);
    const csv = await h(exportRoute.GET)(get(`/x?${q}&format=csv&zone=larch-lane-zone-flat`, { cookie }), site());
    const text = await csv.text();
    const flat = night.filter((e) => e.device === "larch-lane-dev-rocker-flat");
    expect(text).toBe(CSV_HEADER + flat.map(toCsvLine).join(""));
    const again = await upload("format=csv&mode=commit", text, "text/csv");
    expect(await again.json()).toMatchObject({ inserted: 0, skipped: flat.length });
  });
});
