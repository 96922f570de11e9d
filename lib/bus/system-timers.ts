import { sendRelay } from "./emit";
import { isZoneOccupied } from "./facts";
import { holdGroupMembers, releaseClaims, rescheduleHoldEnd } from "./levels";
import { systemCause, withCause, type Runtime } from "./runtime";
import { deviceName, zoneName } from "./site-model";
import type { TimerPayload } from "./timer-queue";
import type { ActionTrace } from "./types";

type SystemPayload = Extract<TimerPayload, { kind: "occupancy" | "relay-off" | "hold-end" }>;

/**
 * Timers the engine sets for itself rather than for a rule: a sensor going idle,
 * a relay's on-time running out, a manual hold ending. Their outputs name no rule
 * but carry a reason, and each gets its own trace entry saying what it did.
 */
/** What a system timer did: its action (if any) for the step, and its own trace entry when tracing. */
function reportSystem(rt: Runtime, at: number, origin: string, type: string, device: string | null, value: unknown, action: ActionTrace | null, note?: string) {
  if (action) rt.out.actions.push(action);
  if (rt.tracing) rt.out.trace.push({ at, origin, trigger: { key: null, type, device, value }, rules: [], actions: action ? [action] : [], ...(note ? { note } : {}) });
}

export function fireSystemTimer(rt: Runtime, p: SystemPayload, origin: string, at: number): void {

  switch (p.kind) {
    case "occupancy": {
      rt.state.sensors.occupied[p.device] = false;
      const zoneId = rt.model.devices.get(p.device)?.zoneId ?? null;
      if (!zoneId || isZoneOccupied(rt, zoneId)) {
        reportSystem(rt, at, origin, "sensor-idle", p.device, zoneId, null, "No motion for the occupancy time; the zone is still occupied by another sensor.");
        return;
      }
      // An empty zone ends manual holds and the occupancy claims that went with them (the manual-off-then-leave case must not relight).
      const released = releaseClaims(rt, rt.model.luminairesByZone.get(zoneId) ?? [], (level) => level === "manual" || level === "sensor", undefined, systemCause(origin, "zone-vacant"), at);
      const outcome = `${zoneName(rt.model, zoneId)} vacant: manual holds and sensor claims ended; ${released} luminaire${released === 1 ? "" : "s"} changed.`;
      reportSystem(rt, at, origin, "zone-vacant", p.device, zoneId, { ruleId: null, actionId: null, type: "release-claims", outcome });
      return;
    }
    case "relay-off": {
      const name = deviceName(rt.model, p.device);
      if (!rt.state.relays[p.device]) {
        reportSystem(rt, at, origin, "relay-time-up", p.device, false, null, `${name} was already off.`);
        return;
      }
      const cause = systemCause(origin, "relay-time-up");
      rt.state.relays[p.device] = false;
      rt.out.changes.push(withCause(cause, { at, kind: "relay" as const, deviceId: p.device, isOn: false }));
      sendRelay(rt, p.device, false, cause, at);
      reportSystem(rt, at, origin, "relay-time-up", p.device, false, { ruleId: null, actionId: null, type: "relay-off", outcome: `${name} off: its on-time ran out.` });
      return;
    }
    case "hold-end": {
      const members = holdGroupMembers(rt, p.zone);
      const released = releaseClaims(rt, members, (level, slot) => level === "manual" && slot.until !== null && slot.until <= at, undefined, systemCause(origin, "hold-ended"), at);
      rescheduleHoldEnd(rt, p.zone);
      const label = p.zone.startsWith("device:") ? deviceName(rt.model, members[0]) : zoneName(rt.model, p.zone);
      const outcome = `Manual hold on ${label} ended; ${released} luminaire${released === 1 ? "" : "s"} changed.`;
      reportSystem(rt, at, origin, "hold-ended", null, p.zone, { ruleId: null, actionId: null, type: "release-claims", outcome });
      return;
    }
  }
}
