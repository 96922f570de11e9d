import { inviteMember } from "@/lib/auth/invitations";
import { readJson, siteRoute } from "@/lib/auth/route";
import { inviteSchema } from "@/lib/validation/auth";

/** Invite someone by e-mail to a role on this site (integrators only). */
export const POST = siteRoute("members.manage", async ({ request, siteId, user }) => {
  const input = await readJson(request, inviteSchema);
  const invite = await inviteMember({ siteId, ...input, inviter: user });
  return Response.json({ invite: { id: invite.id, email: invite.email, role: invite.role, expiresAt: invite.expiresAt } }, { status: 201 });
});
