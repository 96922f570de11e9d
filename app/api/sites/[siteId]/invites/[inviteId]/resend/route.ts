import { resendInvite } from "@/lib/auth/invitations";
import { siteRoute } from "@/lib/auth/route";
import { inviteParamsSchema } from "@/lib/validation/auth";

/** A fresh link and a fresh 7-day expiry; the old link stops working. */
export const POST = siteRoute(
  "members.manage",
  async ({ params, user }) => {
    await resendInvite({ siteId: params.siteId, inviteId: params.inviteId, inviter: user });
    return Response.json({ ok: true });
  },
  { params: inviteParamsSchema },
);
