/** Only same-site paths may be a post-sign-in destination (no open redirect). */
export function safeNext(next: string | null | undefined, fallback = "/sites"): string {
  if (!next || !next.startsWith("/") || next.startsWith("//") || next.startsWith("/\\")) return fallback;
  return next;
}
