import { and, count, eq, gte, inArray, max, min } from "drizzle-orm";
import { getDb } from "@/db";
import { devices, events, ruleSets, ruleSetVersions, scenes, sites, zones } from "@/db/schema";
import type { ObservedCounts } from "@/lib/energy/messages";
import { siteEnergyBudget, type SiteEnergy, type WeekChoice } from "@/lib/energy/site";
import { AppError } from "@/lib/errors";
import type { EnergySource } from "@/lib/validation/energy";

const DAY_MS = 86_400_000;
/** The event log's window for observed rates. */
const OBSERVED_DAYS = 28;

/** The Canvas graph the budget reads: the active version's, or the draft's. */
async function loadGraph(siteId: string, source: EnergySource): Promise<unknown> {
  const db = getDb();
  const [set] = await db.select().from(ruleSets).where(eq(ruleSets.siteId, siteId));
  if (!set) return null;
  if (source === "draft") return set.draftGraph;
  if (!set.activeVersionId) return null;
  const [version] = await db.select({ graph: ruleSetVersions.graph }).from(ruleSetVersions).where(and(eq(ruleSetVersions.siteId, siteId), eq(ruleSetVersions.id, set.activeVersionId)));
  return version?.graph ?? null;
}

/** Events per device and kind over the last four weeks, from gateways and imports (not the Test bench). */
async function loadObserved(siteId: string, now: number): Promise<Map<string, ObservedCounts>> {
  const rows = await getDb()
    .select({ device: events.device, kind: events.kind, n: count(), first: min(events.at), last: max(events.at) })
    .from(events)
    .where(and(eq(events.siteId, siteId), gte(events.at, now - OBSERVED_DAYS * DAY_MS), inArray(events.source, ["gateway", "import"])))
    .groupBy(events.device, events.kind);
  const spans = new Map<string, { first: number; last: number; byKind: Record<string, number> }>();
  for (const r of rows) {
    const s = spans.get(r.device) ?? { first: Number.POSITIVE_INFINITY, last: 0, byKind: {} };
    s.first = Math.min(s.first, r.first ?? now);
    s.last = Math.max(s.last, r.last ?? now);
    s.byKind[r.kind] = r.n;
    spans.set(r.device, s);
  }
  // A device seen for part of a day still counts as a day: a rate per day, not per hour of history.
  return new Map([...spans].map(([device, s]) => [device, { byKind: s.byKind, days: Math.max(1, Math.ceil((s.last - s.first) / DAY_MS)) }]));
}

/** The Energy budget of every battery-free device on a site, under the active rules or the draft. */
export async function getSiteEnergy({ siteId, source = "active", week = "shortest", now = Date.now() }: { siteId: string; source?: EnergySource; week?: WeekChoice; now?: number }): Promise<SiteEnergy & { source: EnergySource; week: WeekChoice; timeZone: string }> {
  const db = getDb();
  const [site] = await db.select().from(sites).where(eq(sites.id, siteId));
  if (!site) throw new AppError("not_found", "No such site.");
  const [deviceRows, zoneRows, sceneRows, graph, observed] = await Promise.all([
    db.select().from(devices).where(eq(devices.siteId, siteId)),
    db.select().from(zones).where(eq(zones.siteId, siteId)),
    db.select().from(scenes).where(eq(scenes.siteId, siteId)),
    loadGraph(siteId, source),
    loadObserved(siteId, now),
  ]);
  const budget = siteEnergyBudget({
    site,
    devices: deviceRows.map((d) => ({ id: d.id, name: d.name, kind: d.kind, zoneId: d.zoneId, unicastAddress: d.unicastAddress, profile: d.profile })),
    zones: zoneRows.map((z) => ({ id: z.id, name: z.name, groupAddress: z.groupAddress })),
    scenes: sceneRows.map((s) => ({ number: s.number, name: s.name, fadeMs: s.fadeMs, levels: s.levels })),
    graph,
    observed,
    week,
    now,
  });
  return { ...budget, source, week, timeZone: site.timeZone };
}

/** One device's budget (404 when it is not a battery-free device of this site). */
export async function getDeviceEnergy({ siteId, deviceId, source = "active", week = "shortest", now }: { siteId: string; deviceId: string; source?: EnergySource; week?: WeekChoice; now?: number }) {
  const budget = await getSiteEnergy({ siteId, source, week, now });
  const entry = budget.devices.find((d) => d.input.deviceId === deviceId);
  if (!entry) throw new AppError("not_found", "No battery-free device with that id on this site.");
  return { ...entry, weekLabel: budget.weekLabel, notes: budget.notes, source, week, timeZone: budget.timeZone };
}

export type ShortDevice = { deviceId: string; name: string; margin: number; ruleNodeIds: string[] };

/**
 * Devices that are Short under the active rules or the draft, with the Canvas
 * node ids of the rules that make them so (empty when the device is Short on
 * its own settings). For the Canvas and the Test bench to mark those triggers,
 * and for Activate to warn — never to block.
 */
export async function getShortDevices({ siteId, source }: { siteId: string; source: EnergySource }): Promise<ShortDevice[]> {
  const budget = await getSiteEnergy({ siteId, source });
  return budget.devices
    .filter((d) => d.result.verdict === "short")
    .map((d) => ({ deviceId: d.input.deviceId, name: d.input.name, margin: d.result.margin, ruleNodeIds: d.result.ruleImpact?.ruleNodeIds ?? [] }));
}

/** Devices a draft would make Short that the active rules leave alone: what Activate should warn about. */
export async function getNewlyShortDevices({ siteId }: { siteId: string }): Promise<ShortDevice[]> {
  const [active, draft] = await Promise.all([getShortDevices({ siteId, source: "active" }), getShortDevices({ siteId, source: "draft" })]);
  return newlyShortOf(active, draft);
}

/** The draft's Short devices that the active rules leave alone (for callers that already hold both lists). */
export function newlyShortOf(active: ShortDevice[], draft: ShortDevice[]): ShortDevice[] {
  const before = new Set(active.map((d) => d.deviceId));
  return draft.filter((d) => !before.has(d.deviceId));
}
