import { encodeTransitionTime } from "./transition-time";

/**
 * Unacknowledged access messages the gateway sends for the engine (opcodes from
 * Mesh Model 1.0.1 Table 7.1, parameters little-endian). Unacknowledged because
 * a group message would otherwise draw one status reply per luminaire, and the
 * engine's state is what it commanded, not what was echoed.
 */
export const OPCODES = {
  genericOnOffSetUnack: [0x82, 0x03],
  lightLightnessSetUnack: [0x82, 0x4d],
  sceneRecallUnack: [0x82, 0x43],
} as const;

/** Optional pair: the spec sends Delay only together with Transition Time, so both or neither. */
export type Timing = { transitionMs?: number; delayMs?: number };

export type OnOffSet = { isOn: boolean; tid: number } & Timing;
export type LightnessSet = { lightness: number; tid: number } & Timing;
export type SceneRecall = { scene: number; tid: number } & Timing;

export function encodeGenericOnOffSetUnack(message: OnOffSet): Uint8Array {
  return build(OPCODES.genericOnOffSetUnack, [message.isOn ? 1 : 0, tidOctet(message.tid)], message);
}

export function encodeLightLightnessSetUnack(message: LightnessSet): Uint8Array {
  if (!Number.isInteger(message.lightness) || message.lightness < 0 || message.lightness > 0xffff) {
    throw new RangeError(`lightness must be an integer 0–65535, got ${message.lightness}`);
  }
  return build(OPCODES.lightLightnessSetUnack, [...le16(message.lightness), tidOctet(message.tid)], message);
}

export function encodeSceneRecallUnack(message: SceneRecall): Uint8Array {
  if (!isValidSceneNumber(message.scene)) throw new RangeError(`scene number must be 1–65535, got ${message.scene}`);
  return build(OPCODES.sceneRecallUnack, [...le16(message.scene), tidOctet(message.tid)], message);
}

const HEX = Array.from({ length: 256 }, (_, b) => b.toString(16).toUpperCase().padStart(2, "0"));

/** "82 03 01 05 19 00": upper-case octets separated by spaces, as the spec's tables print them. */
export function toHex(bytes: Uint8Array): string {
  let out = "";
  for (let i = 0; i < bytes.length; i++) out += i === 0 ? HEX[bytes[i]] : ` ${HEX[bytes[i]]}`;
  return out;
}

/** Scene numbers are 16-bit; 0x0000 is prohibited (Mesh Model 1.0.1 §5.1.3.1). */
export function isValidSceneNumber(scene: number): boolean {
  return Number.isInteger(scene) && scene >= 0x0001 && scene <= 0xffff;
}

/** TID counters wrap at 255 (an octet); the next one after 255 is 0. */
export function nextTid(tid: number): number {
  return (tidOctet(tid) + 1) & 0xff;
}

/** TTL is 7 bits, 0–127 (Mesh Profile 1.0.1 §3.4.4.3). */
export const TTL_MAX = 127;

export function isValidTtl(ttl: number): boolean {
  return Number.isInteger(ttl) && ttl >= 0 && ttl <= TTL_MAX;
}

/** TTL 0 and 1 are never relayed; 2–127 are (Mesh Profile 1.0.1 §3.4.4.3). */
export function isRelayed(ttl: number): boolean {
  return isValidTtl(ttl) && ttl >= 2;
}

/** The TTL a relay puts on the message it retransmits, or null when it must not relay it. */
export function ttlAfterRelay(ttl: number): number | null {
  return isRelayed(ttl) ? ttl - 1 : null;
}

/** How many relays a message sent with this TTL can cross: TTL 127 → 126 (Mesh Profile 1.0.1 §3.4.4.3). */
export function maxRelays(ttl: number): number {
  return isRelayed(ttl) ? ttl - 1 : 0;
}

/** The smallest TTL that crosses `hops` relays; 0 hops → TTL 0 (direct, never relayed). */
export function ttlForRelays(hops: number): number {
  if (!Number.isInteger(hops) || hops < 0 || hops > TTL_MAX - 1) throw new RangeError(`hops must be 0–126, got ${hops}`);
  return hops === 0 ? 0 : hops + 1;
}

function build(opcode: readonly number[], params: number[], timing: Timing): Uint8Array {
  const tail: number[] = [];
  if (timing.transitionMs !== undefined) {
    tail.push(encodeTransitionTime(timing.transitionMs), delayOctet(timing.delayMs ?? 0));
  } else if (timing.delayMs !== undefined) {
    throw new RangeError("a delay needs a transition time too (Mesh Model 1.0.1 §3.2.1.2)");
  }
  return Uint8Array.from([...opcode, ...params, ...tail]);
}

/** Delay is counted in 5 ms steps in one octet (Mesh Model 1.0.1 §3.2.1.2): 0–1275 ms. */
function delayOctet(ms: number): number {
  const steps = Math.round(ms / 5);
  if (!Number.isFinite(ms) || steps < 0 || steps > 0xff) throw new RangeError(`delay must be 0–1275 ms, got ${ms}`);
  return steps;
}

function tidOctet(tid: number): number {
  if (!Number.isInteger(tid) || tid < 0 || tid > 0xff) throw new RangeError(`TID must be 0–255, got ${tid}`);
  return tid;
}

function le16(value: number): [number, number] {
  return [value & 0xff, (value >> 8) & 0xff];
}
