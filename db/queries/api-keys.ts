import { and, asc, eq, isNull } from "drizzle-orm";
import { createHash, randomBytes, randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { apiKeys } from "@/db/schema";
import { AppError } from "@/lib/errors";

const hashKey = (key: string) => createHash("sha256").update(key).digest("hex");

export type ApiKeyRow = { id: string; name: string; prefix: string; createdAt: Date; lastUsedAt: Date | null; revokedAt: Date | null };

export async function listApiKeys({ siteId }: { siteId: string }): Promise<ApiKeyRow[]> {
  return getDb()
    .select({ id: apiKeys.id, name: apiKeys.name, prefix: apiKeys.prefix, createdAt: apiKeys.createdAt, lastUsedAt: apiKeys.lastUsedAt, revokedAt: apiKeys.revokedAt })
    .from(apiKeys)
    .where(eq(apiKeys.siteId, siteId))
    .orderBy(asc(apiKeys.createdAt));
}

/**
 * A new gateway key: "jpk_" + 256 random bits. Returned once; only its SHA-256
 * is stored (a random 256-bit secret needs no slow hash).
 */
export async function createApiKey({ siteId, name, createdBy }: { siteId: string; name: string; createdBy: string | null }): Promise<{ key: string; row: ApiKeyRow }> {
  const key = `jpk_${randomBytes(32).toString("base64url")}`;
  const [row] = await getDb()
    .insert(apiKeys)
    .values({ id: randomUUID(), siteId, name, prefix: key.slice(0, 10), keyHash: hashKey(key), createdBy })
    .returning({ id: apiKeys.id, name: apiKeys.name, prefix: apiKeys.prefix, createdAt: apiKeys.createdAt, lastUsedAt: apiKeys.lastUsedAt, revokedAt: apiKeys.revokedAt });
  return { key, row };
}

export async function revokeApiKey({ siteId, keyId }: { siteId: string; keyId: string }): Promise<void> {
  const rows = await getDb()
    .update(apiKeys)
    .set({ revokedAt: new Date() })
    .where(and(eq(apiKeys.siteId, siteId), eq(apiKeys.id, keyId), isNull(apiKeys.revokedAt)))
    .returning({ id: apiKeys.id });
  if (!rows.length) throw new AppError("not_found", "No such active key on this site.");
}

/**
 * The key if it is valid, not revoked and for this site. "Last used" is written
 * at most once a minute, so a busy gateway does not add a write to every batch.
 */
export async function verifyApiKey({ key, siteId }: { key: string; siteId: string }): Promise<{ siteId: string; keyId: string } | null> {
  const db = getDb();
  const [row] = await db
    .select({ id: apiKeys.id, siteId: apiKeys.siteId, lastUsedAt: apiKeys.lastUsedAt })
    .from(apiKeys)
    .where(and(eq(apiKeys.keyHash, hashKey(key)), eq(apiKeys.siteId, siteId), isNull(apiKeys.revokedAt)));
  if (!row) return null;
  const now = Date.now();
  if (!row.lastUsedAt || now - row.lastUsedAt.getTime() > 60_000) await db.update(apiKeys).set({ lastUsedAt: new Date(now) }).where(eq(apiKeys.id, row.id));
  return { siteId: row.siteId, keyId: row.id };
}
