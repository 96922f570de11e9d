import "server-only";
import { verifyApiKey } from "@/db/queries/api-keys";
import { errorResponse } from "@/lib/api/respond";
import { AppError } from "@/lib/errors";
import { siteParamsSchema } from "@/lib/validation/site";

type RouteContext = { params: Promise<Record<string, string | string[]>> };

/**
 * Gateway endpoints authenticate with a site key (`Authorization: Bearer jpk_…`),
 * not a session cookie, so they need no Origin check. A key for another site is
 * treated like a wrong key.
 */
export function gatewayRoute(fn: (ctx: { request: Request; siteId: string; keyId: string }) => Promise<Response>) {
  return async (request: Request, context?: RouteContext): Promise<Response> => {
    try {
      // The scheme name is case-insensitive (RFC 7235 §2.1); the key is checked before anything else is said.
      const match = /^bearer\s+(jpk_[A-Za-z0-9_-]{43})$/i.exec(request.headers.get("authorization") ?? "");
      if (!match) throw new AppError("unauthenticated", "Send the site's gateway key as Authorization: Bearer jpk_…");
      const params = siteParamsSchema.safeParse(await context?.params);
      const verified = params.success ? await verifyApiKey({ key: match[1], siteId: params.data.siteId }) : null;
      if (!params.success || !verified) throw new AppError("unauthenticated", "This key is wrong, revoked, or for another site.");
      const siteId = params.data.siteId;
      return await fn({ request, siteId, keyId: verified.keyId });
    } catch (err) {
      return errorResponse(err);
    }
  };
}
