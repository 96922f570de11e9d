import "server-only";
import { clearFailures, consumePasswordReset, createPasswordReset, createUser, findUserByEmail, getUser, listRecentFailures, recordFailures, updatePasswordHash } from "@/db/queries/users";
import { AppError } from "@/lib/errors";
import { env } from "@/lib/env";
import { sendMail } from "@/lib/mail/send";
import { passwordResetMail } from "@/lib/mail/templates";
import { dummyPasswordHash, hashPassword, verifyPassword } from "./password";
import { endAllSessions, startSession } from "./session";
import { retryAfterText, throttleVerdict, WINDOW_MS } from "./throttle";
import { hashToken, newToken, RESET_TTL_MS } from "./tokens";

/** The one answer for an unknown e-mail and a wrong password, so neither can be told apart. */
export const BAD_CREDENTIALS = "That e-mail and password do not match an account.";

export async function signUp(input: { name: string; email: string; password: string }): Promise<{ userId: string; cookie: string }> {
  if (await findUserByEmail({ email: input.email })) {
    throw new AppError("conflict", "An account with this e-mail already exists. Sign in, or reset the password.", { fields: { email: ["An account with this e-mail already exists."] } });
  }
  const user = await createUser({ email: input.email, name: input.name, passwordHash: await hashPassword(input.password) });
  return { userId: user.id, cookie: await startSession(user.id) };
}

export async function signIn(input: { email: string; password: string; client: string; now?: Date }): Promise<{ userId: string; cookie: string }> {
  const now = input.now ?? new Date();
  const keys = [`account:${input.email}`, `client:${input.client}`];
  const failures = await listRecentFailures({ keys, since: new Date(now.getTime() - WINDOW_MS) });
  for (const key of keys) {
    const verdict = throttleVerdict(failures.get(key) ?? [], now.getTime());
    if (verdict.isBlocked) {
      throw new AppError("rate_limited", `Too many failed sign-ins. Wait ${retryAfterText(verdict.retryAfterMs)} and try again, or reset your password.`, {
        retryAfterSeconds: Math.ceil(verdict.retryAfterMs / 1000),
      });
    }
  }
  const user = await findUserByEmail({ email: input.email });
  // Verify against a dummy hash for unknown accounts so the answer takes as long.
  const isValid = await verifyPassword(user?.passwordHash ?? (await dummyPasswordHash()), input.password);
  if (!user || !isValid) {
    await recordFailures({ keys, at: now });
    throw new AppError("unauthenticated", BAD_CREDENTIALS);
  }
  await clearFailures({ key: keys[0] });
  return { userId: user.id, cookie: await startSession(user.id) };
}

export async function changePassword(input: { userId: string; currentPassword: string; newPassword: string }): Promise<void> {
  const user = await getUser({ userId: input.userId });
  if (!user) throw new AppError("unauthenticated", "Sign in to continue.");
  if (!(await verifyPassword(user.passwordHash, input.currentPassword))) {
    throw new AppError("bad_request", "The current password is not right.", { fields: { currentPassword: ["The current password is not right."] } });
  }
  await updatePasswordHash({ userId: user.id, passwordHash: await hashPassword(input.newPassword) });
}

/** Always succeeds from the caller's view; mails a 1-hour link only when the account exists. */
export async function requestPasswordReset(input: { email: string; now?: Date }): Promise<void> {
  const now = input.now ?? new Date();
  const user = await findUserByEmail({ email: input.email });
  if (!user) return;
  const token = newToken();
  const expiresAt = new Date(now.getTime() + RESET_TTL_MS);
  await createPasswordReset({ userId: user.id, tokenHash: hashToken(token), expiresAt });
  const link = `${env().APP_URL}/reset-password?token=${token}`;
  await sendMail({ to: user.email, ...passwordResetMail({ name: user.name, link, expiresAt }) });
}

/** Sets the new password, signs out every session of the account, and starts a new one here. */
export async function resetPassword(input: { token: string; password: string; now?: Date }): Promise<{ userId: string; cookie: string }> {
  const now = input.now ?? new Date();
  const userId = await consumePasswordReset({ tokenHash: hashToken(input.token), passwordHash: await hashPassword(input.password), now });
  if (!userId) throw new AppError("bad_request", "This reset link has expired or was already used. Ask for a new one.");
  await endAllSessions(userId);
  await clearFailures({ key: `account:${(await getUser({ userId }))?.email ?? ""}` });
  return { userId, cookie: await startSession(userId) };
}
