import { deletePushSubscription, listPushSubscriptions, savePushSubscription } from "@/db/queries/notices";
import { fieldErrors } from "@/lib/api/respond";
import { readJson, userRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { fromB64u } from "@/lib/push/base64url";
import { isP256Point } from "@/lib/push/ece";
import { deleteDemoSubscription, demoSubscriptionId } from "@/lib/push/service-client";
import { subscribeBodySchema, unsubscribeBodySchema } from "@/lib/validation/notices";
import { z } from "zod";

export const dynamic = "force-dynamic";

/** The browsers this person gets push notices on. */
export const GET = userRoute(async ({ user }) => {
  return Response.json({ subscriptions: await listPushSubscriptions({ userId: user.id }) }, { headers: { "cache-control": "no-store" } });
});

/**
 * Stores this browser's push subscription. Anything that is not a usable
 * subscription is a 400 with what is wrong, and nothing is stored.
 */
export const POST = userRoute(async ({ request, user }) => {
  const parsed = subscribeBodySchema.safeParse(await readJson(request, z.unknown(), 8 * 1024));
  const bad = (fields: Record<string, string[]>) => new AppError("bad_request", "That is not a usable push subscription.", { fields });
  if (!parsed.success) throw bad(fieldErrors(parsed.error));
  const { subscription, origin, label } = parsed.data;
  if (!isP256Point(fromB64u(subscription.keys.p256dh)!)) throw bad({ "subscription.keys.p256dh": ["keys.p256dh is not a point on P-256"] });
  const endpoint = new URL(subscription.endpoint);
  if (origin === "demo" && !demoSubscriptionId(subscription.endpoint)) throw bad({ "subscription.endpoint": ["endpoint is not one of this console's local push service"] });
  // RFC 8030 §8: push services are reached over HTTPS.
  if (origin === "browser" && endpoint.protocol !== "https:") throw bad({ "subscription.endpoint": ["endpoint must be an https: URL"] });
  const row = await savePushSubscription({ userId: user.id, subscription, origin, label });
  return Response.json({ id: row.id }, { status: 201 });
});

/** Forgets this browser's subscription (and, for a demo one, tells the local push service). */
export const DELETE = userRoute(async ({ request, user }) => {
  const { endpoint } = await readJson(request, unsubscribeBodySchema, 4 * 1024);
  const row = await deletePushSubscription({ userId: user.id, endpoint });
  if (!row) throw new AppError("not_found", "No such subscription for you.");
  const demoId = row.origin === "demo" ? demoSubscriptionId(row.endpoint) : null;
  if (demoId) await deleteDemoSubscription(demoId).catch(() => undefined);
  return Response.json({ ok: true });
});
