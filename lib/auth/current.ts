import "server-only";
import { cookies } from "next/headers";
import { redirect, notFound } from "next/navigation";
import { cache } from "react";
import { getMembership } from "@/db/queries/members";
import type { Membership } from "@/db/schema";
import { can, type Permission } from "./permissions";
import { refreshedSessionCookie, sessionCookieName, validateSessionId, type AuthResult } from "./session";

/** The signed-in person for server components, once per request. */
export const getCurrentSession = cache(async (): Promise<AuthResult> => {
  const store = await cookies();
  const result = await validateSessionId(store.get(sessionCookieName())?.value);
  if (result.session) {
    const fresh = refreshedSessionCookie(result.session);
    if (fresh) {
      try {
        const [pair] = fresh.split(";");
        const [name, value] = pair.split("=");
        store.set(name, value, { httpOnly: true, sameSite: "lax", path: "/", maxAge: 30 * 24 * 3600 });
      } catch {
        // Server components cannot set cookies; the next route handler call refreshes it.
      }
    }
  }
  return result;
});

/** For pages: the signed-in user, or a redirect to sign in and back. */
export async function requireUser(returnTo: string) {
  const { user } = await getCurrentSession();
  if (!user) redirect(`/sign-in?next=${encodeURIComponent(returnTo)}`);
  return user;
}

/** For pages: the membership allowing `permission` on the site; 404 for non-members, 403 page otherwise. */
export async function requireSitePermission(siteId: string, permission: Permission, returnTo: string): Promise<{ membership: Membership }> {
  const user = await requireUser(returnTo);
  const membership = await getMembership({ siteId, userId: user.id });
  if (!membership) notFound();
  if (!can(membership.role, permission)) redirect(`/sites/${siteId}?denied=1`);
  return { membership };
}
