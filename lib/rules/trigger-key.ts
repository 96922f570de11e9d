import type { TriggerNode, TriggerType } from "./graph-triggers";

/**
 * A trigger key names one thing that can happen: a device plus what it reported
 * (and the threshold, button or time that makes it distinct). Rules are indexed
 * by it, and the engine derives the same keys from raw device events, so an event
 * only ever meets the rules that wait for it.
 */
export function triggerKey(type: string, ...parts: (string | number)[]): string {
  // Plain concatenation: the engine derives a key or two per event, and an array join costs several times this.
  let key = type;
  for (const part of parts) key += "|" + part;
  return key;
}

export function triggerKeyOf(node: TriggerNode): string {
  switch (node.type) {
    case "rocker-press":
    case "rocker-release":
    case "rocker-long-press":
      return triggerKey(node.type, node.params.device, node.params.button);
    case "call-button-press":
    case "door-handle-turn":
    case "motion-detected":
    case "contact-opened":
    case "contact-closed":
    case "fire-alarm-active":
    case "fire-alarm-cleared":
      return triggerKey(node.type, node.params.device);
    case "vacancy":
    case "contact-left-open":
      return triggerKey(node.type, node.params.device, node.params.minutes);
    case "light-level-below":
    case "light-level-above":
      return triggerKey(node.type, node.params.device, node.params.lux, node.params.hysteresisLux);
    case "temperature-above":
    case "temperature-below":
      return triggerKey(node.type, node.params.device, node.params.celsius, node.params.hysteresis);
    case "humidity-above":
    case "humidity-below":
      return triggerKey(node.type, node.params.device, node.params.percent, node.params.hysteresis);
    case "time-of-day": {
      const at = node.params.at;
      return at.kind === "fixed" ? triggerKey(node.type, "fixed", at.time) : triggerKey(node.type, at.kind, at.offsetMinutes);
    }
    case "site-mode-changed":
      return triggerKey(node.type, node.params.mode ?? ANY_MODE);
    case "timer-fired":
      return triggerKey(node.type, node.params.name);
  }
}

/** The key part of a site-mode trigger that listens to every change. */
export const ANY_MODE = "*";

/** Override levels, highest first: a level only shows when nothing above it holds the luminaire. */
export const OVERRIDE_LEVELS = ["emergency", "manual", "sensor", "schedule"] as const;
export type OverrideLevel = (typeof OVERRIDE_LEVELS)[number];

export const OVERRIDE_RANK: Record<OverrideLevel, number> = { emergency: 4, manual: 3, sensor: 2, schedule: 1 };

/** A person pressing something is Manual; readings are Sensor; the clock and modes are Schedule. */
export const TRIGGER_LEVEL: Record<TriggerType, OverrideLevel> = {
  "rocker-press": "manual",
  "rocker-release": "manual",
  "rocker-long-press": "manual",
  "call-button-press": "manual",
  "door-handle-turn": "manual",
  "motion-detected": "sensor",
  vacancy: "sensor",
  "light-level-below": "sensor",
  "light-level-above": "sensor",
  "contact-opened": "sensor",
  "contact-closed": "sensor",
  "contact-left-open": "sensor",
  "temperature-above": "sensor",
  "temperature-below": "sensor",
  "humidity-above": "sensor",
  "humidity-below": "sensor",
  "fire-alarm-active": "emergency",
  "fire-alarm-cleared": "emergency",
  "time-of-day": "schedule",
  "site-mode-changed": "schedule",
  "timer-fired": "schedule",
};

/** What the device must report (DEVICE_KIND_INFO.reports) for the trigger to ever fire; null for clock and site triggers. */
export const TRIGGER_REPORT: Record<TriggerType, string | null> = {
  "rocker-press": "press",
  "rocker-release": "release",
  "rocker-long-press": "long-press",
  "call-button-press": "press",
  "door-handle-turn": "turn",
  "motion-detected": "motion",
  vacancy: "motion",
  "light-level-below": "light-level",
  "light-level-above": "light-level",
  "contact-opened": "contact",
  "contact-closed": "contact",
  "contact-left-open": "contact",
  "temperature-above": "temperature",
  "temperature-below": "temperature",
  "humidity-above": "humidity",
  "humidity-below": "humidity",
  "fire-alarm-active": "fire-alarm",
  "fire-alarm-cleared": "fire-alarm",
  "time-of-day": null,
  "site-mode-changed": null,
  "timer-fired": null,
};
