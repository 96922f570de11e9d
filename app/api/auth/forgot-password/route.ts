import { requestPasswordReset } from "@/lib/auth/accounts";
import { publicRoute, readJson } from "@/lib/auth/route";
import { forgotPasswordSchema } from "@/lib/validation/auth";

/** Answers the same whether or not the account exists. */
export const POST = publicRoute(async ({ request }) => {
  const { email } = await readJson(request, forgotPasswordSchema);
  await requestPasswordReset({ email });
  return Response.json({ ok: true, message: "If an account uses that e-mail, a reset link is on its way. It works for one hour." });
});
