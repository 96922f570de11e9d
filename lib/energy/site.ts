import { DEVICE_KIND_INFO, isBatteryFree, type DeviceKind } from "@/lib/catalogue/device-kinds";
import { defaultProfile, parseProfile, type KineticHarvester, type SolarHarvester } from "@/lib/catalogue/profiles";
import { toSiteInput } from "@/lib/bus/site-input";
import type { SceneConfig } from "@/lib/bus/types";
import { compileGraph, type RuleJson } from "@/lib/rules/compile";
import { ruleGraphSchema, type RuleGraph } from "@/lib/rules/graph";
import { formatLocalDate, localToInstant, type LocalDate } from "@/lib/sun/local-time";
import { ENERGY_CONSTANTS as C, HOURS_PER_WEEK } from "./constants";
import { daylightByHour } from "./daylight";
import { actuationsPerDay, kineticMessages, solarMessages, type ObservedCounts } from "./messages";
import { evaluateDevice } from "./model";
import type { DeviceEnergyInput, DeviceEnergyResult, ObservedRate } from "./types";
import { zoneLightByHour } from "./zone-light";

export type WeekChoice = "shortest" | "longest";

export type SiteEnergyData = {
  site: { timeZone: string; latitude: number; longitude: number };
  devices: { id: string; name: string; kind: DeviceKind; zoneId: string | null; unicastAddress: number; profile: unknown }[];
  zones: { id: string; name: string; groupAddress: number }[];
  scenes: SceneConfig[];
  /** The Canvas graph of the chosen rule set (active version or draft); null when there is none. */
  graph: unknown;
  observed: Map<string, ObservedCounts>;
  week: WeekChoice;
  /** Which year's week: the year of this instant. */
  now: number;
};

export type SiteEnergy = {
  weekLabel: string;
  hourStarts: number[];
  /** Said when the rules could not be read, so lighting comes without them. */
  notes: string[];
  devices: { input: DeviceEnergyInput; result: DeviceEnergyResult }[];
};

const HOUR_MS = 3_600_000;

/** Monday 00:00 local of the week holding the solstice with the shortest (or longest) days at the site. */
export function budgetWeek(choice: WeekChoice, latitude: number, timeZone: string, now: number): { start: LocalDate; hourStarts: number[]; label: string } {
  const year = new Date(now).getUTCFullYear();
  const isDecember = (choice === "shortest") === latitude >= 0;
  const solstice = Date.UTC(year, isDecember ? 11 : 5, 21);
  // getUTCDay: 0 = Sunday; step back to Monday.
  const monday = new Date(solstice - ((new Date(solstice).getUTCDay() + 6) % 7) * 86_400_000);
  const start = { year: monday.getUTCFullYear(), month: monday.getUTCMonth() + 1, day: monday.getUTCDate() };
  const first = localToInstant(start, 0, timeZone);
  const hourStarts = Array.from({ length: HOURS_PER_WEEK }, (_, h) => first + h * HOUR_MS);
  return { start, hourStarts, label: `${choice === "shortest" ? "Shortest days" : "Longest days"}: the week from Monday ${formatLocalDate(start)}` };
}

function readGraph(graph: unknown, notes: string[]): { graph: RuleGraph | null; rules: RuleJson[] } {
  if (graph === null || graph === undefined) return { graph: null, rules: [] };
  const parsed = ruleGraphSchema.safeParse(graph);
  if (!parsed.success) {
    notes.push("The rule set could not be read, so its rules are left out of this budget. Fix it on the Canvas.");
    return { graph: null, rules: [] };
  }
  try {
    return { graph: parsed.data, rules: compileGraph(parsed.data) };
  } catch {
    notes.push("The rule set could not be compiled, so its schedules are left out of this budget.");
    return { graph: parsed.data, rules: [] };
  }
}

function typicalSections(energy: Record<string, { isTypical?: boolean; source?: string }>) {
  return Object.entries(energy).flatMap(([section, v]) => (v.isTypical ? [{ section, source: v.source ?? "typical values" }] : []));
}

function observedRate(o: ObservedCounts | undefined): ObservedRate | null {
  if (!o || o.days <= 0) return null;
  const messages = Object.values(o.byKind).reduce((a, b) => a + b, 0);
  const actuations = (o.byKind.press ?? 0) + (o.byKind.turn ?? 0);
  return { messages, actuations, days: o.days, messagesPerDay: messages / o.days, actuationsPerDay: actuations / o.days };
}

/** The inputs of every battery-free device: profile, message streams from the rules, and the light at its place. */
export function buildEnergyInputs(data: SiteEnergyData): { inputs: DeviceEnergyInput[]; weekLabel: string; hourStarts: number[]; notes: string[] } {
  const notes: string[] = [];
  const { graph, rules } = readGraph(data.graph, notes);
  const week = budgetWeek(data.week, data.site.latitude, data.site.timeZone, data.now);
  const batteryFree = data.devices.filter((d) => isBatteryFree(d.kind));
  const needsLight = batteryFree.some((d) => DEVICE_KIND_INFO[d.kind].power === "solar");
  const siteInput = toSiteInput({ site: data.site, devices: data.devices, zones: data.zones, scenes: data.scenes });
  const zoneLight = needsLight ? zoneLightByHour(siteInput, rules, week.hourStarts) : new Map();
  const daylight = needsLight ? daylightByHour(week.hourStarts, data.site.latitude, data.site.longitude) : [];
  const zoneName = new Map(data.zones.map((z) => [z.id, z.name]));
  const dark = { levelPct: week.hourStarts.map(() => 0), source: "the device is in no zone, so no light is counted" };

  const inputs = batteryFree.map((d): DeviceEnergyInput => {
    const parsed = parseProfile(d.kind, d.profile);
    if (!parsed.ok) notes.push(`${d.name}: its profile is not valid (${parsed.errors.map((e) => `${e.path} ${e.message}`).join("; ")}), so typical values are used.`);
    const profile = (parsed.ok ? parsed.profile : defaultProfile(d.kind)) as { energy: DeviceEnergyInput["energy"] };
    const energy = profile.energy;
    const observed = data.observed.get(d.id) ?? null;
    const common = {
      deviceId: d.id,
      name: d.name,
      kind: d.kind,
      zoneId: d.zoneId,
      zoneName: d.zoneId ? (zoneName.get(d.zoneId) ?? null) : null,
      typicalSections: typicalSections(energy as unknown as Record<string, { isTypical?: boolean; source?: string }>),
      observed: observedRate(observed ?? undefined),
    };
    if (DEVICE_KIND_INFO[d.kind].power === "kinetic") {
      return { ...common, power: "kinetic", energy: { ...energy, harvester: energy.harvester as KineticHarvester }, messages: kineticMessages({ deviceId: d.id, kind: d.kind, graph }), actuationsPerDay: actuationsPerDay(observed) };
    }
    const light = (d.zoneId && zoneLight.get(d.zoneId)) || dark;
    return {
      ...common,
      power: "solar",
      energy: { ...energy, harvester: energy.harvester as SolarHarvester },
      messages: solarMessages({ deviceId: d.id, kind: d.kind, activity: energy.activity, graph, observed }),
      light: { hourStarts: week.hourStarts, zoneLevelPct: light.levelPct, zoneLevelSource: light.source, luxAtFull: C.luxAtFull.value, outdoorLux: daylight.map((x) => x.outdoorLux), weekLabel: week.label },
    };
  });
  return { inputs, weekLabel: week.label, hourStarts: week.hourStarts, notes };
}

/** The Energy budget of a whole site. */
export function siteEnergyBudget(data: SiteEnergyData): SiteEnergy {
  const { inputs, weekLabel, hourStarts, notes } = buildEnergyInputs(data);
  return { weekLabel, hourStarts, notes, devices: inputs.map((input) => ({ input, result: evaluateDevice(input) })) };
}
