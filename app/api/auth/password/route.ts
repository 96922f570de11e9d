import { changePassword } from "@/lib/auth/accounts";
import { userRoute, readJson } from "@/lib/auth/route";
import { changePasswordSchema } from "@/lib/validation/auth";

export const POST = userRoute(async ({ request, user }) => {
  const input = await readJson(request, changePasswordSchema);
  await changePassword({ userId: user.id, ...input });
  return Response.json({ ok: true });
});
