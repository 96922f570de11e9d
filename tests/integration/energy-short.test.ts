import { beforeAll, describe, expect, it } from "vitest";
import { GET as getShort } from "@/app/api/sites/[siteId]/energy/short/route";
import { getRuleSet, saveDraft } from "@/db/queries/rule-sets";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import type { ShortDevicesDto } from "@/lib/validation/energy";
import { get, params, seedDemoSite, userWithSession } from "./helpers";

const dev = (key: string) => `${DEMO_SITE_ID}-dev-${key}`;
const site = params({ siteId: DEMO_SITE_ID });
let cookie: string;

type Graph = { nodes: { id: string; kind?: string; type?: string; params: Record<string, unknown> }[]; edges: { id: string; source: string; target: string }[] };

async function short(query = "") {
  const res = await getShort(get(`/api/sites/${DEMO_SITE_ID}/energy/short${query}`, { cookie }), site);
  return { status: res.status, body: (await res.json()) as ShortDevicesDto & { fields?: Record<string, string[]> } };
}

/** Edits the draft as the Canvas's autosave would. */
async function editDraft(edit: (g: Graph) => void) {
  const { draftGraph, draftRevision } = await getRuleSet({ siteId: DEMO_SITE_ID });
  const graph = structuredClone(draftGraph) as Graph;
  edit(graph);
  await saveDraft({ siteId: DEMO_SITE_ID, graph, expectedRevision: draftRevision, userId: null });
}
const setReport = (nodeId: string, seconds: number) => (g: Graph) => {
  g.nodes.find((n) => n.id === nodeId)!.params.reportSeconds = seconds;
};

beforeAll(async () => {
  await seedDemoSite();
  cookie = (await userWithSession("short-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" })).cookie;
});

describe("GET /api/sites/{siteId}/energy/short", () => {
  it("lists textile case A as Short under the seeded rules, naming the 10 s humidity trigger; nothing is newly Short", async () => {
    for (const query of ["", "?source=active", "?source=draft"]) {
      const { status, body } = await short(query);
      expect(status).toBe(200);
      expect(body.source).toBe(query.includes("draft") ? "draft" : "active");
      expect(body.short).toEqual([{ deviceId: dev("climate-case-a"), name: "Textile case A climate sensor", margin: expect.any(Number), ruleNodeIds: ["t-case-a-damp"] }]);
      expect(body.short[0].margin).toBeLessThan(0);
      expect(body.newlyShort).toEqual([]);
    }
  });

  it("relaxing the trigger to a 600 s report in the draft takes case A off the draft's list, not the active one", async () => {
    await editDraft(setReport("t-case-a-damp", 600));
    expect((await short("?source=draft")).body.short).toEqual([]);
    expect((await short("?source=active")).body.short.map((d) => d.deviceId)).toEqual([dev("climate-case-a")]);
    // Fewer Short devices is never a warning.
    expect((await short("?source=draft")).body.newlyShort).toEqual([]);
  });

  it("a draft that makes another device Short lists it in newlyShort (both sources), with the rule that does it", async () => {
    await editDraft((g) => {
      g.nodes.push({ id: "t-case-b-warm", kind: "trigger", type: "temperature-above", params: { device: dev("climate-case-b"), celsius: 24, reportSeconds: 5 } });
      g.nodes.push({ id: "a-case-b-note", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "Case B warm" } });
      g.edges.push({ id: "e-case-b-warm", source: "t-case-b-warm", target: "a-case-b-note" });
    });
    const draft = await short("?source=draft");
    expect(draft.body.short.map((d) => [d.deviceId, d.ruleNodeIds])).toEqual([[dev("climate-case-b"), ["t-case-b-warm"]]]);
    expect(draft.body.newlyShort.map((d) => [d.deviceId, d.name, d.ruleNodeIds])).toEqual([[dev("climate-case-b"), "Textile case B climate sensor", ["t-case-b-warm"]]]);
    const active = await short("?source=active");
    expect(active.body.short.map((d) => d.deviceId)).toEqual([dev("climate-case-a")]);
    expect(active.body.newlyShort.map((d) => d.deviceId)).toEqual([dev("climate-case-b")]);
  });

  it("refuses an unknown source or an unknown parameter with a 422 naming the field", async () => {
    const bad = await short("?source=live");
    expect(bad.status).toBe(422);
    expect(Object.keys(bad.body.fields ?? {})).toEqual(["source"]);
    const typo = await short("?sorce=draft");
    expect(typo.status).toBe(422);
  });
});
