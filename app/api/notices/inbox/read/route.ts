import { markInboxRead } from "@/db/queries/notices";
import { readJson, userRoute } from "@/lib/auth/route";
import { markReadSchema } from "@/lib/validation/notices";

export const dynamic = "force-dynamic";

/** Marks notices read: `{ids: [...]}` or `{all: true, siteId?}`; only the person's own. */
export const POST = userRoute(async ({ request, user }) => {
  const body = await readJson(request, markReadSchema, 16 * 1024);
  const changed = "ids" in body ? await markInboxRead({ userId: user.id, ids: body.ids }) : await markInboxRead({ userId: user.id, siteId: body.siteId });
  return Response.json({ changed });
});
