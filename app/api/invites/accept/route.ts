import { acceptInvitation } from "@/lib/auth/invitations";
import { publicRoute, readJson } from "@/lib/auth/route";
import { acceptInviteSchema } from "@/lib/validation/auth";

export const POST = publicRoute(async ({ request, user }) => {
  const input = await readJson(request, acceptInviteSchema);
  const { siteId, cookie } = await acceptInvitation({ ...input, user });
  const res = Response.json({ ok: true, siteId });
  if (cookie) res.headers.append("set-cookie", cookie);
  return res;
});
