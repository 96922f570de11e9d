/**
 * The Generic Default Transition Time octet (Mesh Model 1.0.1 §3.1.3): bits 0–5
 * count steps (0 = immediate, 0x01–0x3E, 0x3F = unknown), bits 6–7 pick the
 * step resolution. Encoding picks the finest resolution whose rounded step
 * count fits in 0x3E steps; that choice is a convention (the spec only defines
 * the layout) and it keeps short fades exact to 100 ms.
 */
const RESOLUTIONS_MS = [100, 1_000, 10_000, 600_000] as const;
const MAX_STEPS = 0x3e;
const UNKNOWN_STEPS = 0x3f;

/** Longest time the octet can carry: 62 × 10 min = 620 min. */
export const MAX_TRANSITION_MS = MAX_STEPS * RESOLUTIONS_MS[3];

/** Milliseconds → transition time octet. Longer than 620 min clamps to 0xFE (the longest). */
export function encodeTransitionTime(ms: number): number {
  if (!Number.isFinite(ms) || ms < 0) throw new RangeError(`transition time must be 0 ms or more, got ${ms}`);
  for (let resolution = 0; resolution < RESOLUTIONS_MS.length; resolution++) {
    const steps = Math.round(ms / RESOLUTIONS_MS[resolution]);
    if (steps <= MAX_STEPS) return (resolution << 6) | steps;
  }
  return (3 << 6) | MAX_STEPS;
}

/** Transition time octet → milliseconds, or null when the octet says "unknown" (steps 0x3F). */
export function decodeTransitionTime(octet: number): number | null {
  if (!Number.isInteger(octet) || octet < 0 || octet > 0xff) throw new RangeError(`not an octet: ${octet}`);
  const steps = octet & 0x3f;
  if (steps === UNKNOWN_STEPS) return null;
  return steps * RESOLUTIONS_MS[octet >> 6];
}

/** The fade a luminaire will actually run for a requested time, in words ("2.5 s", "1 min 30 s", "immediate"). */
export function describeTransitionTime(ms: number): string {
  const sent = decodeTransitionTime(encodeTransitionTime(ms)) ?? 0;
  if (sent === 0) return "immediate";
  if (sent < 60_000) return `${trimDecimals(sent / 1000)} s`;
  const totalMinutes = Math.floor(sent / 60_000);
  const seconds = Math.round((sent % 60_000) / 1000);
  const hours = Math.floor(totalMinutes / 60);
  const minutes = totalMinutes % 60;
  const parts: string[] = [];
  if (hours > 0) parts.push(`${hours} h`);
  if (minutes > 0) parts.push(`${minutes} min`);
  if (seconds > 0) parts.push(`${seconds} s`);
  return parts.join(" ");
}

function trimDecimals(n: number): string {
  return Number.isInteger(n) ? String(n) : n.toFixed(1);
}
