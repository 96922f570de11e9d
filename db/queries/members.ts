import { and, asc, count, eq } from "drizzle-orm";
import { getDb } from "@/db";
import { memberships, sites, users, type Membership } from "@/db/schema";
import type { Role } from "@/lib/auth/roles";
import { AppError } from "@/lib/errors";

export async function getMembership({ siteId, userId }: { siteId: string; userId: string }): Promise<Membership | undefined> {
  const [row] = await getDb()
    .select()
    .from(memberships)
    .where(and(eq(memberships.siteId, siteId), eq(memberships.userId, userId)))
    .limit(1);
  return row;
}

export type MemberSite = { id: string; name: string; role: Role };

export async function listSitesForUser({ userId }: { userId: string }): Promise<MemberSite[]> {
  return getDb()
    .select({ id: sites.id, name: sites.name, role: memberships.role })
    .from(memberships)
    .innerJoin(sites, eq(sites.id, memberships.siteId))
    .where(eq(memberships.userId, userId))
    .orderBy(asc(sites.name));
}

export type MemberRow = { userId: string; name: string; email: string; role: Role; zoneIds: string[] | null; createdAt: Date };

export async function listMembers({ siteId }: { siteId: string }): Promise<MemberRow[]> {
  return getDb()
    .select({ userId: users.id, name: users.name, email: users.email, role: memberships.role, zoneIds: memberships.zoneIds, createdAt: memberships.createdAt })
    .from(memberships)
    .innerJoin(users, eq(users.id, memberships.userId))
    .where(eq(memberships.siteId, siteId))
    .orderBy(asc(users.name));
}

/** Adds a member, or changes the role of one who already is (accepting an invite to a site you are on). */
export async function upsertMembership(input: { siteId: string; userId: string; role: Role; zoneIds: string[] | null }): Promise<void> {
  await getDb()
    .insert(memberships)
    .values(input)
    .onConflictDoUpdate({ target: [memberships.siteId, memberships.userId], set: { role: input.role, zoneIds: input.zoneIds } });
}

/** Changes a member's role; a site always keeps at least one integrator. */
export async function updateMember({ siteId, userId, role, zoneIds }: { siteId: string; userId: string; role: Role; zoneIds: string[] | null }): Promise<void> {
  await getDb().transaction(async (tx) => {
    const [current] = await tx
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.siteId, siteId), eq(memberships.userId, userId)));
    if (!current) throw new AppError("not_found", "That person is not a member of this site.");
    if (current.role === "integrator" && role !== "integrator") await assertAnotherIntegrator(tx, siteId);
    await tx
      .update(memberships)
      .set({ role, zoneIds: role === "occupant" ? zoneIds : null })
      .where(and(eq(memberships.siteId, siteId), eq(memberships.userId, userId)));
  });
}

export async function removeMember({ siteId, userId }: { siteId: string; userId: string }): Promise<void> {
  await getDb().transaction(async (tx) => {
    const [current] = await tx
      .select({ role: memberships.role })
      .from(memberships)
      .where(and(eq(memberships.siteId, siteId), eq(memberships.userId, userId)));
    if (!current) throw new AppError("not_found", "That person is not a member of this site.");
    if (current.role === "integrator") await assertAnotherIntegrator(tx, siteId);
    await tx.delete(memberships).where(and(eq(memberships.siteId, siteId), eq(memberships.userId, userId)));
  });
}

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

async function assertAnotherIntegrator(tx: Tx, siteId: string) {
  const [{ n }] = await tx
    .select({ n: count() })
    .from(memberships)
    .where(and(eq(memberships.siteId, siteId), eq(memberships.role, "integrator")));
  if (n <= 1) throw new AppError("conflict", "A site needs at least one integrator. Make someone else integrator first.");
}
