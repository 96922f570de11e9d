import { findPushSubscription } from "@/db/queries/notices";
import { readJson, userRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { demoSubscriptionId, receiveDemoMessages } from "@/lib/push/service-client";
import { unsubscribeBodySchema } from "@/lib/validation/notices";

export const dynamic = "force-dynamic";

/**
 * Demo mode: the new push messages for this browser's demo subscription, each
 * handed over once, for the page to pass to its service worker (a real
 * browser gets them from its push service as `push` events).
 */
export const POST = userRoute(async ({ request, user }) => {
  const { endpoint } = await readJson(request, unsubscribeBodySchema, 4 * 1024);
  const row = await findPushSubscription({ userId: user.id, endpoint });
  const id = row?.origin === "demo" ? demoSubscriptionId(endpoint) : null;
  // Gone (a 410 removed it, or another person took the browser): the page turns demo push off.
  if (!id) throw new AppError("not_found", "This browser has no demo subscription for you.");
  try {
    const messages = await receiveDemoMessages(id);
    return Response.json({ messages: messages.map((m) => m.payload) }, { headers: { "cache-control": "no-store" } });
  } catch {
    throw new AppError("unavailable", "The local push service does not answer.");
  }
});
