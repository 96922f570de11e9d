import { DEVICE_KIND_INFO, type DeviceKind } from "@/lib/catalogue/device-kinds";
import { PROFILE_SCHEMAS } from "@/lib/catalogue/profiles";
import { CONSOLE_DEVICE, LONG_PRESS_MS } from "@/lib/bus/derive";
import type { DeviceEvent } from "@/lib/bus/types";
import { localToInstant } from "@/lib/sun/local-time";
import { nextOccurrence, parseHhMm, type SiteClock } from "@/lib/sun/schedule";
import type { BenchAction, DeviceAction } from "@/lib/validation/bench";

/** One thing for the engine to do: take a device event, or let its clock run to an instant. */
export type EngineInput = { event: DeviceEvent } | { advanceTo: number };

/** A long press on the bench holds the button this long: past the engine's long-press time, as a hand would. */
export const LONG_PRESS_HOLD_MS = LONG_PRESS_MS + 500;
/** A walk past: the sensor reports motion, then its "no motion" report this long after (common practice, no source). */
export const WALK_PAST_MS = 5_000;

type Ctx = { siteId: string; now: number; site: SiteClock; newId: () => string; person: string };

/**
 * A bench action → what the engine should run, in order, on the bench's clock.
 * A long press is a press and a release 1.5 s apart, so the engine times it as it
 * would a real switch; "walk past" is a detection followed by silence (the
 * sensor's no-motion report, which changes nothing: vacancy is timed from the
 * last motion). set-date is not here: it starts a fresh sandbox (see setDateSpan).
 */
export function engineInputsFor(action: Exclude<BenchAction, { type: "set-date" }>, ctx: Ctx): EngineInput[] {
  const event = (device: string, kind: string, value: DeviceEvent["value"], at = ctx.now): EngineInput => ({ event: { id: ctx.newId(), siteId: ctx.siteId, at, device, kind, value } });
  switch (action.type) {
    case "press":
    case "release":
      return [event(action.device, action.type, action.button)];
    case "long-press":
      return [event(action.device, "press", action.button), event(action.device, "release", action.button, ctx.now + LONG_PRESS_HOLD_MS)];
    case "call":
      return [event(action.device, "press", 1)];
    case "turn":
      return [event(action.device, "turn", null)];
    case "walk-past":
      return [event(action.device, "motion", true), event(action.device, "motion", false, ctx.now + WALK_PAST_MS)];
    case "contact":
      return [event(action.device, "contact", action.state)];
    case "reading":
      return [event(action.device, action.measure, action.value)];
    case "fire-alarm":
      return [event(action.device, "fire-alarm", action.state)];
    case "clear-emergency":
      return [event(CONSOLE_DEVICE, "clear-emergency", ctx.person)];
    case "skip":
      return [{ advanceTo: ctx.now + action.minutes * 60_000 }];
    case "skip-to": {
      const at = nextOccurrence({ kind: "fixed", time: action.time }, ctx.now, ctx.site);
      return at === null ? [] : [{ advanceTo: at }];
    }
  }
}

/** set-date: a fresh sandbox whose clock starts at that local midnight and runs to the chosen time, so the day's schedules fire in order. */
export function setDateSpan(action: Extract<BenchAction, { type: "set-date" }>, site: SiteClock): { from: number; to: number } {
  const [year, month, day] = action.date.split("-").map(Number);
  const date = { year, month, day };
  return { from: localToInstant(date, 0, site.timeZone), to: localToInstant(date, parseHhMm(action.time), site.timeZone) };
}

/** What each device action needs the device to report. */
const NEEDS: Record<DeviceAction["type"], (a: DeviceAction) => string[]> = {
  press: () => ["press"],
  release: () => ["release"],
  "long-press": () => ["press", "release"],
  call: () => ["press"],
  turn: () => ["turn"],
  "walk-past": () => ["motion"],
  contact: () => ["contact"],
  reading: (a) => [(a as Extract<DeviceAction, { type: "reading" }>).measure],
  "fire-alarm": () => ["fire-alarm"],
};

export type CheckDevice = { id: string; name: string; kind: DeviceKind; profile?: unknown };

/** Buttons a device has: a rocker's from its profile (2 or 4), one for anything else that is pressed. */
export function buttonsOf(d: { kind: DeviceKind; profile?: unknown }): number {
  if (d.kind !== "kinetic-rocker") return 1;
  const parsed = PROFILE_SCHEMAS["kinetic-rocker"].safeParse(d.profile ?? {});
  return parsed.success ? parsed.data.buttons : 2;
}

/**
 * Whether the site's devices allow an action: the device exists, can report what
 * the action sends, and has the button. Returns the field at fault and why.
 */
export function checkAction(action: BenchAction, devices: CheckDevice[]): { field: string; message: string } | null {
  if (!("device" in action)) return null;
  const d = devices.find((x) => x.id === action.device);
  if (!d) return { field: "device", message: `No device "${action.device}" on this site (it may have been deleted).` };
  const info = DEVICE_KIND_INFO[d.kind];
  const missing = NEEDS[action.type](action).filter((k) => !info.reports.includes(k));
  if (missing.length) return { field: "type", message: `${d.name} (${info.label.toLowerCase()}) does not report ${missing.join(" or ")}.` };
  if (action.type === "call" && d.kind !== "kinetic-call-button") return { field: "type", message: `${d.name} is not a call button.` };
  if ("button" in action) {
    const buttons = buttonsOf(d);
    if (action.button > buttons) return { field: "button", message: `${d.name} has ${buttons} button${buttons === 1 ? "" : "s"}: choose 1${buttons > 1 ? ` to ${buttons}` : ""}.` };
  }
  return null;
}
