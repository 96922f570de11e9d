import { z } from "zod";
import { idSchema } from "@/lib/validation/site";

/*
 * Shared by the keys form (client) and the keys route handlers (server). It is
 * pure zod with no React or database, so both sides can import it; its natural
 * home is lib/validation/keys.ts.
 */

/** How many unrevoked keys a site may hold: one per gateway plus spares (common practice, no source). */
export const MAX_ACTIVE_KEYS = 20;

export const keyCreateSchema = z
  .object({
    name: z
      .string("Name the key")
      .trim()
      .min(1, "Name the key, e.g. after the gateway it goes in")
      .max(60, "Use at most 60 characters"),
  })
  .strict();

export type KeyCreateInput = z.input<typeof keyCreateSchema>;

/** Key ids are random UUIDs; the site id follows the console's URL id rule. */
export const keyParamsSchema = z.object({ siteId: idSchema, keyId: z.uuid("is not a key id") }).strict();

/** One key as the console lists it (dates as ISO strings over JSON); the key itself is never listed. */
export type KeyRowJson = { id: string; name: string; prefix: string; createdAt: string; lastUsedAt: string | null; revokedAt: string | null };

/** GET /api/sites/{siteId}/keys */
export type KeysResponse = { keys: KeyRowJson[] };

/** POST /api/sites/{siteId}/keys: the only answer that carries the key. */
export type KeyCreatedResponse = { key: string; row: KeyRowJson };
