import { formatAddress } from "@/lib/mesh/address";
import { encodeGenericOnOffSetUnack, encodeLightLightnessSetUnack, encodeSceneRecallUnack, nextTid, toHex } from "@/lib/mesh/commands";
import { levelToActual } from "@/lib/mesh/lightness";
import { encodeTransitionTime } from "@/lib/mesh/transition-time";
import type { Runtime } from "./runtime";
import type { Cause, CommandMessage } from "./types";

/** How luminaires are told: a Light Lightness level, or a Scene Recall of levels they store. */
export type LevelMessage = { kind: "lightness"; fadeMs?: number } | { kind: "scene"; scene: number; fadeMs: number };
export type Addressed = { deviceId: string; to: number; isChanged: boolean };

/**
 * Turns the luminaires one action reached into as few messages as possible. A
 * zone gets one group message when every luminaire in it follows the action to
 * the same result (so they change together, no popcorning, and nothing held at a
 * higher override level is touched); otherwise each changed luminaire gets its
 * own unicast message. Nothing is sent when nothing changes.
 */
export function planLevelCommands(rt: Runtime, addressed: Addressed[], message: LevelMessage, cause: Cause, at: number): void {
  if (addressed.length === 0) return;
  // Usually one action reaches one zone: no grouping needed.
  const first = zoneOfAddressed(rt, addressed[0]);
  let isOneZone = true;
  for (let i = 1; i < addressed.length && isOneZone; i++) isOneZone = zoneOfAddressed(rt, addressed[i]) === first;
  if (isOneZone) {
    planZone(rt, first, addressed, message, cause, at);
    return;
  }
  const byZone = new Map<string | null, Addressed[]>();
  for (const a of addressed) {
    const zoneId = zoneOfAddressed(rt, a);
    const list = byZone.get(zoneId);
    if (list) list.push(a);
    else byZone.set(zoneId, [a]);
  }
  // Zones in site order, luminaires without a zone last.
  const zoneIds = [...byZone.keys()].sort((a, b) => zoneRank(rt, a) - zoneRank(rt, b));
  for (const zoneId of zoneIds) planZone(rt, zoneId, byZone.get(zoneId)!, message, cause, at);
}

function zoneOfAddressed(rt: Runtime, a: Addressed): string | null {
  return rt.model.devices.get(a.deviceId)?.zoneId ?? null;
}

function planZone(rt: Runtime, zoneId: string | null, inZone: Addressed[], message: LevelMessage, cause: Cause, at: number) {
  if (!inZone.some((a) => a.isChanged)) return;
  const group = zoneId === null ? null : rt.model.zones.get(zoneId)?.groupAddress ?? null;
  const members = zoneId === null ? [] : rt.model.luminairesByZone.get(zoneId) ?? [];
  const isWholeZone =
    group !== null &&
    members.every((id) => inZone.some((a) => a.deviceId === id)) &&
    (message.kind === "scene" || inZone.every((a) => a.to === inZone[0].to));
  if (isWholeZone) {
    sendLevel(rt, group, "group", message, inZone[0].to, members, cause, at);
    return;
  }
  for (const a of inZone) {
    if (!a.isChanged) continue;
    const address = rt.model.devices.get(a.deviceId)!.unicastAddress;
    sendLevel(rt, address, "unicast", message, a.to, [a.deviceId], cause, at);
  }
}

function zoneRank(rt: Runtime, zoneId: string | null): number {
  const i = zoneId === null ? -1 : rt.model.zoneOrder.indexOf(zoneId);
  return i < 0 ? Number.MAX_SAFE_INTEGER : i;
}

function sendLevel(rt: Runtime, destination: number, addressing: "group" | "unicast", message: LevelMessage, level: number, devices: string[], cause: Cause, at: number) {
  const transitionMs = message.fadeMs;
  if (message.kind === "scene") {
    send(rt, { destination, addressing, message: "scene-recall-unack", devices, fadeMs: transitionMs }, (tid) => encodeSceneRecallUnack({ scene: message.scene, tid, transitionMs }), cause, at);
  } else {
    send(rt, { destination, addressing, message: "light-lightness-set-unack", devices, fadeMs: transitionMs }, (tid) => encodeLightLightnessSetUnack({ lightness: levelToActual(level), tid, transitionMs }), cause, at);
  }
}

export function sendRelay(rt: Runtime, deviceId: string, isOn: boolean, cause: Cause, at: number): void {
  const destination = rt.model.devices.get(deviceId)!.unicastAddress;
  send(rt, { destination, addressing: "unicast", message: "generic-onoff-set-unack", devices: [deviceId], fadeMs: undefined }, (tid) => encodeGenericOnOffSetUnack({ isOn, tid }), cause, at);
}

type Envelope = { destination: number; addressing: "group" | "unicast"; message: CommandMessage; devices: string[]; fadeMs: number | undefined };

function send(rt: Runtime, env: Envelope, encode: (tid: number) => Uint8Array, cause: Cause, at: number) {
  const source = rt.model.gatewayAddress;
  const counter = formatAddress(source);
  // A receiver treats a repeat of (source, destination, TID) within seconds as the same transaction, so every message takes the next TID.
  const tid = rt.state.tids[counter] ?? 0;
  rt.state.tids[counter] = nextTid(tid);
  const transition = env.fadeMs === undefined ? null : encodeTransitionTime(env.fadeMs);
  const bytes = toHex(encode(tid));
  const { origin, ruleId, actionId, reason } = cause;
  const { destination, addressing, message, devices } = env;
  const ttl = rt.model.ttl;
  // withCause as one literal per shape: the engine sends a command for most actions.
  rt.out.commands.push(
    reason
      ? { origin, ruleId, actionId, reason, at, source, destination, addressing, message, tid, ttl, transition, bytes, devices }
      : { origin, ruleId, actionId, at, source, destination, addressing, message, tid, ttl, transition, bytes, devices },
  );
}
