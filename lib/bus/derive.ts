import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import type { Measure, ThresholdWatch } from "@/lib/rules/rule-index";
import { triggerKey } from "@/lib/rules/trigger-key";
import { applyEmergency } from "./actions-levels";
import type { Occurrence, Runtime } from "./runtime";
import type { DeviceEvent } from "./types";

/** Press-to-release time that counts as a long press; common practice, no source. */
export const LONG_PRESS_MS = 1000;

type Derived = { occurrences: Occurrence[]; note: string | null };

/**
 * Events a person makes in the console rather than a device reports. Only one
 * exists: clearing a latched emergency (a manager or integrator, after the
 * fire-alarm system is reset). `value` names the person for the Trace.
 */
export const CONSOLE_DEVICE = "console";

function fromConsole(rt: Runtime, event: DeviceEvent, at: number): Derived {
  if (event.kind !== "clear-emergency") return { occurrences: [], note: `The console does not send "${event.kind}"; ignored.` };
  const outcome = applyEmergency(rt, { nodeId: "console", type: "clear-emergency", params: {} } as Parameters<typeof applyEmergency>[1], { origin: event.id, ruleId: null, actionId: null, reason: "cleared-by-person" }, at);
  return { occurrences: [], note: `Cleared in the console by ${String(event.value ?? "someone")}: ${outcome}` };
}

/**
 * Raw report → the triggers it amounts to, updating what the engine remembers of
 * the device. Readings only become triggers when they cross a watched threshold;
 * motion and contacts also start the timers for vacancy and "left open".
 */
export function deriveFromEvent(rt: Runtime, event: DeviceEvent, at: number): Derived {
  if (event.device === CONSOLE_DEVICE) return fromConsole(rt, event, at);
  const device = rt.model.devices.get(event.device);
  if (!device) return none("No device with this id is on the site; ignored.");
  const info = DEVICE_KIND_INFO[device.kind];
  if (!info.reports.includes(event.kind)) return none(`A ${info.label.toLowerCase()} does not report "${event.kind}"; ignored.`);
  const s = rt.state.sensors;
  const id = device.id;
  const occurrences: Occurrence[] = [];

  switch (event.kind) {
    case "press":
    case "release":
    case "long-press": {
      const button = event.value ?? 1;
      if (typeof button !== "number" || !Number.isInteger(button) || button < 1) return none("The button number is missing or not a whole number; ignored.");
      const pressKey = `${id}|${button}`;
      if (event.kind === "press") {
        s.pressedAt[pressKey] = at;
        occurrences.push(occurrence("rocker-press", button, triggerKey("rocker-press", id, button), at, event.id, id));
        occurrences.push(occurrence("call-button-press", button, triggerKey("call-button-press", id), at, event.id, id));
      } else if (event.kind === "release") {
        const pressedAt = s.pressedAt[pressKey];
        delete s.pressedAt[pressKey];
        occurrences.push(occurrence("rocker-release", button, triggerKey("rocker-release", id, button), at, event.id, id));
        // A switch that times its own hold sends "long-press"; one that does not is timed here.
        if (pressedAt !== undefined && at - pressedAt >= LONG_PRESS_MS) occurrences.push(occurrence("rocker-long-press", button, triggerKey("rocker-long-press", id, button), at, event.id, id));
      } else {
        occurrences.push(occurrence("rocker-long-press", button, triggerKey("rocker-long-press", id, button), at, event.id, id));
      }
      break;
    }
    case "turn":
      occurrences.push(occurrence("door-handle-turn", event.value, triggerKey("door-handle-turn", id), at, event.id, id));
      break;
    case "motion": {
      if (event.value === false || event.value === 0) return none("A no-motion report changes nothing: vacancy is timed from the last motion.");
      occurrences.push(occurrence("motion-detected", true, triggerKey("motion-detected", id), at, event.id, id));
      s.occupied[id] = true;
      rt.timers.set(`occupancy|${id}`, at + rt.model.occupancyMs, { kind: "occupancy", device: id });
      for (const w of rt.watchesByDevice.vacancy.get(id) ?? []) {
        rt.timers.set(`vacancy|${w.key}`, at + w.minutes * 60_000, { kind: "vacancy", triggerKey: w.key, device: id });
      }
      break;
    }
    case "light-level":
    case "temperature":
    case "humidity": {
      const value = event.value;
      if (typeof value !== "number" || !Number.isFinite(value)) return none("The reading is not a number; ignored.");
      const measure: Measure = event.kind === "light-level" ? "lux" : event.kind;
      s[measure][id] = value;
      for (const w of rt.watchesByDevice.thresholds.get(id) ?? []) {
        if (w.measure === measure && crosses(w, value, s.sides)) occurrences.push({ key: w.key, type: `${kindWord(measure)}-${w.direction}`, at, origin: event.id, device: id, value, depth: 0 });
      }
      break;
    }
    case "contact": {
      const isOpen = event.value === true || event.value === "open" || event.value === 1;
      const isClosed = event.value === false || event.value === "closed" || event.value === 0;
      if (!isOpen && !isClosed) return none('A contact reports "open" or "closed"; ignored.');
      const next = isOpen ? "open" : "closed";
      if (s.contacts[id] === next) return none(`Still ${next}; nothing changed.`);
      s.contacts[id] = next;
      const type = isOpen ? "contact-opened" : "contact-closed";
      occurrences.push(occurrence(type, next, triggerKey(type, id), at, event.id, id));
      for (const w of rt.watchesByDevice.leftOpen.get(id) ?? []) {
        if (isOpen) rt.timers.set(`left-open|${w.key}`, at + w.minutes * 60_000, { kind: "left-open", triggerKey: w.key, device: id });
        else rt.timers.cancel(`left-open|${w.key}`);
      }
      break;
    }
    case "fire-alarm": {
      const isActive = event.value === true || event.value === "active" || event.value === 1;
      if (s.fireAlarms[id] === isActive) return none(`The fire-alarm input is still ${isActive ? "active" : "clear"}.`);
      s.fireAlarms[id] = isActive;
      const type = isActive ? "fire-alarm-active" : "fire-alarm-cleared";
      occurrences.push(occurrence(type, isActive, triggerKey(type, id), at, event.id, id));
      break;
    }
    default:
      return none(`"${event.kind}" reports are not handled by the engine; ignored.`);
  }
  return { occurrences, note: occurrences.length === 0 ? "Reading stored; no watched threshold was crossed." : null };
}

function occurrence(type: string, value: unknown, key: string, at: number, origin: string, device: string): Occurrence {
  return { key, type, at, origin, device, value, depth: 0 };
}

function none(note: string): Derived {
  return { occurrences: [], note };
}

const kindWord = (m: Measure) => (m === "lux" ? "light-level" : m);

/**
 * Hysteresis: a "below T" watch fires when the reading drops under T and cannot
 * fire again until the reading has climbed back to T + margin (mirror for
 * "above"). A first reading already past T counts as a crossing.
 */
export function crosses(w: ThresholdWatch, value: number, sides: Record<string, "above" | "below">): boolean {
  const side = sides[w.key];
  if (w.direction === "below") {
    if (value < w.threshold) {
      sides[w.key] = "below";
      return side !== "below";
    }
    if (value >= w.threshold + w.hysteresis) sides[w.key] = "above";
    return false;
  }
  if (value > w.threshold) {
    sides[w.key] = "above";
    return side !== "above";
  }
  if (value <= w.threshold - w.hysteresis) sides[w.key] = "below";
  return false;
}
