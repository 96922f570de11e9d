import { publicRoute } from "@/lib/auth/route";
import { blankSessionCookie, endSession } from "@/lib/auth/session";

export const POST = publicRoute(async ({ session }) => {
  if (session) await endSession(session.id);
  const res = Response.json({ ok: true });
  res.headers.append("set-cookie", blankSessionCookie());
  return res;
});
