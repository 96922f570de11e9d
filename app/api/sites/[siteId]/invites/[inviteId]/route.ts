import { revokeInvite } from "@/db/queries/invites";
import { siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { inviteParamsSchema } from "@/lib/validation/auth";

export const DELETE = siteRoute(
  "members.manage",
  async ({ params }) => {
    const ok = await revokeInvite({ siteId: params.siteId, inviteId: params.inviteId, now: new Date() });
    if (!ok) throw new AppError("not_found", "That invitation is no longer pending.");
    return Response.json({ ok: true });
  },
  { params: inviteParamsSchema },
);
