import { listPendingInvites } from "@/db/queries/invites";
import { listMembers } from "@/db/queries/members";
import { listZoneChoices } from "@/db/queries/sites";
import { siteRoute } from "@/lib/auth/route";

export const dynamic = "force-dynamic";

/** Members, pending invitations and the zones an occupant can be given. Integrators only. */
export const GET = siteRoute("members.manage", async ({ siteId, user }) => {
  const [members, invites, zones] = await Promise.all([listMembers({ siteId }), listPendingInvites({ siteId, now: new Date() }), listZoneChoices({ siteId })]);
  return Response.json({ members, invites, zones, me: user.id });
});
