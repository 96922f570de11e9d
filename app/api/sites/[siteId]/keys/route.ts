import { createApiKey, listApiKeys } from "@/db/queries/api-keys";
import { readJson, siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { keyCreateSchema, MAX_ACTIVE_KEYS } from "@/lib/validation/keys";

export const dynamic = "force-dynamic";

/** The site's gateway keys, revoked ones included, oldest first; never the keys themselves. Integrators only. */
export const GET = siteRoute("gateway-keys.manage", async ({ siteId }) => {
  const keys = await listApiKeys({ siteId });
  return Response.json({ keys }, { headers: { "cache-control": "no-store" } });
});

/**
 * A new gateway key. This answer is the only time the key is sent: only its
 * SHA-256 is stored, so a lost key is revoked and replaced, not recovered.
 */
export const POST = siteRoute("gateway-keys.manage", async ({ request, siteId, user }) => {
  const { name } = await readJson(request, keyCreateSchema, 4 * 1024);
  const active = (await listApiKeys({ siteId })).filter((k) => k.revokedAt === null).length;
  if (active >= MAX_ACTIVE_KEYS) throw new AppError("conflict", `This site already has ${MAX_ACTIVE_KEYS} active keys; revoke one that is no longer used first.`);
  const { key, row } = await createApiKey({ siteId, name, createdBy: user.id });
  return Response.json({ key, row }, { status: 201, headers: { "cache-control": "no-store" } });
});
