import { OVERRIDE_LEVELS, type OverrideLevel } from "@/lib/rules/trigger-key";
import { planLevelCommands, type Addressed, type LevelMessage } from "./emit";
import { effectiveLevel, topLevel } from "./overrides";
import type { Runtime } from "./runtime";
import type { Cause, Slot, StateChange } from "./types";

export type WriteResult = { reached: number; changed: number; held: number; heldBy: OverrideLevel | null };

/**
 * Puts a claim at `slot` on each luminaire, then sends commands for those where
 * that claim is now the highest. Luminaires held higher keep their level; the
 * claim waits underneath for when the hold ends.
 */
export function writeLevels(
  rt: Runtime,
  writes: { deviceId: string; level: number }[],
  slot: OverrideLevel,
  until: number | null,
  message: LevelMessage,
  cause: Cause,
  at: number,
): WriteResult {
  const addressed: Addressed[] = [];
  let held = 0;
  let changed = 0;
  let heldBy: OverrideLevel | null = null;
  for (const w of writes) {
    const stack = (rt.state.overrides[w.deviceId] ??= {});
    stack[slot] = { level: w.level, until };
    const top = topLevel(stack);
    if (top !== slot) {
      held++;
      heldBy = top;
      continue;
    }
    const isChanged = settle(rt, w.deviceId, cause, at);
    if (isChanged) changed++;
    addressed.push({ deviceId: w.deviceId, to: w.level, isChanged });
  }
  if (until !== null) scheduleHoldEnds(rt, writes.map((w) => w.deviceId), until);
  planLevelCommands(rt, addressed, message, cause, at);
  return { reached: addressed.length, changed, held, heldBy };
}

/** Recomputes a luminaire's level from its claims; records the change. */
export function settle(rt: Runtime, deviceId: string, cause: Cause, at: number): boolean {
  const from = rt.state.levels[deviceId] ?? 0;
  const stack = rt.state.overrides[deviceId];
  const to = effectiveLevel(stack, from);
  if (to === from) return false;
  rt.state.levels[deviceId] = to;
  rt.out.changes.push(levelChange(cause, at, deviceId, from, to, topLevel(stack)));
  return true;
}

/** withCause for the commonest output, as one literal per shape (the engine makes one per luminaire that changes). */
function levelChange(cause: Cause, at: number, deviceId: string, from: number, to: number, source: OverrideLevel | null): StateChange {
  const { origin, ruleId, actionId, reason } = cause;
  return reason ? { origin, ruleId, actionId, reason, at, kind: "level", deviceId, from, to, source } : { origin, ruleId, actionId, at, kind: "level", deviceId, from, to, source };
}

/** Drops the claims `drop` picks, then moves each luminaire to what is left. Returns how many changed. */
export function releaseClaims(
  rt: Runtime,
  deviceIds: string[],
  drop: (level: OverrideLevel, slot: Slot) => boolean,
  fadeMs: number | undefined,
  cause: Cause,
  at: number,
): number {
  const addressed: Addressed[] = [];
  for (const id of deviceIds) {
    const stack = rt.state.overrides[id];
    if (!stack) continue;
    let isDropped = false;
    for (const level of OVERRIDE_LEVELS) {
      const slot = stack[level];
      if (slot && drop(level, slot)) {
        delete stack[level];
        isDropped = true;
      }
    }
    if (topLevel(stack) === null) delete rt.state.overrides[id];
    if (isDropped && settle(rt, id, cause, at)) addressed.push({ deviceId: id, to: rt.state.levels[id], isChanged: true });
  }
  planLevelCommands(rt, addressed, { kind: "lightness", fadeMs }, cause, at);
  return addressed.length;
}

/**
 * Manual holds end per zone, with one timer per zone so a whole zone lets go in
 * one group message. The timer always points at the earliest hold still running.
 */
export function holdGroupOf(rt: Runtime, deviceId: string): string {
  const zoneId = rt.model.devices.get(deviceId)?.zoneId;
  return zoneId ?? `device:${deviceId}`;
}

export function holdGroupMembers(rt: Runtime, group: string): string[] {
  return group.startsWith("device:") ? [group.slice("device:".length)] : rt.model.luminairesByZone.get(group) ?? [];
}

function scheduleHoldEnds(rt: Runtime, deviceIds: string[], until: number) {
  for (const group of new Set(deviceIds.map((id) => holdGroupOf(rt, id)))) {
    const key = `hold|${group}`;
    const current = rt.timers.get(key);
    if (!current || current.due > until) rt.timers.set(key, until, { kind: "hold-end", zone: group });
  }
}

/** After a hold timer fires: points the zone's timer at the next hold still running, if any. */
export function rescheduleHoldEnd(rt: Runtime, group: string): void {
  let next: number | null = null;
  for (const id of holdGroupMembers(rt, group)) {
    const until = rt.state.overrides[id]?.manual?.until;
    if (until != null && (next === null || until < next)) next = until;
  }
  if (next !== null) rt.timers.set(`hold|${group}`, next, { kind: "hold-end", zone: group });
}
