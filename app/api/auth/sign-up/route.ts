import { signUp } from "@/lib/auth/accounts";
import { publicRoute, readJson } from "@/lib/auth/route";
import { signUpSchema } from "@/lib/validation/auth";

export const POST = publicRoute(async ({ request }) => {
  const input = await readJson(request, signUpSchema);
  const { cookie } = await signUp(input);
  const res = Response.json({ ok: true }, { status: 201 });
  res.headers.append("set-cookie", cookie);
  return res;
});
