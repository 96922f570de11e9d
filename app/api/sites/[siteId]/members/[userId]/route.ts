import { removeMember, updateMember } from "@/db/queries/members";
import { readJson, siteRoute } from "@/lib/auth/route";
import { memberParamsSchema, memberUpdateSchema } from "@/lib/validation/auth";

export const PATCH = siteRoute(
  "members.manage",
  async ({ request, params }) => {
    const input = await readJson(request, memberUpdateSchema);
    await updateMember({ siteId: params.siteId, userId: params.userId, ...input });
    return Response.json({ ok: true });
  },
  { params: memberParamsSchema },
);

/** Never removes the last integrator (409). */
export const DELETE = siteRoute(
  "members.manage",
  async ({ params }) => {
    await removeMember({ siteId: params.siteId, userId: params.userId });
    return Response.json({ ok: true });
  },
  { params: memberParamsSchema },
);
