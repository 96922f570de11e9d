import { beforeAll, beforeEach, describe, expect, it } from "vitest";
import * as sitesRoute from "@/app/api/sites/route";
import * as overviewRoute from "@/app/api/sites/[siteId]/overview/route";
import * as membersRoute from "@/app/api/sites/[siteId]/members/route";
import * as memberRoute from "@/app/api/sites/[siteId]/members/[userId]/route";
import * as invitesRoute from "@/app/api/sites/[siteId]/invites/route";
import * as inviteRoute from "@/app/api/sites/[siteId]/invites/[inviteId]/route";
import * as resendRoute from "@/app/api/sites/[siteId]/invites/[inviteId]/resend/route";
import * as passwordRoute from "@/app/api/auth/password/route";
import * as devicesRoute from "@/app/api/sites/[siteId]/devices/route";
import * as deviceRoute from "@/app/api/sites/[siteId]/devices/[deviceId]/route";
import * as bulkZoneRoute from "@/app/api/sites/[siteId]/devices/bulk-zone/route";
import * as zonesRoute from "@/app/api/sites/[siteId]/zones/route";
import * as zoneRoute from "@/app/api/sites/[siteId]/zones/[zoneId]/route";
import * as scenesRoute from "@/app/api/sites/[siteId]/scenes/route";
import * as floorsRoute from "@/app/api/sites/[siteId]/floors/route";
import * as floorRoute from "@/app/api/sites/[siteId]/floors/[floorId]/route";
import * as planRoute from "@/app/api/sites/[siteId]/floors/[floorId]/plan/route";
import * as importRoute from "@/app/api/sites/[siteId]/devices/import/route";
import * as exportRoute from "@/app/api/sites/[siteId]/devices/export/route";
import * as siteRoute from "@/app/api/sites/[siteId]/route";
import * as keysRoute from "@/app/api/sites/[siteId]/keys/route";
import * as keyRoute from "@/app/api/sites/[siteId]/keys/[keyId]/route";
import * as emergencyClearRoute from "@/app/api/sites/[siteId]/emergency/clear/route";
import * as sceneRoute from "@/app/api/sites/[siteId]/scenes/[sceneId]/route";
import * as pushConfigRoute from "@/app/api/push/config/route";
import * as pushSubscriptionsRoute from "@/app/api/push/subscriptions/route";
import * as pushDemoRoute from "@/app/api/push/demo/route";
import * as pushDemoReceiveRoute from "@/app/api/push/demo/receive/route";
import * as inboxRoute from "@/app/api/notices/inbox/route";
import * as inboxUnreadRoute from "@/app/api/notices/inbox/unread/route";
import * as inboxReadRoute from "@/app/api/notices/inbox/read/route";
import * as noticePrefsRoute from "@/app/api/notices/sites/[siteId]/preferences/route";
import * as energyRoute from "@/app/api/sites/[siteId]/energy/route";
import * as deviceEnergyRoute from "@/app/api/sites/[siteId]/energy/[deviceId]/route";
import * as shortEnergyRoute from "@/app/api/sites/[siteId]/energy/short/route";
import * as benchRoute from "@/app/api/sites/[siteId]/bench/route";
import * as benchResetRoute from "@/app/api/sites/[siteId]/bench/reset/route";
import * as benchActionsRoute from "@/app/api/sites/[siteId]/bench/actions/route";
import * as benchClockRoute from "@/app/api/sites/[siteId]/bench/clock/route";
import * as benchDateRoute from "@/app/api/sites/[siteId]/bench/date/route";
import * as benchScenariosRoute from "@/app/api/sites/[siteId]/bench/scenarios/route";
import * as benchScenarioRoute from "@/app/api/sites/[siteId]/bench/scenarios/[scenarioId]/route";
import * as benchPlayRoute from "@/app/api/sites/[siteId]/bench/scenarios/[scenarioId]/play/route";
import * as rulesRoute from "@/app/api/sites/[siteId]/rules/route";
import * as rulesDraftRoute from "@/app/api/sites/[siteId]/rules/draft/route";
import * as rulesActivateRoute from "@/app/api/sites/[siteId]/rules/activate/route";
import * as rulesVersionsRoute from "@/app/api/sites/[siteId]/rules/versions/route";
import * as rulesRollbackRoute from "@/app/api/sites/[siteId]/rules/versions/[versionId]/activate/route";
import * as rulesDiffRoute from "@/app/api/sites/[siteId]/rules/diff/route";
import { getRuleSet } from "@/db/queries/rule-sets";
import * as eventsRoute from "@/app/api/sites/[siteId]/events/route";
import * as eventRoute from "@/app/api/sites/[siteId]/events/[seq]/route";
import * as eventsExportRoute from "@/app/api/sites/[siteId]/events/export/route";
import * as eventsImportRoute from "@/app/api/sites/[siteId]/events/import/route";
import * as replaysRoute from "@/app/api/sites/[siteId]/replays/route";
import * as replayRoute from "@/app/api/sites/[siteId]/replays/[jobId]/route";
import * as replayCancelRoute from "@/app/api/sites/[siteId]/replays/[jobId]/cancel/route";
import { insertImportedEvents } from "@/db/queries/events";
import { events as eventLog } from "@/db/schema";
import { eq as eqOf } from "drizzle-orm";
import { createReplayJob } from "@/db/queries/replays";
import { getDb } from "@/db";
import { createInvite } from "@/db/queries/invites";
import { upsertMembership } from "@/db/queries/members";
import { createSite } from "@/db/queries/sites";
import { DEMO_SITE_ID } from "@/db/seed/demo-site";
import { sites } from "@/db/schema";
import { hashToken, newToken } from "@/lib/auth/tokens";
import { params, req, seedDemoSite, TEST_PASSWORD, userWithSession } from "./helpers";

type Who = "integrator" | "manager" | "occupant" | "outsider" | "signedOut";
const WHO: Who[] = ["integrator", "manager", "occupant", "outsider", "signedOut"];
const cookies: Record<Who, string | null> = { integrator: null, manager: null, occupant: null, outsider: null, signedOut: null };
let targetUserId = "";
let inviteId = "";
let integratorId = "";

type Handler = (r: Request, c: { params: Promise<Record<string, string>> }) => Promise<Response>;
type Case = { name: string; call: (cookie: string | null) => Promise<Response>; expect: Record<Who, number> };

const site = () => params({ siteId: DEMO_SITE_ID });
const h = (f: unknown) => f as Handler;

const uniq = () => Math.random().toString(36).slice(2, 8);
const read = { integrator: 200, manager: 200, occupant: 403, outsider: 404, signedOut: 401 };
const integratorOnly = { integrator: 200, manager: 403, occupant: 403, outsider: 404, signedOut: 401 };
const managers = { integrator: 200, manager: 200, occupant: 403, outsider: 404, signedOut: 401 };
const created = (e: Record<Who, number>) => ({ ...e, integrator: e.integrator === 200 ? 201 : e.integrator, manager: e.manager === 200 ? 201 : e.manager });
const dev = `${DEMO_SITE_ID}-dev-dl-shop-1`;
const zoneId = `${DEMO_SITE_ID}-zone-window`;
const sceneId = `${DEMO_SITE_ID}-scene-workshop`;

const floorId = `${DEMO_SITE_ID}-floor-ground`;
const everyone = { integrator: 200, manager: 200, occupant: 200, outsider: 404, signedOut: 401 };
function multipart(cookie: string | null, name: string): Request {
  const form = new FormData();
  form.set("name", name);
  const headers: Record<string, string> = { origin: "http://localhost:3000" };
  if (cookie) headers.cookie = cookie;
  return new Request("http://localhost:3000/x", { method: "POST", headers, body: form });
}

const cases: Case[] = [
  // Notices: per-person endpoints answer every signed-in person about themselves; preferences need site membership.
  { name: "GET /api/push/config", call: (c) => h(pushConfigRoute.GET)(req("GET", "/x", { cookie: c }), params({})), expect: { ...everyone, outsider: 200 } },
  { name: "GET /api/push/subscriptions", call: (c) => h(pushSubscriptionsRoute.GET)(req("GET", "/x", { cookie: c }), params({})), expect: { ...everyone, outsider: 200 } },
  {
    name: "POST /api/push/subscriptions",
    call: (c) => h(pushSubscriptionsRoute.POST)(req("POST", "/x", { cookie: c, body: { subscription: { endpoint: `https://push.example.invalid/${uniq()}`, keys: { p256dh: "BCVxsr7N_eNgVRqvHtD0zTZsEc6-VV-JvLexhqUzORcxaOzi6-AYWXvTBHm4bjyPjs7Vd8pZGH6SRpkNtoIAiw4", auth: "BTBZMqHH6r4Tts7J_aSIgg" } } } }), params({})),
    expect: { integrator: 201, manager: 201, occupant: 201, outsider: 201, signedOut: 401 },
  },
  { name: "DELETE /api/push/subscriptions (not theirs)", call: (c) => h(pushSubscriptionsRoute.DELETE)(req("DELETE", "/x", { cookie: c, body: { endpoint: "https://push.example.invalid/nobody" } }), params({})), expect: { integrator: 404, manager: 404, occupant: 404, outsider: 404, signedOut: 401 } },
  { name: "POST /api/push/demo (no local push service here)", call: (c) => h(pushDemoRoute.POST)(req("POST", "/x", { cookie: c }), params({})), expect: { integrator: 404, manager: 404, occupant: 404, outsider: 404, signedOut: 401 } },
  { name: "POST /api/push/demo/receive (no demo subscription)", call: (c) => h(pushDemoReceiveRoute.POST)(req("POST", "/x", { cookie: c, body: { endpoint: "http://127.0.0.1:1/push/x" } }), params({})), expect: { integrator: 404, manager: 404, occupant: 404, outsider: 404, signedOut: 401 } },
  { name: "GET /api/notices/inbox", call: (c) => h(inboxRoute.GET)(req("GET", "/api/notices/inbox", { cookie: c }), params({})), expect: { ...everyone, outsider: 200 } },
  { name: "GET /api/notices/inbox/unread", call: (c) => h(inboxUnreadRoute.GET)(req("GET", "/x", { cookie: c }), params({})), expect: { ...everyone, outsider: 200 } },
  { name: "POST /api/notices/inbox/read", call: (c) => h(inboxReadRoute.POST)(req("POST", "/x", { cookie: c, body: { all: true } }), params({})), expect: { ...everyone, outsider: 200 } },
  { name: "GET notice preferences", call: (c) => h(noticePrefsRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: everyone },
  { name: "PUT notice preferences", call: (c) => h(noticePrefsRoute.PUT)(req("PUT", "/x", { cookie: c, body: { kinds: null, channels: ["push", "in-app"], quietFrom: null, quietTo: null } }), site()), expect: everyone },
  // Event log and Replay: integrators and managers (replay.use).
  { name: "GET events", call: (c) => h(eventsRoute.GET)(req("GET", "/x?limit=5", { cookie: c }), site()), expect: managers },
  {
    name: "GET events/{seq}",
    call: async (c) => {
      await insertImportedEvents({ siteId: DEMO_SITE_ID, batch: [{ id: "matrix-ev", siteId: DEMO_SITE_ID, at: 1_700_000_000_000, device: dev, kind: "press", value: 1 }], receivedAt: 1 });
      const [row] = await getDb().select({ seq: eventLog.seq }).from(eventLog).where(eqOf(eventLog.eventId, "matrix-ev"));
      return h(eventRoute.GET)(req("GET", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, seq: String(row.seq) }));
    },
    expect: managers,
  },
  { name: "GET events/export", call: (c) => h(eventsExportRoute.GET)(req("GET", "/x?format=csv", { cookie: c }), site()), expect: managers },
  {
    name: "POST events/import (check)",
    call: (c) => h(eventsImportRoute.POST)(new Request("http://localhost:3000/x?format=ndjson&mode=check", { method: "POST", headers: { origin: "http://localhost:3000", ...(c ? { cookie: c } : {}) }, body: "{}\n" }), site()),
    expect: managers,
  },
  { name: "GET replays", call: (c) => h(replaysRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: managers },
  { name: "POST replays", call: (c) => h(replaysRoute.POST)(req("POST", "/x", { cookie: c, body: { from: 0, to: 1000, ruleSets: [{ kind: "active" }] } }), site()), expect: created(managers) },
  {
    name: "GET replays/{jobId}",
    call: async (c) => {
      const job = await createReplayJob({ siteId: DEMO_SITE_ID, userId: null, request: { from: 0, to: 1000, ruleSets: [{ kind: "active" }] } });
      return h(replayRoute.GET)(req("GET", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, jobId: job.id }));
    },
    expect: managers,
  },
  {
    name: "POST replays/{jobId}/cancel",
    call: async (c) => {
      const job = await createReplayJob({ siteId: DEMO_SITE_ID, userId: null, request: { from: 0, to: 1000, ruleSets: [{ kind: "active" }] } });
      return h(replayCancelRoute.POST)(req("POST", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, jobId: job.id }));
    },
    expect: managers,
  },
  { name: "GET bench", call: (c) => h(benchRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: managers },
  { name: "PATCH bench", call: (c) => h(benchRoute.PATCH)(req("PATCH", "/x", { cookie: c, body: { source: "active" } }), site()), expect: managers },
  { name: "POST bench/reset", call: (c) => h(benchResetRoute.POST)(req("POST", "/x", { cookie: c, body: {} }), site()), expect: managers },
  { name: "POST bench/actions", call: (c) => h(benchActionsRoute.POST)(req("POST", "/x", { cookie: c, body: { action: { type: "walk-past", device: `${DEMO_SITE_ID}-dev-sensor-path` } } }), site()), expect: managers },
  { name: "POST bench/clock", call: (c) => h(benchClockRoute.POST)(req("POST", "/x", { cookie: c, body: { minutes: 5 } }), site()), expect: managers },
  { name: "POST bench/date", call: (c) => h(benchDateRoute.POST)(req("POST", "/x", { cookie: c, body: { date: "2025-01-15", time: "18:30" } }), site()), expect: managers },
  { name: "GET bench/scenarios", call: (c) => h(benchScenariosRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: managers },
  { name: "POST bench/scenarios", call: (c) => h(benchScenariosRoute.POST)(req("POST", "/x", { cookie: c, body: { name: `B ${uniq()}`, steps: [{ type: "skip", minutes: 1 }] } }), site()), expect: created(managers) },
  { name: "GET bench/scenario", call: (c) => h(benchScenarioRoute.GET)(req("GET", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, scenarioId: `${DEMO_SITE_ID}-bench-fire-drill` })), expect: managers },
  { name: "PUT bench/scenario", call: (c) => h(benchScenarioRoute.PUT)(req("PUT", "/x", { cookie: c, body: { name: "fire drill", steps: [{ type: "skip", minutes: 1 }] } }), params({ siteId: DEMO_SITE_ID, scenarioId: `${DEMO_SITE_ID}-bench-fire-drill` })), expect: managers },
  { name: "DELETE bench/scenario (none such)", call: (c) => h(benchScenarioRoute.DELETE)(req("DELETE", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, scenarioId: "no-such-scenario" })), expect: { ...managers, integrator: 404, manager: 404 } },
  { name: "POST bench/scenario/play", call: (c) => h(benchPlayRoute.POST)(req("POST", "/x", { cookie: c, body: {} }), params({ siteId: DEMO_SITE_ID, scenarioId: `${DEMO_SITE_ID}-bench-evening-visitor` })), expect: managers },
  { name: "GET keys", call: (c) => h(keysRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: integratorOnly },
  { name: "POST keys", call: (c) => h(keysRoute.POST)(req("POST", "/x", { cookie: c, body: { name: `K ${uniq()}` } }), site()), expect: created(integratorOnly) },
  // The permission is checked before the key is looked up: only the integrator learns the key is not there.
  { name: "DELETE key (no such key)", call: (c) => h(keyRoute.DELETE)(req("DELETE", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, keyId: "00000000-0000-4000-8000-000000000000" })), expect: { ...integratorOnly, integrator: 404 } },
  // Nothing latched on the demo site here: allowed roles get the conflict, the rest never reach the check.
  { name: "POST emergency/clear (none latched)", call: (c) => h(emergencyClearRoute.POST)(req("POST", "/x", { cookie: c }), site()), expect: { ...managers, integrator: 409, manager: 409 } },
  { name: "GET site", call: (c) => h(siteRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: everyone },
  { name: "PATCH site", call: (c) => h(siteRoute.PATCH)(req("PATCH", "/x", { cookie: c, body: { timeZone: "WET" } }), site()), expect: integratorOnly },
  { name: "GET floors", call: (c) => h(floorsRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: everyone },
  { name: "POST floors", call: (c) => h(floorsRoute.POST)(multipart(c, `F ${uniq()}`), site()), expect: created(integratorOnly) },
  { name: "PATCH floor", call: (c) => h(floorRoute.PATCH)(req("PATCH", "/x", { cookie: c, body: { name: "Ground floor" } }), params({ siteId: DEMO_SITE_ID, floorId })), expect: integratorOnly },
  { name: "GET floor plan", call: (c) => h(planRoute.GET)(req("GET", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, floorId })), expect: everyone },
  { name: "POST devices/import (preview)", call: (c) => h(importRoute.POST)(req("POST", "/x", { cookie: c, body: { csv: "name,kind\nM,mesh-luminaire", mode: "preview" } }), site()), expect: integratorOnly },
  { name: "GET devices/export", call: (c) => h(exportRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: read },
  { name: "GET devices", call: (c) => h(devicesRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: read },
  { name: "POST devices", call: (c) => h(devicesRoute.POST)(req("POST", "/x", { cookie: c, body: { name: `M ${uniq()}`, kind: "mesh-luminaire" } }), site()), expect: created(integratorOnly) },
  { name: "GET device", call: (c) => h(deviceRoute.GET)(req("GET", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, deviceId: dev })), expect: read },
  { name: "PATCH device", call: (c) => h(deviceRoute.PATCH)(req("PATCH", "/x", { cookie: c, body: { name: "Shop downlight 1" } }), params({ siteId: DEMO_SITE_ID, deviceId: dev })), expect: integratorOnly },
  { name: "POST devices/bulk-zone", call: (c) => h(bulkZoneRoute.POST)(req("POST", "/x", { cookie: c, body: { deviceIds: [dev], zoneId: `${DEMO_SITE_ID}-zone-shop` } }), site()), expect: integratorOnly },
  { name: "GET zones", call: (c) => h(zonesRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: read },
  { name: "POST zones", call: (c) => h(zonesRoute.POST)(req("POST", "/x", { cookie: c, body: { name: `Z ${uniq()}` } }), site()), expect: created(integratorOnly) },
  { name: "PATCH zone", call: (c) => h(zoneRoute.PATCH)(req("PATCH", "/x", { cookie: c, body: { name: "Shop window" } }), params({ siteId: DEMO_SITE_ID, zoneId })), expect: integratorOnly },
  { name: "GET scenes", call: (c) => h(scenesRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: { ...read, occupant: 200 } },
  { name: "POST scenes", call: (c) => h(scenesRoute.POST)(req("POST", "/x", { cookie: c, body: { number: 100 + Math.floor(Math.random() * 60000), name: `S ${uniq()}`, fadeMs: 0, levels: [] } }), site()), expect: created(managers) },
  { name: "PUT scene", call: (c) => h(sceneRoute.PUT)(req("PUT", "/x", { cookie: c, body: { number: 4, name: "Workshop bright", fadeMs: 1000, isOccupantRecallable: false, levels: [] } }), params({ siteId: DEMO_SITE_ID, sceneId })), expect: managers },
  { name: "GET rules", call: (c) => h(rulesRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: managers },
  {
    name: "PUT rules/draft",
    call: async (c) => {
      const r = await getRuleSet({ siteId: DEMO_SITE_ID });
      return h(rulesDraftRoute.PUT)(req("PUT", "/x", { cookie: c, body: { graph: r.draftGraph, revision: r.draftRevision } }), site());
    },
    expect: managers,
  },
  { name: "POST rules/activate", call: async (c) => h(rulesActivateRoute.POST)(req("POST", "/x", { cookie: c, body: { revision: (await getRuleSet({ siteId: DEMO_SITE_ID })).draftRevision } }), site()), expect: managers },
  { name: "GET rules/versions", call: (c) => h(rulesVersionsRoute.GET)(req("GET", "/x", { cookie: c }), site()), expect: managers },
  { name: "POST rules/versions/{id}/activate", call: (c) => h(rulesRollbackRoute.POST)(req("POST", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, versionId: `${DEMO_SITE_ID}-rules-v1` })), expect: managers },
  { name: "GET rules/diff", call: (c) => h(rulesDiffRoute.GET)(req("GET", "/x?from=active&to=draft", { cookie: c }), site()), expect: managers },
  { name: "GET energy", call: (c) => h(energyRoute.GET)(req("GET", "/x?source=draft", { cookie: c }), site()), expect: managers },
  { name: "GET energy/short", call: (c) => h(shortEnergyRoute.GET)(req("GET", "/x?source=draft", { cookie: c }), site()), expect: managers },
  { name: "GET device energy", call: (c) => h(deviceEnergyRoute.GET)(req("GET", "/x", { cookie: c }), params({ siteId: DEMO_SITE_ID, deviceId: `${DEMO_SITE_ID}-dev-climate-case-a` })), expect: managers },
  { name: "GET /api/sites", call: (c) => h(sitesRoute.GET)(req("GET", "/api/sites", { cookie: c }), params({})), expect: { integrator: 200, manager: 200, occupant: 200, outsider: 200, signedOut: 401 } },
  {
    name: "POST /api/sites",
    call: (c) => h(sitesRoute.POST)(req("POST", "/api/sites", { cookie: c, body: { name: "Matrix test site", address: "", timeZone: "UTC", latitude: 10, longitude: 10 } }), params({})),
    expect: { integrator: 201, manager: 201, occupant: 201, outsider: 201, signedOut: 401 },
  },
  {
    name: "GET /api/sites/{id}/overview",
    call: (c) => h(overviewRoute.GET)(req("GET", `/api/sites/${DEMO_SITE_ID}/overview`, { cookie: c }), site()),
    expect: { integrator: 200, manager: 200, occupant: 200, outsider: 404, signedOut: 401 },
  },
  {
    name: "GET /api/sites/{id}/members",
    call: (c) => h(membersRoute.GET)(req("GET", `/api/sites/${DEMO_SITE_ID}/members`, { cookie: c }), site()),
    expect: { integrator: 200, manager: 403, occupant: 403, outsider: 404, signedOut: 401 },
  },
  {
    name: "PATCH /api/sites/{id}/members/{userId}",
    call: (c) => h(memberRoute.PATCH)(req("PATCH", `/api/sites/${DEMO_SITE_ID}/members/${targetUserId}`, { cookie: c, body: { role: "manager", zoneIds: null } }), params({ siteId: DEMO_SITE_ID, userId: targetUserId })),
    expect: { integrator: 200, manager: 403, occupant: 403, outsider: 404, signedOut: 401 },
  },
  {
    name: "DELETE /api/sites/{id}/members/{userId}",
    call: (c) => h(memberRoute.DELETE)(req("DELETE", `/api/sites/${DEMO_SITE_ID}/members/${targetUserId}`, { cookie: c }), params({ siteId: DEMO_SITE_ID, userId: targetUserId })),
    expect: { integrator: 200, manager: 403, occupant: 403, outsider: 404, signedOut: 401 },
  },
  {
    name: "POST /api/sites/{id}/invites",
    call: (c) => h(invitesRoute.POST)(req("POST", `/api/sites/${DEMO_SITE_ID}/invites`, { cookie: c, body: { email: "matrix-invitee@example.invalid", role: "occupant", zoneIds: null } }), site()),
    expect: { integrator: 201, manager: 403, occupant: 403, outsider: 404, signedOut: 401 },
  },
  {
    name: "DELETE /api/sites/{id}/invites/{inviteId}",
    call: (c) => h(inviteRoute.DELETE)(req("DELETE", `/api/sites/${DEMO_SITE_ID}/invites/${inviteId}`, { cookie: c }), params({ siteId: DEMO_SITE_ID, inviteId })),
    expect: { integrator: 200, manager: 403, occupant: 403, outsider: 404, signedOut: 401 },
  },
  {
    name: "POST /api/sites/{id}/invites/{inviteId}/resend",
    call: (c) => h(resendRoute.POST)(req("POST", `/api/sites/${DEMO_SITE_ID}/invites/${inviteId}/resend`, { cookie: c }), params({ siteId: DEMO_SITE_ID, inviteId })),
    expect: { integrator: 200, manager: 403, occupant: 403, outsider: 404, signedOut: 401 },
  },
  {
    name: "POST /api/auth/password",
    call: (c) => h(passwordRoute.POST)(req("POST", "/api/auth/password", { cookie: c, body: { currentPassword: TEST_PASSWORD, newPassword: TEST_PASSWORD } }), params({})),
    expect: { integrator: 200, manager: 200, occupant: 200, outsider: 200, signedOut: 401 },
  },
];

beforeAll(async () => {
  await seedDemoSite();
  const integrator = await userWithSession("m-integrator@example.invalid", { siteId: DEMO_SITE_ID, role: "integrator" });
  integratorId = integrator.userId;
  cookies.integrator = integrator.cookie;
  cookies.manager = (await userWithSession("m-manager@example.invalid", { siteId: DEMO_SITE_ID, role: "manager" })).cookie;
  cookies.occupant = (await userWithSession("m-occupant@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant" })).cookie;
  const outsider = await userWithSession("m-outsider@example.invalid");
  cookies.outsider = outsider.cookie;
  // The outsider is integrator of a site of their own, so "another site's member" is tested, not just "nobody".
  await createSite({ userId: outsider.userId, name: "Elsewhere", address: "", timeZone: "UTC", latitude: 0, longitude: 0 });
});

beforeEach(async () => {
  // Fresh targets for every call, so a 2xx in one case cannot change the next.
  targetUserId = (await userWithSession("m-target@example.invalid", { siteId: DEMO_SITE_ID, role: "occupant" })).userId;
  const now = new Date();
  inviteId = (await createInvite({ siteId: DEMO_SITE_ID, email: `m-pending-${Math.random()}@example.invalid`, role: "occupant", zoneIds: null, tokenHash: hashToken(newToken()), invitedBy: integratorId, expiresAt: new Date(now.getTime() + 3600_000), now })).id;
});

describe("role × endpoint matrix (server-side checks)", () => {
  for (const c of cases) {
    for (const who of WHO) {
      it(`${c.name} as ${who} → ${c.expect[who]}`, async () => {
        const res = await c.call(cookies[who]);
        expect(res.status).toBe(c.expect[who]);
      });
    }
  }

  it("refuses a cookie-authenticated change without this console's Origin (403), and writes nothing", async () => {
    const before = (await getDb().select().from(sites)).length;
    const res = await h(sitesRoute.POST)(
      req("POST", "/api/sites", { cookie: cookies.integrator, origin: "https://evil.example.invalid", body: { name: "Forged", address: "", timeZone: "UTC", latitude: 0, longitude: 0 } }),
      params({}),
    );
    expect(res.status).toBe(403);
    const missing = await h(sitesRoute.POST)(req("POST", "/api/sites", { cookie: cookies.integrator, origin: null, body: { name: "Forged", address: "", timeZone: "UTC", latitude: 0, longitude: 0 } }), params({}));
    expect(missing.status).toBe(403);
    expect((await getDb().select().from(sites)).length).toBe(before);
  });

  it("never removes or demotes the last integrator (409)", async () => {
    const solo = await userWithSession("m-solo@example.invalid");
    const own = await createSite({ userId: solo.userId, name: "Solo site", address: "", timeZone: "UTC", latitude: 0, longitude: 0 });
    const del = await h(memberRoute.DELETE)(req("DELETE", `/api/sites/${own.id}/members/${solo.userId}`, { cookie: solo.cookie }), params({ siteId: own.id, userId: solo.userId }));
    expect(del.status).toBe(409);
    const demote = await h(memberRoute.PATCH)(req("PATCH", `/api/sites/${own.id}/members/${solo.userId}`, { cookie: solo.cookie, body: { role: "occupant", zoneIds: null } }), params({ siteId: own.id, userId: solo.userId }));
    expect(demote.status).toBe(409);
    // With a second integrator, stepping down works.
    const other = await userWithSession("m-second@example.invalid");
    await upsertMembership({ siteId: own.id, userId: other.userId, role: "integrator", zoneIds: null });
    const ok = await h(memberRoute.PATCH)(req("PATCH", `/api/sites/${own.id}/members/${solo.userId}`, { cookie: solo.cookie, body: { role: "manager", zoneIds: null } }), params({ siteId: own.id, userId: solo.userId }));
    expect(ok.status).toBe(200);
  });

  it("rejects unknown keys, wrong types and over-long fields with 422 and field messages", async () => {
    const res = await h(invitesRoute.POST)(req("POST", `/api/sites/${DEMO_SITE_ID}/invites`, { cookie: cookies.integrator, body: { email: "x".repeat(300) + "@example.invalid", role: "owner", extra: 1 } }), site());
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(Object.keys(body.fields)).toEqual(expect.arrayContaining(["email", "role"]));
    const bad = await h(sitesRoute.POST)(req("POST", "/api/sites", { cookie: cookies.integrator, body: { name: "", timeZone: "Mars/Olympus", latitude: 91, longitude: "east" } }), params({}));
    expect(bad.status).toBe(422);
    expect(Object.keys((await bad.json()).fields).sort()).toEqual(["latitude", "longitude", "name", "timeZone"]);
    const notJson = await h(sitesRoute.POST)(new Request("http://localhost:3000/api/sites", { method: "POST", headers: { cookie: cookies.integrator!, origin: "http://localhost:3000" }, body: "{oops" }), params({}));
    expect(notJson.status).toBe(400);
  });
});

describe("params are checked after the caller's role", () => {
  it("a malformed key id is a 422 for the integrator, but a 403 for a manager and a 404 for an outsider", async () => {
    const bad = params({ siteId: DEMO_SITE_ID, keyId: "not-a-uuid" });
    expect((await h(keyRoute.DELETE)(req("DELETE", "/x", { cookie: cookies.integrator! }), bad)).status).toBe(422);
    expect((await h(keyRoute.DELETE)(req("DELETE", "/x", { cookie: cookies.manager! }), bad)).status).toBe(403);
    expect((await h(keyRoute.DELETE)(req("DELETE", "/x", { cookie: cookies.outsider! }), bad)).status).toBe(404);
  });
});
