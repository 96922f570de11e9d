/**
 * How hard and how often the notice worker tries: the retry schedule after a
 * failed send, and the per-person rate limit that folds a burst into one
 * message with a count. Numbers are this project's choice (no source).
 */

/** Pause before attempt n+1 after n failed attempts: 10 s, 30 s, 2 min, 10 min, 30 min. */
export const BACKOFF_MS = [10_000, 30_000, 120_000, 600_000, 1_800_000] as const;
/** After this many failed attempts a delivery is given up and marked failed. */
export const MAX_ATTEMPTS = 6;

/** When to try again after `failedAttempts` failures, or null when it is time to give up. */
export function nextAttemptAt(failedAttempts: number, now: number): number | null {
  if (failedAttempts >= MAX_ATTEMPTS) return null;
  return now + BACKOFF_MS[Math.min(Math.max(failedAttempts, 1), BACKOFF_MS.length) - 1];
}

/** Per person and channel (push, e-mail): at most this many messages in any window. */
export const RATE_LIMIT = { windowMs: 60_000, maxPerWindow: 3 } as const;

/**
 * Whether one more message may go now, given when the earlier ones went. When
 * not, `retryAt` is when the window has room again; what waits until then is
 * sent as one message carrying a count.
 */
export function rateDecision(sentAts: readonly number[], now: number, limit: { windowMs: number; maxPerWindow: number } = RATE_LIMIT): { isAllowed: true } | { isAllowed: false; retryAt: number } {
  const inWindow = sentAts.filter((t) => t > now - limit.windowMs).sort((a, b) => a - b);
  if (inWindow.length < limit.maxPerWindow) return { isAllowed: true };
  return { isAllowed: false, retryAt: inWindow[inWindow.length - limit.maxPerWindow] + limit.windowMs };
}
