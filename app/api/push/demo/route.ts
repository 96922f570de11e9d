import { getVapidKeys } from "@/db/queries/notices";
import { userRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { createDemoSubscription, pushServiceUrl } from "@/lib/push/service-client";

export const dynamic = "force-dynamic";

/**
 * Demo mode: takes a subscription from the local push service for this
 * console's VAPID key, as a browser's push stack would. The browser then
 * registers it like any other (POST /api/push/subscriptions, origin "demo").
 */
export const POST = userRoute(async () => {
  if (!pushServiceUrl()) throw new AppError("not_found", "There is no local push service here; use the browser's own push.");
  const { publicKey } = await getVapidKeys();
  try {
    return Response.json({ subscription: await createDemoSubscription(publicKey) }, { status: 201 });
  } catch {
    throw new AppError("unavailable", "The local push service does not answer. Start it with `npx tsx workers/push-service.ts`.");
  }
});
