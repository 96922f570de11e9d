import { resetPassword } from "@/lib/auth/accounts";
import { publicRoute, readJson } from "@/lib/auth/route";
import { resetPasswordSchema } from "@/lib/validation/auth";

export const POST = publicRoute(async ({ request }) => {
  const input = await readJson(request, resetPasswordSchema);
  const { cookie } = await resetPassword(input);
  const res = Response.json({ ok: true });
  res.headers.append("set-cookie", cookie);
  return res;
});
