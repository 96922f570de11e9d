import { listInbox } from "@/db/queries/notices";
import { userRoute } from "@/lib/auth/route";
import { inboxQuerySchema } from "@/lib/validation/notices";

export const dynamic = "force-dynamic";

/** The signed-in person's notices, newest first (?siteId, ?show=unread, ?before=<id> for older ones). */
export const GET = userRoute(async ({ request, user }) => {
  const query = inboxQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  const items = await listInbox({ userId: user.id, ...query });
  return Response.json({ items, hasMore: items.length === query.limit }, { headers: { "cache-control": "no-store" } });
});
