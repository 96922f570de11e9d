import { userRoute } from "@/lib/auth/route";
import { blankSessionCookie, endAllSessions } from "@/lib/auth/session";

export const POST = userRoute(async ({ user }) => {
  await endAllSessions(user.id);
  const res = Response.json({ ok: true });
  res.headers.append("set-cookie", blankSessionCookie());
  return res;
});
