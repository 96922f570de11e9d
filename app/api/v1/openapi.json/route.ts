import { errorResponse } from "@/lib/api/respond";
import { env } from "@/lib/env";
import { buildGatewayOpenApi, type OpenApiDocument } from "@/lib/gateway/openapi";

export const dynamic = "force-dynamic";

let cached: OpenApiDocument | undefined;

/**
 * The gateway API's OpenAPI 3.1 document. Public and cookie-free: it describes
 * the API, it opens nothing (every operation in it needs a site's key).
 */
export async function GET(): Promise<Response> {
  try {
    cached ??= buildGatewayOpenApi({ serverUrl: env().APP_URL.replace(/\/$/, "") });
    return Response.json(cached, { headers: { "cache-control": "public, max-age=300", "access-control-allow-origin": "*" } });
  } catch (err) {
    return errorResponse(err);
  }
}
