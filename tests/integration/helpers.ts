import { getDb } from "@/db";
import { upsertMembership } from "@/db/queries/members";
import { createUser, findUserByEmail } from "@/db/queries/users";
import { seedDemo } from "@/db/seed";
import { hashPassword } from "@/lib/auth/password";
import type { Role } from "@/lib/auth/roles";
import { startSession } from "@/lib/auth/session";

export const BASE = "http://localhost:3000";
export const TEST_PASSWORD = "test-password-1";

type Opts = { cookie?: string | null; body?: unknown; origin?: string | null; headers?: Record<string, string> };

/** A Request as a browser on the console's own origin would send it. */
export function req(method: string, pathname: string, opts: Opts = {}): Request {
  const headers: Record<string, string> = { ...opts.headers };
  if (opts.cookie) headers.cookie = opts.cookie;
  if (opts.origin !== null && method !== "GET") headers.origin = opts.origin ?? BASE;
  if (opts.body !== undefined) headers["content-type"] = "application/json";
  return new Request(new URL(pathname, BASE), { method, headers, body: opts.body === undefined ? undefined : JSON.stringify(opts.body) });
}

export function get(pathname: string, opts: Opts = {}): Request {
  return req("GET", pathname, opts);
}

export function params<T extends Record<string, string>>(p: T): { params: Promise<T> } {
  return { params: Promise.resolve(p) };
}

export async function seedDemoSite() {
  return seedDemo(getDb());
}

let hashed: Promise<string> | undefined;

/** Creates (once) a user with TEST_PASSWORD, optionally a member of a site, and returns a Cookie header for a new session. */
export async function userWithSession(email: string, membership?: { siteId: string; role: Role; zoneIds?: string[] | null }): Promise<{ userId: string; cookie: string }> {
  hashed ??= hashPassword(TEST_PASSWORD);
  const user = (await findUserByEmail({ email })) ?? (await createUser({ email, name: email.split("@")[0], passwordHash: await hashed }));
  if (membership) await upsertMembership({ siteId: membership.siteId, userId: user.id, role: membership.role, zoneIds: membership.zoneIds ?? null });
  const setCookie = await startSession(user.id);
  return { userId: user.id, cookie: setCookie.split(";")[0] };
}

/** The cookie pair from a response's Set-Cookie header. */
export function cookieFrom(res: Response): string | null {
  const raw = res.headers.get("set-cookie");
  return raw ? raw.split(";")[0] : null;
}
