import { beforeAll, describe, expect, it } from "vitest";
import * as rulesRoute from "@/app/api/sites/[siteId]/rules/route";
import * as draftRoute from "@/app/api/sites/[siteId]/rules/draft/route";
import * as activateRoute from "@/app/api/sites/[siteId]/rules/activate/route";
import * as versionsRoute from "@/app/api/sites/[siteId]/rules/versions/route";
import * as rollbackRoute from "@/app/api/sites/[siteId]/rules/versions/[versionId]/activate/route";
import * as diffRoute from "@/app/api/sites/[siteId]/rules/diff/route";
import { getDb } from "@/db";
import { createDevice, deleteDevice, type DeviceFields } from "@/db/queries/devices";
import { loadEngineInput } from "@/db/queries/live";
import { getRuleSet } from "@/db/queries/rule-sets";
import { createSite } from "@/db/queries/sites";
import { ruleSetActivations } from "@/db/schema";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { chainEdges, type RuleGraph } from "@/lib/rules/graph";
import type { DiffDto, RulesDto, VersionsDto } from "@/lib/validation/rules";
import { params, req, seedDemoSite, userWithSession } from "./helpers";

type Handler = (r: Request, c: { params: Promise<Record<string, string>> }) => Promise<Response>;
const h = (f: unknown) => f as Handler;
const site = () => params({ siteId: DEMO_SITE_ID });
let manager = "";
let occupant = "";
let otherSiteDevice = "";
const contact = (name: string): DeviceFields => ({ name, kind: "solar-contact", zoneId: null, elementCount: 1, profile: {}, floorId: null, x: null, y: null });

const getRules = async () => (await (await h(rulesRoute.GET)(req("GET", "/x", { cookie: manager }), site())).json()) as RulesDto;
const put = (graph: unknown, revision: number, cookie = manager) => h(draftRoute.PUT)(req("PUT", "/x", { cookie, body: { graph, revision } }), site());

/** "Back door left open 10 min after closing → notice to the integrator and the manager", as the e2e builds it. */
function withBackDoorRule(graph: RuleGraph): RuleGraph {
  return {
    nodes: [
      ...graph.nodes,
      { id: "t-door", kind: "trigger", type: "contact-left-open", params: { device: "larch-lane-dev-contact-back", minutes: 10 } },
      { id: "g-closed", kind: "gate", type: "site-mode-is", params: { modes: ["closed"] } },
      { id: "a-tell", kind: "action", type: "notice", params: { to: { role: "integrator" }, channels: ["push", "in-app"], text: "Back door open {time}" } },
      { id: "a-tell-2", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["push", "in-app"], text: "Back door open {time}" } },
    ],
    edges: [...graph.edges, ...chainEdges("t-door", "g-closed", "a-tell"), ...chainEdges("g-closed", "a-tell-2")],
  } as RuleGraph;
}

beforeAll(async () => {
  await seedDemoSite();
  manager = (await userWithSession("r-manager@example.invalid", { siteId: DEMO_SITE_ID, role: "manager" })).cookie;
  occupant = (await userWithSession("r-occupant@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant" })).cookie;
  const outsider = await userWithSession("r-outsider@example.invalid");
  const other = await createSite({ userId: outsider.userId, name: "Other studio", address: "", timeZone: "UTC", latitude: 0, longitude: 0 });
  otherSiteDevice = (await createDevice({ siteId: other.id, fields: contact("Their contact") })).id;
});

describe("Rule set routes", () => {
  it("shows the seeded draft, the active version 1 and no problems", async () => {
    const rules = await getRules();
    expect(rules.draft.revision).toBe(1);
    expect(rules.active?.number).toBe(1);
    expect(rules.problems).toEqual([]);
    expect(rules.draft.graph.nodes.length).toBeGreaterThan(40);
  });

  it("saves with the revision and answers 409 with the current revision to a stale save, keeping the first", async () => {
    const { draft } = await getRules();
    const first = await put(withBackDoorRule(draft.graph), draft.revision);
    expect(first.status).toBe(200);
    const saved = await first.json();
    expect(saved.revision).toBe(draft.revision + 1);
    expect(saved.problems).toEqual([]);

    const stale = await put({ nodes: [], edges: [] }, draft.revision);
    expect(stale.status).toBe(409);
    expect(await stale.json()).toMatchObject({ error: "conflict", revision: draft.revision + 1 });
    const after = await getRules();
    expect(after.draft.graph.nodes.some((n) => n.id === "t-door")).toBe(true);
    expect(after.draft.updatedBy).toBe("r-manager");
  });

  it("returns the engine's problems for an incomplete draft (saved, not refused)", async () => {
    const { draft } = await getRules();
    const incomplete = { nodes: [...draft.graph.nodes, { id: "lonely", kind: "action", type: "relay-on", params: { device: "larch-lane-dev-fan-workshop" } }], edges: draft.graph.edges };
    const res = await put(incomplete, draft.revision);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body.problems).toContainEqual({ nodeId: "lonely", severity: "warning", message: "This action is not connected to anything." });
    // Put it back for the next tests.
    expect((await put(draft.graph, body.revision)).status).toBe(200);
  });

  it("refuses malformed graphs, foreign or deleted devices and oversize graphs, leaving the draft as it was", async () => {
    const before = await getRuleSet({ siteId: DEMO_SITE_ID });
    const unchanged = async () => {
      const now = await getRuleSet({ siteId: DEMO_SITE_ID });
      expect(now.draftRevision).toBe(before.draftRevision);
      expect(now.draftGraph).toEqual(before.draftGraph);
    };

    const malformed = await put({ nodes: [{ id: "x", kind: "trigger", type: "vacancy", params: { device: "larch-lane-dev-sensor-path", minutes: 0 } }], edges: [] }, before.draftRevision);
    expect(malformed.status).toBe(422);
    const m = await malformed.json();
    expect(m.message).toMatch(/not valid: Enter minutes as a whole number from 1 to 240/);
    expect(m.fields["graph.nodes.0.params.minutes"]).toEqual(["Enter minutes as a whole number from 1 to 240."]);
    expect((await put("not a graph", before.draftRevision)).status).toBe(422);
    await unchanged();

    const foreign = await put({ nodes: [{ id: "t", kind: "trigger", type: "contact-opened", params: { device: otherSiteDevice } }], edges: [] }, before.draftRevision);
    expect(foreign.status).toBe(422);
    expect((await foreign.json()).fields["graph.nodes.0.params"][0]).toMatch(/is not on this site/);
    await unchanged();

    const doomed = await createDevice({ siteId: DEMO_SITE_ID, fields: contact("Soon gone") });
    await deleteDevice({ siteId: DEMO_SITE_ID, deviceId: doomed.id });
    const deleted = await put({ nodes: [{ id: "t", kind: "trigger", type: "contact-opened", params: { device: doomed.id } }], edges: [] }, before.draftRevision);
    expect(deleted.status).toBe(422);
    await unchanged();

    const many = Array.from({ length: 2001 }, (_, i) => ({ id: `n${i}`, kind: "gate", type: "emergency-not-active", params: {} }));
    expect((await put({ nodes: many, edges: [] }, before.draftRevision)).status).toBe(413);
    const huge = await put({ nodes: [{ id: "t", kind: "trigger", type: "timer-fired", params: { name: "x".repeat(1_100_000) } }], edges: [] }, before.draftRevision);
    expect(huge.status).toBe(413);
    await unchanged();

    // Occupants never reach the Canvas, whatever they send.
    expect((await put(before.draftGraph, before.draftRevision, occupant)).status).toBe(403);
    await unchanged();
  });

  it("shows the change summary, activates version 2, records it, and rolls back to version 1", async () => {
    const { draft } = await getRules();
    const diffRes = await h(diffRoute.GET)(req("GET", "/x?from=active&to=draft", { cookie: manager }), site());
    const diff = (await diffRes.json()) as DiffDto;
    expect(diff.added).toEqual(["When Back door contact is left open for 10 min, only when the site mode is closed, notify the integrators by push and in-app: “Back door open {time}” and notify the managers by push and in-app: “Back door open {time}”"]);
    expect(diff.removed).toEqual([]);
    expect(diff.sentences[0]).toMatch(/^Added: When Back door contact/);

    const stale = await h(activateRoute.POST)(req("POST", "/x", { cookie: manager, body: { revision: draft.revision - 1 } }), site());
    expect(stale.status).toBe(409);

    const ok = await h(activateRoute.POST)(req("POST", "/x", { cookie: manager, body: { revision: draft.revision } }), site());
    expect(ok.status).toBe(200);
    const v2 = await ok.json();
    expect(v2.number).toBe(2);
    const engine = await loadEngineInput(DEMO_SITE_ID);
    expect(engine.versionId).toBe(v2.versionId);
    expect(engine.rules.some((r) => r.event.params.trigger.nodeId === "t-door")).toBe(true);

    const none = await (await h(diffRoute.GET)(req("GET", "/x", { cookie: manager }), site())).json();
    expect(none.sentences).toEqual([]);

    const versions = (await (await h(versionsRoute.GET)(req("GET", "/x", { cookie: manager }), site())).json()) as VersionsDto;
    expect(versions.versions.map((v) => [v.number, v.isActive])).toEqual([[2, true], [1, false]]);
    expect(versions.versions[0].createdBy).toBe("r-manager");
    expect(versions.versions[0].activations).toHaveLength(1);

    const v1 = versions.versions[1].id;
    const back = await h(rollbackRoute.POST)(req("POST", "/x", { cookie: manager }), params({ siteId: DEMO_SITE_ID, versionId: v1 }));
    expect(back.status).toBe(200);
    expect(await back.json()).toEqual({ versionId: v1, number: 1 });
    expect((await loadEngineInput(DEMO_SITE_ID)).versionId).toBe(v1);
    const rows = await getDb().select().from(ruleSetActivations);
    // The seed's activation of version 1, then version 2's, then the rollback's.
    expect(rows.map((r) => r.versionId)).toEqual([v1, v2.versionId, v1]);
    const after = (await (await h(versionsRoute.GET)(req("GET", "/x", { cookie: manager }), site())).json()) as VersionsDto;
    expect(after.versions[1]).toMatchObject({ number: 1, isActive: true });
    expect(after.versions[1].activations.map((a) => a.by).sort()).toEqual([null, "r-manager"].sort());
    // The draft is left alone by a rollback.
    expect((await getRules()).draft.revision).toBe(draft.revision);
    // Another site's version id is not found.
    expect((await h(rollbackRoute.POST)(req("POST", "/x", { cookie: manager }), params({ siteId: DEMO_SITE_ID, versionId: "nope" }))).status).toBe(404);
  });

  it("refuses to activate a draft with errors (422 with the problems)", async () => {
    const { draft } = await getRules();
    const broken = { nodes: [...draft.graph.nodes, { id: "orphan", kind: "action", type: "clear-emergency", params: {} }, { id: "g-x", kind: "gate", type: "emergency-not-active", params: {} }], edges: [...draft.graph.edges, ...chainEdges("g-x", "orphan")] };
    const saved = await (await put(broken, draft.revision)).json();
    const res = await h(activateRoute.POST)(req("POST", "/x", { cookie: manager, body: { revision: saved.revision } }), site());
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.problems).toContainEqual({ nodeId: "orphan", severity: "error", message: "No trigger reaches this action, so it never runs." });
    const versions = (await (await h(versionsRoute.GET)(req("GET", "/x", { cookie: manager }), site())).json()) as VersionsDto;
    expect(versions.versions).toHaveLength(2);
  });
});
