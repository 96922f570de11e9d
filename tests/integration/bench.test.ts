import { beforeAll, describe, expect, it } from "vitest";
import * as benchRoute from "@/app/api/sites/[siteId]/bench/route";
import * as actionsRoute from "@/app/api/sites/[siteId]/bench/actions/route";
import * as clockRoute from "@/app/api/sites/[siteId]/bench/clock/route";
import * as dateRoute from "@/app/api/sites/[siteId]/bench/date/route";
import * as resetRoute from "@/app/api/sites/[siteId]/bench/reset/route";
import * as scenariosRoute from "@/app/api/sites/[siteId]/bench/scenarios/route";
import * as scenarioRoute from "@/app/api/sites/[siteId]/bench/scenarios/[scenarioId]/route";
import * as playRoute from "@/app/api/sites/[siteId]/bench/scenarios/[scenarioId]/play/route";
import { getDb } from "@/db";
import { createDevice, deleteDevice } from "@/db/queries/devices";
import { engineStates, events, gatewayCommands, noticesOutbox } from "@/db/schema";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import type { BenchAction, BenchScenarioDto, BenchView, ScenarioPlayResult } from "@/lib/validation/bench";
import { params, req, seedDemoSite, userWithSession } from "./helpers";

const site = () => params({ siteId: DEMO_SITE_ID });
const dev = (key: string) => `${DEMO_SITE_ID}-dev-${key}`;
const PATH_LIGHTS = [dev("light-path-1"), dev("light-path-2")];
let manager = "";
let integrator = "";

async function act(cookie: string, action: BenchAction, deliverNotices = false) {
  return actionsRoute.POST(req("POST", "/x", { cookie, body: { action, deliverNotices } }), site());
}
async function ok<T = BenchView>(res: Response | Promise<Response>): Promise<T> {
  const r = await res;
  const body = await r.json();
  expect(r.status, JSON.stringify(body).slice(0, 400)).toBeLessThan(300);
  return body as T;
}
const lastSteps = (v: BenchView, n: number) => v.steps.slice(-n);

beforeAll(async () => {
  await seedDemoSite();
  manager = (await userWithSession("bench-manager@example.invalid", { siteId: DEMO_SITE_ID, role: "manager" })).cookie;
  integrator = (await userWithSession("bench-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" })).cookie;
});

describe("Test bench: the visitor after closing, the timer, the fire latch", () => {
  it("opens a session on the active rules with the site's devices, zones and plans", async () => {
    const view = await ok(benchRoute.GET(req("GET", "/x", { cookie: manager }), site()));
    expect(view.session.source).toBe("active");
    expect(view.session.versionNumber).toBe(1);
    expect(view.devices).toHaveLength(28);
    expect(view.devices.find((d) => d.id === dev("rocker-shop-door"))!.buttons).toBe(4);
    expect(view.devices.find((d) => d.id === dev("rocker-workshop"))!.buttons).toBe(2);
    expect(view.floors.map((f) => f.name)).toEqual(["Ground floor", "Upper floor (flat)"]);
    expect(view.state.now).not.toBeNull();
    expect(view.canClearEmergency).toBe(true);
  });

  it("set date runs that day from midnight, so the 17:30 closing has fired by 18:30", async () => {
    const view = await ok(dateRoute.POST(req("POST", "/x", { cookie: manager, body: { date: "2025-01-15", time: "18:30" } }), site()));
    // 2025-01-15 is a Wednesday; the site's zone WET is UTC+0 in winter (IANA tz database).
    expect(view.state.now).toBe(Date.UTC(2025, 0, 15, 18, 30));
    expect(view.state.mode).toBe("closed");
    const modeChanges = view.steps.flatMap((s) => s.output.changes).filter((c) => c.kind === "mode");
    // The site starts "open", so 09:00 finds it open already; 17:30 closes it.
    expect(modeChanges.map((c) => (c.kind === "mode" ? [c.from, c.to, c.at] : null))).toEqual([["open", "closed", Date.UTC(2025, 0, 15, 17, 30)]]);
    expect(view.steps.flatMap((s) => s.output.trace).filter((t) => t.trigger.type === "time-of-day").map((t) => t.at)).toEqual([Date.UTC(2025, 0, 15, 9, 0), Date.UTC(2025, 0, 15, 17, 30)]);
  });

  it("a visitor after closing: path lights up, the notice would send, the trace names the rule — and nothing live is written", async () => {
    await ok(act(manager, { type: "reading", device: dev("sensor-path"), measure: "light-level", value: 4 }));
    const view = await ok(act(manager, { type: "walk-past", device: dev("sensor-path") }));
    for (const id of PATH_LIGHTS) {
      expect(view.state.levels[id]).toBe(100);
      expect(view.state.holding[id].level).toBe("sensor");
    }
    const [detection, silence] = lastSteps(view, 2);
    expect(detection.input.action.type).toBe("walk-past");
    expect(detection.input.part).toMatchObject({ event: { kind: "motion", value: true } });
    expect(silence.input.part).toMatchObject({ event: { kind: "motion", value: false, at: Date.UTC(2025, 0, 15, 18, 30, 5) } });
    expect(detection.output.notices).toEqual([expect.objectContaining({ recipient: "role:occupant", text: "Someone is on the front path (18:30).", kind: "visitor" })]);
    const rule = detection.output.trace.flatMap((t) => t.rules).find((r) => r.ruleId === "t-path-motion>g-path-after-hours>g-path-dark")!;
    expect(rule.passed).toBe(true);
    expect(rule.gates.map((g) => [g.type, g.passed, Object.values(g.facts)[0]])).toEqual([
      ["site-mode-is", true, "closed"],
      ["light-level-below", true, 4],
    ]);
    // Both path lights follow one group message (Mesh Profile 1.0.1 §3.4.2: 0xC000–0xFEFF group).
    expect(detection.output.commands).toEqual([expect.objectContaining({ addressing: "group", destination: 0xc004, devices: PATH_LIGHTS })]);
    const db = getDb();
    expect(await db.select().from(events)).toEqual([]);
    expect(await db.select().from(engineStates)).toEqual([]);
    expect(await db.select().from(gatewayCommands)).toEqual([]);
    expect(await db.select().from(noticesOutbox)).toEqual([]);
  });

  it("skipping ahead 10 minutes fires the 3-minute vacancy rule: the path lights go down", async () => {
    const view = await ok(clockRoute.POST(req("POST", "/x", { cookie: manager, body: { minutes: 10 } }), site()));
    expect(view.state.now).toBe(Date.UTC(2025, 0, 15, 18, 40, 5));
    for (const id of PATH_LIGHTS) expect(view.state.levels[id]).toBe(0);
    const [step] = lastSteps(view, 1);
    const off = step.output.trace.find((t) => t.trigger.type === "vacancy")!;
    expect(off.at).toBe(Date.UTC(2025, 0, 15, 18, 33, 0));
    expect(off.actions[0].outcome).toMatch(/Front path to 0 %/);
  });

  it("skip to a time of day goes to its next occurrence in the site's time zone", async () => {
    const view = await ok(clockRoute.POST(req("POST", "/x", { cookie: manager, body: { time: "08:00" } }), site()));
    expect(view.state.now).toBe(Date.UTC(2025, 0, 16, 8, 0));
  });

  it("the fire input latches the emergency; rocker presses cannot move held lights; only a clear ends it", async () => {
    let view = await ok(act(manager, { type: "press", device: dev("rocker-shop-door"), button: 1 }));
    expect(view.state.levels[dev("dl-shop-1")]).toBe(80);
    view = await ok(act(manager, { type: "fire-alarm", device: dev("fire-input"), state: "active" }));
    expect(view.state.emergency.active).toBe(true);
    expect(view.state.levels[dev("dl-shop-1")]).toBe(0);
    expect(view.state.levels[dev("dl-escape-1")]).toBe(100);
    view = await ok(act(manager, { type: "press", device: dev("rocker-shop-door"), button: 1 }));
    expect(view.state.emergency.active).toBe(true);
    expect(view.state.levels[dev("dl-shop-1")]).toBe(0);
    expect(view.state.holding[dev("dl-shop-1")].level).toBe("emergency");
    expect(lastSteps(view, 1)[0].output.trace.flatMap((t) => t.actions).map((a) => a.outcome).join(" ")).toMatch(/held by Emergency/);
    view = await ok(act(manager, { type: "fire-alarm", device: dev("fire-input"), state: "cleared" }));
    expect(view.state.emergency.active).toBe(true);
    view = await ok(act(manager, { type: "clear-emergency" }));
    expect(view.state.emergency.active).toBe(false);
    expect(lastSteps(view, 1)[0].output.trace[0].note).toMatch(/Cleared in the console by bench-manager/);
  });

  it("delivers notices for real only when asked, marked as a test and keyed to the session", async () => {
    await ok(dateRoute.POST(req("POST", "/x", { cookie: manager, body: { date: "2025-01-15", time: "19:00" } }), site()));
    const view = await ok(act(manager, { type: "walk-past", device: dev("sensor-path") }, true));
    const rows = await getDb().select().from(noticesOutbox);
    expect(rows).toHaveLength(1);
    expect(rows[0].dedupeKey.startsWith(`bench:${view.session.id}:`)).toBe(true);
    expect(rows[0]).toMatchObject({ siteId: DEMO_SITE_ID, recipient: "role:occupant", kind: "visitor", url: `/sites/${DEMO_SITE_ID}/bench`, text: "[Test bench] Someone is on the front path (19:00)." });
    expect(lastSteps(view, 2)[0].input.delivered).toBe(true);
  });
});

describe("bad input", () => {
  it("refuses readings outside a sensor's range with a field message (422)", async () => {
    for (const [measure, value] of [["light-level", 250_000], ["light-level", -1], ["temperature", 200], ["humidity", 101]] as const) {
      const res = await act(manager, { type: "reading", device: dev("climate-workshop"), measure, value });
      expect(res.status).toBe(422);
      expect((await res.json()).fields["action.value"][0]).toMatch(/outside what the sensor reports/);
    }
  });

  it("refuses a device the site lacks, a report it cannot make and a button it has not (422)", async () => {
    const missing = await act(manager, { type: "walk-past", device: "larch-lane-dev-nope" });
    expect(missing.status).toBe(422);
    expect((await missing.json()).fields["action.device"][0]).toMatch(/No device/);
    const wrong = await act(manager, { type: "walk-past", device: dev("contact-back") });
    expect((await wrong.json()).fields["action.type"][0]).toMatch(/does not report motion/);
    const button = await act(manager, { type: "press", device: dev("rocker-workshop"), button: 3 });
    expect(button.status).toBe(422);
    expect((await button.json()).fields["action.button"][0]).toMatch(/has 2 buttons/);
    const bad = await clockRoute.POST(req("POST", "/x", { cookie: manager, body: { minutes: 0 } }), site());
    expect(bad.status).toBe(422);
    const date = await dateRoute.POST(req("POST", "/x", { cookie: manager, body: { date: "2025-02-30", time: "25:00" } }), site());
    expect(Object.keys((await date.json()).fields).sort()).toEqual(["date", "time"]);
  });
});

describe("scenarios", () => {
  it("ships the two demo scenarios and plays the evening visitor to its end", async () => {
    const { scenarios } = await ok<{ scenarios: BenchScenarioDto[] }>(scenariosRoute.GET(req("GET", "/x", { cookie: integrator }), site()));
    expect(scenarios.map((s) => s.name)).toEqual(["evening visitor", "fire drill"]);
    const visitor = scenarios.find((s) => s.name === "evening visitor")!;
    const result = await ok<ScenarioPlayResult>(playRoute.POST(req("POST", "/x", { cookie: integrator, body: {} }), params({ siteId: DEMO_SITE_ID, scenarioId: visitor.id })));
    expect(result).toMatchObject({ played: 4, stopped: null });
    expect(result.view.steps.some((s) => s.output.notices.some((n) => n.text.startsWith("Someone is on the front path")))).toBe(true);
    for (const id of PATH_LIGHTS) expect(result.view.state.levels[id]).toBe(0);
    const fire = scenarios.find((s) => s.name === "fire drill")!;
    const drill = await ok<ScenarioPlayResult>(playRoute.POST(req("POST", "/x", { cookie: integrator, body: {} }), params({ siteId: DEMO_SITE_ID, scenarioId: fire.id })));
    expect(drill).toMatchObject({ played: 5, stopped: null });
    expect(drill.view.state.emergency.active).toBe(false);
    expect(drill.view.steps.some((s) => s.output.changes.some((c) => c.kind === "emergency" && c.isActive))).toBe(true);
  });

  it("saves what the bench did since its reset, refuses a duplicate name, and stops at a step naming a deleted device", async () => {
    const temp = await createDevice({ siteId: DEMO_SITE_ID, fields: { name: "Temporary call button", kind: "kinetic-call-button", zoneId: null, unicastAddress: 0x0100, elementCount: 1, profile: {}, floorId: null, x: null, y: null } });
    await ok(resetRoute.POST(req("POST", "/x", { cookie: integrator, body: {} }), site()));
    await ok(act(integrator, { type: "call", device: temp.id }));
    await ok(act(integrator, { type: "skip", minutes: 5 }));
    const made = await ok<{ scenario: BenchScenarioDto }>(scenariosRoute.POST(req("POST", "/x", { cookie: integrator, body: { name: "counter call", fromSession: true } }), site()));
    expect(made.scenario.steps).toEqual([{ type: "call", device: temp.id }, { type: "skip", minutes: 5 }]);
    const dup = await scenariosRoute.POST(req("POST", "/x", { cookie: integrator, body: { name: "counter call", steps: [{ type: "skip", minutes: 1 }] } }), site());
    expect(dup.status).toBe(409);
    const edited = await ok<{ scenario: BenchScenarioDto }>(
      scenarioRoute.PUT(req("PUT", "/x", { cookie: integrator, body: { name: "counter call", steps: [{ type: "skip", minutes: 1 }, ...made.scenario.steps] } }), params({ siteId: DEMO_SITE_ID, scenarioId: made.scenario.id })),
    );
    expect(edited.scenario.steps).toHaveLength(3);
    await deleteDevice({ siteId: DEMO_SITE_ID, deviceId: temp.id });
    const played = await ok<ScenarioPlayResult>(playRoute.POST(req("POST", "/x", { cookie: integrator, body: {} }), params({ siteId: DEMO_SITE_ID, scenarioId: made.scenario.id })));
    expect(played.played).toBe(1);
    expect(played.stopped).toEqual({ step: 2, message: expect.stringMatching(/^Step 2 stopped the playback: No device ".+" on this site/) });
    const del = await scenarioRoute.DELETE(req("DELETE", "/x", { cookie: integrator }), params({ siteId: DEMO_SITE_ID, scenarioId: made.scenario.id }));
    expect(del.status).toBe(200);
    const again = await scenarioRoute.GET(req("GET", "/x", { cookie: integrator }), params({ siteId: DEMO_SITE_ID, scenarioId: made.scenario.id }));
    expect(again.status).toBe(404);
  });

  it("switches to the draft without losing the sandbox state", async () => {
    const before = await ok(benchRoute.GET(req("GET", "/x", { cookie: integrator }), site()));
    const view = await ok(benchRoute.PATCH(req("PATCH", "/x", { cookie: integrator, body: { source: "draft" } }), site()));
    expect(view.session).toMatchObject({ source: "draft", draftRevision: 1, versionId: null });
    expect(view.state.now).toBe(before.state.now);
    const after = await ok(act(integrator, { type: "press", device: dev("rocker-workshop"), button: 1 }));
    expect(after.state.levels[dev("dl-workshop-1")]).toBe(100);
  });
});
