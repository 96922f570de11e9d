/**
 * Cross-site request forgery guard for cookie-authenticated state changes:
 * the browser's Origin header must be this app's. Requests without Origin are
 * refused (every current browser sends it on POST/PATCH/PUT/DELETE).
 */
export function isSameOrigin(request: Request, appUrl: string): boolean {
  const origin = request.headers.get("origin");
  if (!origin) return false;
  const allowed = new Set([new URL(appUrl).origin, new URL(request.url).origin]);
  const host = request.headers.get("x-forwarded-host") ?? request.headers.get("host");
  if (host) {
    const proto = request.headers.get("x-forwarded-proto") ?? new URL(request.url).protocol.replace(":", "");
    allowed.add(`${proto}://${host}`);
  }
  return allowed.has(origin);
}

export function isStateChanging(method: string): boolean {
  return !["GET", "HEAD", "OPTIONS"].includes(method.toUpperCase());
}

/**
 * The client address for throttling: the right-most X-Forwarded-For entry,
 * which the Next.js server appends from the socket; set TRUST_PROXY_HOPS when a
 * proxy in front adds its own entries.
 */
export function clientAddress(request: Request, trustedHops = 0): string {
  const list = (request.headers.get("x-forwarded-for") ?? "")
    .split(",")
    .map((s) => s.trim())
    .filter(Boolean);
  const index = list.length - 1 - trustedHops;
  return list[index] ?? request.headers.get("x-real-ip") ?? "unknown";
}
