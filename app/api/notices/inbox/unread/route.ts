import { countUnread } from "@/db/queries/notices";
import { userRoute } from "@/lib/auth/route";

export const dynamic = "force-dynamic";

/** How many notices the person has not read yet (the header badge). */
export const GET = userRoute(async ({ user }) => {
  return Response.json({ count: await countUnread({ userId: user.id }) }, { headers: { "cache-control": "no-store" } });
});
