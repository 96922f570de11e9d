import { activateVersion } from "@/db/queries/rule-sets";
import { siteRoute } from "@/lib/auth/route";
import { versionParamsSchema, type ActivateDto } from "@/lib/validation/rules";

export const dynamic = "force-dynamic";

/** Rollback: an earlier version becomes active again (recorded as an activation); the draft is left alone. */
export const POST = siteRoute(
  "rules.activate",
  async ({ siteId, params, user }) => {
    const activated: ActivateDto = await activateVersion({ siteId, versionId: params.versionId, userId: user.id });
    return Response.json(activated);
  },
  { params: versionParamsSchema },
);
