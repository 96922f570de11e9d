import { beforeAll, describe, expect, it } from "vitest";
import { GET as getSiteBudget } from "@/app/api/sites/[siteId]/energy/route";
import { GET as getDeviceBudget } from "@/app/api/sites/[siteId]/energy/[deviceId]/route";
import { getDb } from "@/db";
import { getNewlyShortDevices, getShortDevices } from "@/db/queries/energy";
import { getRuleSet, saveDraft } from "@/db/queries/rule-sets";
import { events } from "@/db/schema";
import { DEMO_SITE_ID, demoDevices } from "@/db/seed/demo-site";
import { isBatteryFree } from "@/lib/catalogue/device-kinds";
import { evaluateDevice } from "@/lib/energy/model";
import type { EnergySummary } from "@/lib/energy/summary";
import type { DeviceEnergyInput, DeviceEnergyResult } from "@/lib/energy/types";
import { get, params, seedDemoSite, userWithSession } from "./helpers";

const dev = (key: string) => `${DEMO_SITE_ID}-dev-${key}`;
const site = params({ siteId: DEMO_SITE_ID });
let cookie: string;

type Graph = { nodes: { id: string; params: Record<string, unknown> }[]; edges: unknown[] };

async function siteBudget(query = "") {
  const res = await getSiteBudget(get(`/api/sites/${DEMO_SITE_ID}/energy${query}`, { cookie }), site);
  return { status: res.status, body: await res.json() };
}

/** Sets the demo rule's report interval in the draft, as the Canvas would. */
async function draftWithReport(nodeId: string, reportSeconds: number | null, extra?: (g: Graph) => void) {
  const { draftGraph, draftRevision } = await getRuleSet({ siteId: DEMO_SITE_ID });
  const graph = structuredClone(draftGraph) as Graph;
  const node = graph.nodes.find((n) => n.id === nodeId)!;
  if (reportSeconds === null) delete node.params.reportSeconds;
  else node.params.reportSeconds = reportSeconds;
  extra?.(graph);
  await saveDraft({ siteId: DEMO_SITE_ID, graph, expectedRevision: draftRevision, userId: null });
}

beforeAll(async () => {
  await seedDemoSite();
  cookie = (await userWithSession("energy-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" })).cookie;
});

describe("GET /api/sites/{siteId}/energy", () => {
  it("lists every battery-free device with a verdict; textile case A is Short because of the 10 s humidity rule", async () => {
    const { status, body } = await siteBudget();
    expect(status).toBe(200);
    const rows = body.devices as EnergySummary[];
    expect(rows.map((r) => r.deviceId).sort()).toEqual(demoDevices.filter((d) => isBatteryFree(d.kind)).map((d) => d.id).sort());
    const caseA = rows.find((r) => r.deviceId === dev("climate-case-a"))!;
    expect(caseA.verdict).toBe("short");
    expect(caseA.ruleImpact).toEqual({ ruleNodeIds: ["t-case-a-damp"], verdictWithout: "covered" });
    // 86 400 s ÷ 10 s readings + 24 heartbeats.
    expect(caseA.messagesPerDay).toBeCloseTo(8640 + 24, 6);
    const caseB = rows.find((r) => r.deviceId === dev("climate-case-b"))!;
    expect(caseB.verdict).toBe("covered");
    expect(body.source).toBe("active");
  });

  it("reads the draft with ?source=draft: relaxing the rule makes case A Covered while the active rules keep it Short", async () => {
    await draftWithReport("t-case-a-damp", 600);
    const draft = await siteBudget("?source=draft");
    expect(draft.body.devices.find((r: EnergySummary) => r.deviceId === dev("climate-case-a")).verdict).toBe("covered");
    const active = await siteBudget("?source=active");
    expect(active.body.devices.find((r: EnergySummary) => r.deviceId === dev("climate-case-a")).verdict).toBe("short");
    expect((await getShortDevices({ siteId: DEMO_SITE_ID, source: "draft" })).map((d) => d.deviceId)).not.toContain(dev("climate-case-a"));
    expect(await getShortDevices({ siteId: DEMO_SITE_ID, source: "active" })).toEqual([expect.objectContaining({ deviceId: dev("climate-case-a"), ruleNodeIds: ["t-case-a-damp"] })]);
  });

  it("tells Activate which devices a draft would newly make Short", async () => {
    await draftWithReport("t-case-a-damp", 10, (g) => {
      g.nodes.push({ id: "t-case-b-hot", kind: "trigger", type: "temperature-above", params: { device: dev("climate-case-b"), celsius: 24, reportSeconds: 5 } } as never);
      g.nodes.push({ id: "a-case-b-note", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "Case B warm" } } as never);
      g.edges.push({ id: "e-case-b", source: "t-case-b-hot", target: "a-case-b-note" });
    });
    const newly = await getNewlyShortDevices({ siteId: DEMO_SITE_ID });
    expect(newly.map((d) => [d.deviceId, d.ruleNodeIds])).toEqual([[dev("climate-case-b"), ["t-case-b-hot"]]]);
  });

  it("refuses an unknown source with a 422 naming the field", async () => {
    const { status, body } = await siteBudget("?source=live");
    expect(status).toBe(422);
    expect(Object.keys(body.fields)).toEqual(["source"]);
  });

  it("uses the event log's rate of presses for a kinetic switch (gateway events only, not the Test bench)", async () => {
    const base = Date.now() - 2 * 86_400_000;
    const rows = Array.from({ length: 30 }, (_, i) => ({ siteId: DEMO_SITE_ID, eventId: `energy-press-${i}`, at: base + i * 5_760_000, device: dev("rocker-workshop"), kind: "press", value: 1, source: "gateway" as const, receivedAt: base + i * 5_760_000 }));
    rows.push({ siteId: DEMO_SITE_ID, eventId: "energy-bench", at: base, device: dev("rocker-workshop"), kind: "press", value: 1, source: "bench" as never, receivedAt: base });
    await getDb().insert(events).values(rows);
    const res = await getDeviceBudget(get(`/x`, { cookie }), params({ siteId: DEMO_SITE_ID, deviceId: dev("rocker-workshop") }));
    const body = (await res.json()) as { input: DeviceEnergyInput };
    // 30 presses spread over 29 × 96 min ≈ 1.93 days → 2 whole days → 15 a day.
    expect(body.input.power === "kinetic" && body.input.actuationsPerDay.value).toBe(15);
    expect(body.input.observed).toMatchObject({ messages: 30, actuations: 30, days: 2 });
  });
});

describe("GET /api/sites/{siteId}/energy/{deviceId}", () => {
  it("returns the inputs the browser reruns: the same model gives the same result, and a what-if can relax it", async () => {
    const res = await getDeviceBudget(get(`/x`, { cookie }), params({ siteId: DEMO_SITE_ID, deviceId: dev("climate-case-a") }));
    expect(res.status).toBe(200);
    const body = (await res.json()) as { input: DeviceEnergyInput; result: DeviceEnergyResult };
    const again = evaluateDevice(body.input);
    expect(again.verdict).toBe(body.result.verdict);
    expect(again.spendPerDayJ).toBeCloseTo(body.result.spendPerDayJ, 12);
    expect(again.week?.storedJ).toEqual(body.result.week?.storedJ);
    expect(body.result.week?.storedJ).toHaveLength(168);
    expect(body.result.week!.brownoutHours.length).toBeGreaterThan(0);
    expect(evaluateDevice(body.input, { reportingIntervalS: 600 }).verdict).toBe("covered");
    // Every number comes with its formula and inputs.
    for (const e of body.result.explanations) {
      expect(e.formula.length).toBeGreaterThan(0);
      expect(e.inputs.length).toBeGreaterThan(0);
    }
  });

  it("answers 404 for a mains device or an unknown one, and 422 for a bad id", async () => {
    const mains = await getDeviceBudget(get(`/x`, { cookie }), params({ siteId: DEMO_SITE_ID, deviceId: dev("dl-shop-1") }));
    expect(mains.status).toBe(404);
    const none = await getDeviceBudget(get(`/x`, { cookie }), params({ siteId: DEMO_SITE_ID, deviceId: "no-such-device" }));
    expect(none.status).toBe(404);
    const bad = await getDeviceBudget(get(`/x`, { cookie }), params({ siteId: DEMO_SITE_ID, deviceId: "Bad/Id" }));
    expect(bad.status).toBe(422);
  });
});
