import { revokeApiKey } from "@/db/queries/api-keys";
import { siteRoute } from "@/lib/auth/route";
import { keyParamsSchema } from "@/lib/validation/keys";

/** Revokes a key at once: the next gateway request with it answers 401. A revoked key stays listed for the record; revoking it again is a 404. */
export const DELETE = siteRoute(
  "gateway-keys.manage",
  async ({ params }) => {
    await revokeApiKey({ siteId: params.siteId, keyId: params.keyId });
    return Response.json({ ok: true });
  },
  { params: keyParamsSchema },
);
