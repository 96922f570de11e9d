import type { GatewayCommand, StateChange } from "@/lib/bus/types";
import { decodeTransitionTime } from "@/lib/mesh/transition-time";

/**
 * How far apart the bench shows successive mesh messages sent at the same
 * instant. On a real mesh the spacing depends on the gateway's transmit count
 * and interval and on relays (tens to hundreds of ms); 150 ms is an
 * illustrative figure (common practice, no source) that makes the effect of
 * one message per luminaire — lights coming on one after another — easy to see.
 */
export const MESSAGE_SPACING_MS = 150;
/** Fades longer than this jump to their end on the bench, so the page never lags behind the clock. */
export const MAX_ANIMATION_MS = 60_000;

export type Transition = { deviceId: string; from: number; to: number; delayMs: number; durationMs: number; addressing: "group" | "unicast" | null };

type StepLike = { changes: StateChange[]; commands: GatewayCommand[] };

/**
 * The fades one step starts, to be played from the moment the page shows it.
 * Per luminaire only the last change in the step counts (a skip ahead may move a
 * light twice). The delay is the message's place among the messages sent at the
 * same instant × MESSAGE_SPACING_MS: a group message moves a whole zone at once,
 * separate unicast messages move luminaires one after another.
 */
export function planTransitions(step: StepLike): Transition[] {
  const last = new Map<string, Extract<StateChange, { kind: "level" }>>();
  const first = new Map<string, number>();
  for (const c of step.changes) {
    if (c.kind !== "level") continue;
    if (!first.has(c.deviceId)) first.set(c.deviceId, c.from);
    last.set(c.deviceId, c);
  }
  const out: Transition[] = [];
  for (const [deviceId, change] of last) {
    const sameInstant = step.commands.filter((cmd) => cmd.at === change.at);
    const index = sameInstant.findIndex((cmd) => cmd.devices.includes(deviceId) && cmd.message !== "generic-onoff-set-unack");
    const command = index >= 0 ? sameInstant[index] : null;
    const fade = command?.transition == null ? 0 : decodeTransitionTime(command.transition) ?? 0;
    out.push({
      deviceId,
      // A light moved twice in one step starts from where it was before the step, and ends where it ended.
      from: first.get(deviceId)!,
      to: change.to,
      delayMs: index >= 0 ? index * MESSAGE_SPACING_MS : 0,
      durationMs: fade > MAX_ANIMATION_MS ? 0 : fade,
      addressing: command?.addressing ?? null,
    });
  }
  return out;
}

/** The level a transition shows `elapsedMs` after the step was shown: linear in percent over the fade. */
export function levelAt(t: Transition, elapsedMs: number): number {
  if (elapsedMs < t.delayMs) return t.from;
  if (t.durationMs <= 0 || elapsedMs >= t.delayMs + t.durationMs) return t.to;
  return t.from + ((t.to - t.from) * (elapsedMs - t.delayMs)) / t.durationMs;
}

/** When the last transition of a step has finished, ms after it was shown. */
export function animationEnd(transitions: Transition[]): number {
  return transitions.reduce((end, t) => Math.max(end, t.delayMs + t.durationMs), 0);
}
