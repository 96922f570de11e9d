/** Sign-in throttling: after MAX_FAILURES failures inside WINDOW_MS a key waits until the oldest one ages out. */
export const MAX_FAILURES = 5;
export const WINDOW_MS = 15 * 60 * 1000;

export type ThrottleVerdict = { isBlocked: false } | { isBlocked: true; retryAfterMs: number };

/** `failures`: times (ms) of recent failures for one key, any order. */
export function throttleVerdict(failures: number[], now: number): ThrottleVerdict {
  const recent = failures.filter((t) => t > now - WINDOW_MS).sort((a, b) => b - a);
  if (recent.length < MAX_FAILURES) return { isBlocked: false };
  // The key is free again when the MAX_FAILURES-th most recent failure leaves the window.
  const pivot = recent[MAX_FAILURES - 1];
  return { isBlocked: true, retryAfterMs: Math.max(1000, pivot + WINDOW_MS - now) };
}

export function retryAfterText(ms: number): string {
  const minutes = Math.ceil(ms / 60_000);
  return minutes <= 1 ? "about a minute" : `${minutes} minutes`;
}
