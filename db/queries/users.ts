import { and, eq, gt, inArray, isNull, lt } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { passwordResets, signInFailures, users, type User } from "@/db/schema";

export async function findUserByEmail({ email }: { email: string }): Promise<User | undefined> {
  const [row] = await getDb().select().from(users).where(eq(users.email, email)).limit(1);
  return row;
}

export async function getUser({ userId }: { userId: string }): Promise<User | undefined> {
  const [row] = await getDb().select().from(users).where(eq(users.id, userId)).limit(1);
  return row;
}

export async function createUser(input: { email: string; name: string; passwordHash: string }): Promise<User> {
  const [row] = await getDb()
    .insert(users)
    .values({ id: randomUUID(), ...input })
    .returning();
  return row;
}

export async function updatePasswordHash({ userId, passwordHash }: { userId: string; passwordHash: string }): Promise<void> {
  await getDb().update(users).set({ passwordHash }).where(eq(users.id, userId));
}

// ── password reset tokens ────────────────────────────────────────────────

export async function createPasswordReset({ userId, tokenHash, expiresAt }: { userId: string; tokenHash: string; expiresAt: Date }) {
  const db = getDb();
  // One live reset link at a time: asking again invalidates the older ones.
  await db.update(passwordResets).set({ usedAt: new Date() }).where(and(eq(passwordResets.userId, userId), isNull(passwordResets.usedAt)));
  await db.insert(passwordResets).values({ id: randomUUID(), userId, tokenHash, expiresAt });
}

/**
 * Marks a reset token used and sets the new password in one transaction.
 * Returns the user id, or undefined when the token is unknown, used or expired.
 */
export async function consumePasswordReset({ tokenHash, passwordHash, now }: { tokenHash: string; passwordHash: string; now: Date }): Promise<string | undefined> {
  return getDb().transaction(async (tx) => {
    const [row] = await tx
      .update(passwordResets)
      .set({ usedAt: now })
      .where(and(eq(passwordResets.tokenHash, tokenHash), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, now)))
      .returning({ userId: passwordResets.userId });
    if (!row) return undefined;
    await tx.update(users).set({ passwordHash }).where(eq(users.id, row.userId));
    return row.userId;
  });
}

// ── sign-in throttling ───────────────────────────────────────────────────

export async function listRecentFailures({ keys, since }: { keys: string[]; since: Date }): Promise<Map<string, number[]>> {
  const rows = await getDb()
    .select({ key: signInFailures.key, at: signInFailures.at })
    .from(signInFailures)
    .where(and(inArray(signInFailures.key, keys), gt(signInFailures.at, since)));
  const out = new Map<string, number[]>(keys.map((k) => [k, []]));
  for (const r of rows) out.get(r.key)!.push(r.at.getTime());
  return out;
}

export async function recordFailures({ keys, at }: { keys: string[]; at: Date }): Promise<void> {
  const db = getDb();
  await db.insert(signInFailures).values(keys.map((key) => ({ key, at })));
  // Keep the table small: anything older than a day no longer matters.
  await db.delete(signInFailures).where(lt(signInFailures.at, new Date(at.getTime() - 24 * 3600 * 1000)));
}

export async function clearFailures({ key }: { key: string }): Promise<void> {
  await getDb().delete(signInFailures).where(eq(signInFailures.key, key));
}
