import { signIn } from "@/lib/auth/accounts";
import { clientAddress } from "@/lib/auth/origin";
import { publicRoute, readJson } from "@/lib/auth/route";
import { signInSchema } from "@/lib/validation/auth";

export const POST = publicRoute(async ({ request }) => {
  const input = await readJson(request, signInSchema);
  const { cookie } = await signIn({ ...input, client: clientAddress(request) });
  const res = Response.json({ ok: true });
  res.headers.append("set-cookie", cookie);
  return res;
});
