import { getVapidKeys } from "@/db/queries/notices";
import { userRoute } from "@/lib/auth/route";
import { pushServiceUrl } from "@/lib/push/service-client";

export const dynamic = "force-dynamic";

/**
 * What a browser needs to subscribe: the VAPID public key (RFC 8292, the
 * applicationServerKey) and whether a local demo push service is running.
 */
export const GET = userRoute(async () => {
  const { publicKey } = await getVapidKeys();
  return Response.json({ publicKey, hasDemoService: pushServiceUrl() !== null }, { headers: { "cache-control": "no-store" } });
});
