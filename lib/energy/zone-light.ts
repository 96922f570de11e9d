import { createReplayEngine } from "@/lib/bus/engine";
import type { SiteInput } from "@/lib/bus/site-model";
import type { RuleJson } from "@/lib/rules/compile";
import { localParts } from "@/lib/sun/local-time";
import { ENERGY_CONSTANTS as C } from "./constants";

const HOUR_MS = 3_600_000;
const SAMPLES_PER_HOUR = 4;
const WARM_UP_DAYS = 7;
const MANUAL_TRIGGERS = new Set(["rocker-press", "rocker-release", "rocker-long-press", "call-button-press", "door-handle-turn"]);
/** 09:00–17:00 local: the hours a zone switched only by hand is assumed lit. */
const MANUAL_FROM = 9;
const MANUAL_TO = MANUAL_FROM + C.manualUseHours.value;

export type ZoneLight = { levelPct: number[]; source: string };

/**
 * Mean level of each zone's luminaires, hour by hour, from the site's own
 * rules: the replay engine runs the clock alone (schedules, site modes, the
 * scenes they recall) for a warm-up week and then the hours asked for, sampled
 * every 15 minutes. A zone no schedule lights but a switch's rule does is
 * assumed lit by hand during working hours at the level that rule sets.
 */
export function zoneLightByHour(site: SiteInput, rules: RuleJson[], hourStarts: readonly number[]): Map<string, ZoneLight> {
  const levels = new Map<string, number>();
  const zoneOf = new Map<string, string>();
  const luminairesByZone = new Map<string, string[]>();
  for (const d of site.devices) {
    if (!d.zoneId) continue;
    zoneOf.set(d.id, d.zoneId);
    if (["mesh-luminaire", "cc-driver", "bridge-0-10v", "dali-driver"].includes(d.kind)) luminairesByZone.set(d.zoneId, [...(luminairesByZone.get(d.zoneId) ?? []), d.id]);
  }
  const sums = new Map<string, Float64Array>(site.zones.map((z) => [z.id, new Float64Array(hourStarts.length)]));
  if (hourStarts.length > 0) {
    const engine = createReplayEngine({ ...site, site: { ...site.site, initialMode: site.site.initialMode ?? "closed" }, rules });
    const apply = (changes: ReturnType<typeof engine.advanceTo>["changes"]) => {
      for (const c of changes) if (c.kind === "level") levels.set(c.deviceId, c.to);
    };
    apply(engine.advanceTo(hourStarts[0] - WARM_UP_DAYS * 24 * HOUR_MS).changes);
    apply(engine.advanceTo(hourStarts[0]).changes);
    hourStarts.forEach((start, h) => {
      for (let s = 0; s < SAMPLES_PER_HOUR; s++) {
        apply(engine.advanceTo(start + (s * HOUR_MS) / SAMPLES_PER_HOUR).changes);
        for (const [zoneId, ids] of luminairesByZone) {
          const row = sums.get(zoneId);
          if (!row) continue;
          let sum = 0;
          for (const id of ids) sum += levels.get(id) ?? 0;
          row[h] += sum / ids.length / SAMPLES_PER_HOUR;
        }
      }
    });
  }
  const manual = manualLevels(rules, zoneOf, site);
  const out = new Map<string, ZoneLight>();
  for (const z of site.zones) {
    const row = Array.from(sums.get(z.id) ?? []);
    const isScheduled = row.some((x) => x > 0);
    const hand = manual.get(z.id);
    if (isScheduled || !hand) {
      out.set(z.id, { levelPct: row, source: isScheduled ? "the rules' schedules and the scenes they recall (replayed hour by hour)" : "no schedule or switch lights this zone" });
      continue;
    }
    const levelPct = hourStarts.map((start) => {
      const hour = localParts(start, site.site.timeZone).hour;
      return hour >= MANUAL_FROM && hour < MANUAL_TO ? hand : 0;
    });
    out.set(z.id, { levelPct, source: `lit by a switch at ${hand} %, ${C.manualUseHours.value} h a day (${C.manualUseHours.source})` });
  }
  return out;
}

/** The highest level a person's press can set each zone to, through the rules. */
function manualLevels(rules: RuleJson[], zoneOf: Map<string, string>, site: SiteInput): Map<string, number> {
  const out = new Map<string, number>();
  const raise = (zoneId: string | undefined, level: number) => {
    if (zoneId && level > (out.get(zoneId) ?? 0)) out.set(zoneId, level);
  };
  const scenes = new Map(site.scenes.map((s) => [s.number, s]));
  for (const rule of rules) {
    if (!MANUAL_TRIGGERS.has(rule.event.params.trigger.type)) continue;
    for (const a of rule.event.params.actions) {
      if (a.type === "toggle-zone") raise(a.params.zone, a.params.level);
      else if (a.type === "set-level") raise("zone" in a.params.target ? a.params.target.zone : zoneOf.get(a.params.target.device), a.params.level);
      else if (a.type === "recall-scene") for (const l of scenes.get(a.params.scene)?.levels ?? []) raise(l.zoneId ?? (l.deviceId ? zoneOf.get(l.deviceId) : undefined), l.level);
    }
  }
  return out;
}
