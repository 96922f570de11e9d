import type { PathAction } from "@/lib/rules/compile";
import type { OverrideLevel } from "@/lib/rules/trigger-key";
import { releaseClaims, writeLevels, type WriteResult } from "./levels";
import { levelBelowEmergency } from "./overrides";
import { withCause, type Runtime } from "./runtime";
import { allLuminaires, sceneLevels, zoneName } from "./site-model";
import type { Cause } from "./types";

const LEVEL_WORD: Record<OverrideLevel, string> = { emergency: "Emergency", manual: "Manual", sensor: "Sensor", schedule: "Schedule" };

export function describeWrite(label: string, r: WriteResult): string {
  const held = r.held > 0 && r.heldBy ? `${r.held} held by ${LEVEL_WORD[r.heldBy]}` : "";
  if (r.reached === 0) return `${label}: ${held}; nothing sent.`;
  const done = r.changed === 0 ? "already there" : `${r.changed} luminaire${r.changed === 1 ? "" : "s"} changed`;
  return `${label}: ${done}${held ? `, ${held}` : ""}.`;
}

/**
 * Latching puts an Emergency claim on every luminaire: the scene's levels on its
 * luminaires, 0 % on the rest (unless othersOff is false). It stays until a
 * clear-emergency action, whatever the fire-alarm input does meanwhile. If the
 * scene is missing, everything goes to 100 %: darkness is the wrong failure.
 */
export function applyEmergency(rt: Runtime, action: Extract<PathAction, { type: "latch-emergency" | "clear-emergency" }>, cause: Cause, at: number): string {
  if (action.type === "clear-emergency") {
    if (!rt.state.emergency.active) return "No emergency is latched; nothing changed.";
    rt.state.emergency = { active: false, since: null, scene: null, ruleId: null };
    rt.out.changes.push(withCause(cause, { at, kind: "emergency" as const, isActive: false, scene: null }));
    const changed = releaseClaims(rt, allLuminaires(rt.model), (level) => level === "emergency", action.params.fadeMs, cause, at);
    return `Emergency cleared; ${changed} luminaire${changed === 1 ? "" : "s"} back to their other claims.`;
  }
  if (rt.state.emergency.active) return `Emergency already latched with scene ${rt.state.emergency.scene}; nothing changed.`;
  const number = action.params.scene;
  const scene = rt.model.scenes.get(number);
  rt.state.emergency = { active: true, since: at, scene: number, ruleId: cause.ruleId };
  rt.out.changes.push(withCause(cause, { at, kind: "emergency" as const, isActive: true, scene: number }));
  if (!scene) {
    const writes = allLuminaires(rt.model).map((deviceId) => ({ deviceId, level: 100 }));
    writeLevels(rt, writes, "emergency", null, { kind: "lightness", fadeMs: 0 }, cause, at);
    return `Emergency latched, but scene ${number} is not set up: every luminaire to 100 %.`;
  }
  // No fade: an escape route lights at once.
  const inScene = sceneLevels(rt.model, scene);
  const lit = writeLevels(rt, inScene, "emergency", null, { kind: "scene", scene: number, fadeMs: 0 }, cause, at);
  let off = 0;
  if (action.params.othersOff) {
    const taken = new Set(inScene.map((w) => w.deviceId));
    const others = allLuminaires(rt.model).filter((id) => !taken.has(id)).map((deviceId) => ({ deviceId, level: 0 }));
    off = writeLevels(rt, others, "emergency", null, { kind: "lightness", fadeMs: 0 }, cause, at).changed;
  }
  return `Emergency latched: scene ${number} (${scene.name}) on ${lit.reached} luminaires, ${off} others switched off.`;
}

/** A Manual claim at each luminaire's present level (ignoring any emergency) until the hold ends or the zone empties. */
export function holdZone(rt: Runtime, zone: string, minutes: number, cause: Cause, at: number): string {
  const ids = rt.model.luminairesByZone.get(zone) ?? [];
  const name = zoneName(rt.model, zone);
  if (ids.length === 0) return `${name} has no luminaires on this site; nothing held.`;
  const writes = ids.map((deviceId) => ({ deviceId, level: levelBelowEmergency(rt.state.overrides[deviceId], rt.state.levels[deviceId] ?? 0) }));
  writeLevels(rt, writes, "manual", at + minutes * 60_000, { kind: "lightness" }, cause, at);
  return `${name} held at its present level for ${minutes} min; sensors and schedules wait underneath.`;
}
