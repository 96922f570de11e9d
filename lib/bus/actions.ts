import type { PathAction } from "@/lib/rules/compile";
import type { IndexedRule } from "@/lib/rules/rule-index";
import { ANY_MODE, triggerKey } from "@/lib/rules/trigger-key";
import { formatMinuteOfDay, minuteOfDay } from "@/lib/sun/local-time";
import { noticeKindFor } from "@/lib/rules/notice-kind";
import { sendRelay } from "./emit";
import { applyEmergency, describeWrite, holdZone } from "./actions-levels";
import { writeLevels } from "./levels";
import { withCause, type Occurrence, type Runtime } from "./runtime";
import { deviceName, sceneLevels, zoneName } from "./site-model";
import type { Cause } from "./types";

/** Carries out one action of a passed rule; returns what happened, in words, for the trace. */
export function applyAction(rt: Runtime, occ: Occurrence, rule: IndexedRule, action: PathAction): string {
  const cause: Cause = { origin: occ.origin, ruleId: rule.id, actionId: action.nodeId };
  const at = occ.at;
  const slot = rule.params.level;
  const manualUntil = slot === "manual" ? at + rt.model.manualHoldMs : null;
  switch (action.type) {
    case "recall-scene": {
      const scene = rt.model.scenes.get(action.params.scene);
      if (!scene) return `Scene ${action.params.scene} is not set up on this site; nothing sent.`;
      const result = writeLevels(rt, sceneLevels(rt.model, scene), slot, manualUntil, { kind: "scene", scene: scene.number, fadeMs: scene.fadeMs }, cause, at);
      return describeWrite(`Scene ${scene.number} (${scene.name})`, result);
    }
    case "set-level": {
      const target = action.params.target;
      const ids = "zone" in target ? rt.model.luminairesByZone.get(target.zone) ?? [] : rt.model.luminaireOrder.has(target.device) ? [target.device] : [];
      const name = "zone" in target ? zoneName(rt.model, target.zone) : deviceName(rt.model, target.device);
      if (ids.length === 0) return `${name} has no luminaires on this site; nothing sent.`;
      const writes = ids.map((deviceId) => ({ deviceId, level: action.params.level }));
      const result = writeLevels(rt, writes, slot, manualUntil, { kind: "lightness", fadeMs: action.params.fadeMs }, cause, at);
      return describeWrite(`${name} to ${action.params.level} %`, result);
    }
    case "toggle-zone": {
      const ids = rt.model.luminairesByZone.get(action.params.zone) ?? [];
      const name = zoneName(rt.model, action.params.zone);
      if (ids.length === 0) return `${name} has no luminaires on this site; nothing sent.`;
      const isLit = ids.some((id) => (rt.state.levels[id] ?? 0) > 0);
      const level = isLit ? 0 : action.params.level;
      const result = writeLevels(rt, ids.map((deviceId) => ({ deviceId, level })), slot, manualUntil, { kind: "lightness", fadeMs: action.params.fadeMs }, cause, at);
      return describeWrite(`${name} ${isLit ? "off" : `on at ${level} %`}`, result);
    }
    case "relay-on":
    case "relay-off":
    case "relay-on-for": {
      const id = action.params.device;
      if (!rt.model.devices.has(id)) return `${id} is not on this site; nothing sent.`;
      const isOn = action.type !== "relay-off";
      const name = deviceName(rt.model, id);
      if (action.type === "relay-on-for") rt.timers.set(`relay-off|${id}`, at + action.params.minutes * 60_000, { kind: "relay-off", device: id });
      else rt.timers.cancel(`relay-off|${id}`);
      const until = action.type === "relay-on-for" ? ` until ${clockText(rt, at + action.params.minutes * 60_000)}` : "";
      if (rt.state.relays[id] === isOn) return `${name} already ${isOn ? "on" : "off"}${until}; nothing sent.`;
      rt.state.relays[id] = isOn;
      rt.out.changes.push(withCause(cause, { at, kind: "relay" as const, deviceId: id, isOn }));
      sendRelay(rt, id, isOn, cause, at);
      return `${name} ${isOn ? "on" : "off"}${until}.`;
    }
    case "notice": {
      const to = action.params.to;
      const recipients = "role" in to ? [`role:${to.role}`] : [...new Set(to.people)].map((p) => `person:${p}`);
      const text = renderNotice(rt, action.params.text, occ);
      const kind = noticeKindFor(occ.type, action.params.kind);
      // What it is about, for occupants' zones: the zone of the device that set it off (none for a clock or a named timer).
      const zoneId = occ.device ? (rt.model.devices.get(occ.device)?.zoneId ?? null) : null;
      for (const recipient of recipients) {
        // Event + rule + action + recipient: a retried event never sends the same notice twice.
        const dedupeKey = `${occ.origin}/${rule.id}/${action.nodeId}/${recipient}`;
        rt.out.notices.push(withCause(cause, { at, dedupeKey, recipient, channels: [...action.params.channels], text, kind, zoneId }));
      }
      return `Notice to ${recipients.join(", ")} by ${action.params.channels.join(", ")}.`;
    }
    case "start-timer": {
      const due = at + Math.round(action.params.minutes * 60_000);
      rt.timers.set(`timer|${action.params.name}`, due, { kind: "named", name: action.params.name });
      return `Timer "${action.params.name}" runs until ${clockText(rt, due)}.`;
    }
    case "cancel-timer":
      return rt.timers.cancel(`timer|${action.params.name}`) ? `Timer "${action.params.name}" cancelled.` : `Timer "${action.params.name}" was not running.`;
    case "latch-emergency":
    case "clear-emergency":
      return applyEmergency(rt, action, cause, at);
    case "set-site-mode": {
      const from = rt.state.mode;
      const to = action.params.mode;
      if (from === to) return `Site mode already ${to}.`;
      rt.state.mode = to;
      rt.out.changes.push(withCause(cause, { at, kind: "mode" as const, from, to }));
      for (const key of [triggerKey("site-mode-changed", to), triggerKey("site-mode-changed", ANY_MODE)]) {
        rt.queue.push({ key, type: "site-mode-changed", at, origin: occ.origin, device: null, value: to, depth: occ.depth + 1 });
      }
      return `Site mode ${from} → ${to}.`;
    }
    case "hold-zone":
      return holdZone(rt, action.params.zone, action.params.minutes, cause, at);
  }
}

function clockText(rt: Runtime, at: number): string {
  return formatMinuteOfDay(minuteOfDay(at, rt.model.site.timeZone));
}

/** Fills {device}, {zone} and {time} from the trigger; unknown placeholders stay as typed. */
export function renderNotice(rt: Runtime, template: string, occ: Occurrence): string {
  const device = occ.device ? rt.model.devices.get(occ.device) : undefined;
  const values: Record<string, string> = {
    device: deviceName(rt.model, occ.device),
    zone: zoneName(rt.model, device?.zoneId),
    time: clockText(rt, occ.at),
  };
  return template.replace(/\{(device|zone|time)\}/g, (_, name: string) => values[name]);
}
