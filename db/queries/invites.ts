import { and, asc, eq, gt, isNull } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { invites, memberships, sites, users, type Invite } from "@/db/schema";
import type { Role } from "@/lib/auth/roles";

export type PendingInvite = Pick<Invite, "id" | "email" | "role" | "zoneIds" | "expiresAt" | "lastSentAt"> & { invitedByName: string | null };

export async function createInvite(input: { siteId: string; email: string; role: Role; zoneIds: string[] | null; tokenHash: string; invitedBy: string; expiresAt: Date; now: Date }): Promise<Invite> {
  const db = getDb();
  return db.transaction(async (tx) => {
    // A newer invite to the same address replaces the older pending one.
    await tx
      .update(invites)
      .set({ revokedAt: input.now })
      .where(and(eq(invites.siteId, input.siteId), eq(invites.email, input.email), isNull(invites.acceptedAt), isNull(invites.revokedAt)));
    const [row] = await tx
      .insert(invites)
      .values({ id: randomUUID(), siteId: input.siteId, email: input.email, role: input.role, zoneIds: input.role === "occupant" ? input.zoneIds : null, tokenHash: input.tokenHash, invitedBy: input.invitedBy, expiresAt: input.expiresAt, lastSentAt: input.now })
      .returning();
    return row;
  });
}

export async function listPendingInvites({ siteId, now }: { siteId: string; now: Date }): Promise<PendingInvite[]> {
  return getDb()
    .select({ id: invites.id, email: invites.email, role: invites.role, zoneIds: invites.zoneIds, expiresAt: invites.expiresAt, lastSentAt: invites.lastSentAt, invitedByName: users.name })
    .from(invites)
    .leftJoin(users, eq(users.id, invites.invitedBy))
    .where(and(eq(invites.siteId, siteId), isNull(invites.acceptedAt), isNull(invites.revokedAt), gt(invites.expiresAt, now)))
    .orderBy(asc(invites.email));
}

export async function getPendingInvite({ siteId, inviteId, now }: { siteId: string; inviteId: string; now: Date }): Promise<Invite | undefined> {
  const [row] = await getDb()
    .select()
    .from(invites)
    .where(and(eq(invites.siteId, siteId), eq(invites.id, inviteId), isNull(invites.acceptedAt), isNull(invites.revokedAt), gt(invites.expiresAt, now)));
  return row;
}

/** Resend: a fresh token and a fresh 7-day expiry; the old link stops working. */
export async function renewInvite({ siteId, inviteId, tokenHash, expiresAt, now }: { siteId: string; inviteId: string; tokenHash: string; expiresAt: Date; now: Date }): Promise<boolean> {
  const rows = await getDb()
    .update(invites)
    .set({ tokenHash, expiresAt, lastSentAt: now })
    .where(and(eq(invites.siteId, siteId), eq(invites.id, inviteId), isNull(invites.acceptedAt), isNull(invites.revokedAt)))
    .returning({ id: invites.id });
  return rows.length > 0;
}

export async function revokeInvite({ siteId, inviteId, now }: { siteId: string; inviteId: string; now: Date }): Promise<boolean> {
  const rows = await getDb()
    .update(invites)
    .set({ revokedAt: now })
    .where(and(eq(invites.siteId, siteId), eq(invites.id, inviteId), isNull(invites.acceptedAt), isNull(invites.revokedAt)))
    .returning({ id: invites.id });
  return rows.length > 0;
}

export type InviteSummary = { email: string; role: Role; siteName: string; hasAccount: boolean; expiresAt: Date };

/** What the accept page shows for a live token; undefined for unknown, used, revoked or expired. */
export async function findLiveInvite({ tokenHash, now }: { tokenHash: string; now: Date }): Promise<(InviteSummary & { id: string; siteId: string; zoneIds: string[] | null }) | undefined> {
  const db = getDb();
  const [row] = await db
    .select({ id: invites.id, siteId: invites.siteId, email: invites.email, role: invites.role, zoneIds: invites.zoneIds, expiresAt: invites.expiresAt, siteName: sites.name })
    .from(invites)
    .innerJoin(sites, eq(sites.id, invites.siteId))
    .where(and(eq(invites.tokenHash, tokenHash), isNull(invites.acceptedAt), isNull(invites.revokedAt), gt(invites.expiresAt, now)));
  if (!row) return undefined;
  const [user] = await db.select({ id: users.id }).from(users).where(eq(users.email, row.email));
  return { ...row, hasAccount: Boolean(user) };
}

/**
 * Uses the invite once and gives the user its role, atomically: a second
 * accept of the same token finds nothing to update and returns undefined.
 */
export async function acceptInvite({ tokenHash, userId, now }: { tokenHash: string; userId: string; now: Date }): Promise<{ siteId: string; role: Role } | undefined> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .update(invites)
      .set({ acceptedAt: now })
      .where(and(eq(invites.tokenHash, tokenHash), isNull(invites.acceptedAt), isNull(invites.revokedAt), gt(invites.expiresAt, now)))
      .returning({ siteId: invites.siteId, role: invites.role, zoneIds: invites.zoneIds });
    if (!row) return undefined;
    await tx
      .insert(memberships)
      .values({ siteId: row.siteId, userId, role: row.role, zoneIds: row.zoneIds })
      .onConflictDoUpdate({ target: [memberships.siteId, memberships.userId], set: { role: row.role, zoneIds: row.zoneIds } });
    return { siteId: row.siteId, role: row.role };
  });
}
