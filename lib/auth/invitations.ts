import "server-only";
import { acceptInvite, createInvite, findLiveInvite, getPendingInvite, renewInvite } from "@/db/queries/invites";
import { getSite } from "@/db/queries/sites";
import { createUser, findUserByEmail } from "@/db/queries/users";
import { AppError } from "@/lib/errors";
import { env } from "@/lib/env";
import { sendMail } from "@/lib/mail/send";
import { inviteMail } from "@/lib/mail/templates";
import { hashPassword } from "./password";
import { ROLE_LABEL, type Role } from "./roles";
import { startSession, type AuthUser } from "./session";
import { hashToken, INVITE_TTL_MS, newToken } from "./tokens";

async function mailInvite(input: { siteId: string; email: string; role: Role; inviterName: string; token: string; expiresAt: Date }) {
  const site = await getSite({ siteId: input.siteId });
  const link = `${env().APP_URL}/invite?token=${input.token}`;
  await sendMail({ to: input.email, ...inviteMail({ siteName: site?.name ?? "a site", inviterName: input.inviterName, role: ROLE_LABEL[input.role], link, expiresAt: input.expiresAt }) });
}

export async function inviteMember(input: { siteId: string; email: string; role: Role; zoneIds: string[] | null; inviter: AuthUser; now?: Date }) {
  const now = input.now ?? new Date();
  const token = newToken();
  const expiresAt = new Date(now.getTime() + INVITE_TTL_MS);
  const invite = await createInvite({ siteId: input.siteId, email: input.email, role: input.role, zoneIds: input.zoneIds, tokenHash: hashToken(token), invitedBy: input.inviter.id, expiresAt, now });
  await mailInvite({ siteId: input.siteId, email: input.email, role: input.role, inviterName: input.inviter.name, token, expiresAt });
  return invite;
}

export async function resendInvite(input: { siteId: string; inviteId: string; inviter: AuthUser; now?: Date }) {
  const now = input.now ?? new Date();
  const invite = await getPendingInvite({ siteId: input.siteId, inviteId: input.inviteId, now: new Date(0) });
  if (!invite) throw new AppError("not_found", "That invitation is no longer pending.");
  const token = newToken();
  const expiresAt = new Date(now.getTime() + INVITE_TTL_MS);
  if (!(await renewInvite({ siteId: input.siteId, inviteId: input.inviteId, tokenHash: hashToken(token), expiresAt, now }))) {
    throw new AppError("not_found", "That invitation is no longer pending.");
  }
  await mailInvite({ siteId: input.siteId, email: invite.email, role: invite.role, inviterName: input.inviter.name, token, expiresAt });
}

/**
 * Accepting an invitation: a signed-in person with the invited e-mail gets the
 * role; someone without an account creates one (name + password) and is signed
 * in; an existing account that is not signed in must sign in first.
 */
export async function acceptInvitation(input: { token: string; user: AuthUser | null; name?: string; password?: string; now?: Date }): Promise<{ siteId: string; cookie: string | null }> {
  const now = input.now ?? new Date();
  const tokenHash = hashToken(input.token);
  const invite = await findLiveInvite({ tokenHash, now });
  if (!invite) throw new AppError("bad_request", "This invitation has expired, was revoked or was already used. Ask for a new one.");

  if (input.user) {
    if (input.user.email !== invite.email) {
      throw new AppError("forbidden", `This invitation is for ${invite.email}. Sign out and accept it with that account.`);
    }
    const accepted = await acceptInvite({ tokenHash, userId: input.user.id, now });
    if (!accepted) throw new AppError("bad_request", "This invitation was already used.");
    return { siteId: accepted.siteId, cookie: null };
  }

  if (await findUserByEmail({ email: invite.email })) {
    throw new AppError("unauthenticated", `An account for ${invite.email} already exists. Sign in, then open the invitation link again.`);
  }
  if (!input.name || !input.password) {
    const fields: Record<string, string[]> = {};
    if (!input.name) fields.name = ["Enter your name"];
    if (!input.password) fields.password = ["Choose a password of at least 10 characters"];
    throw new AppError("bad_request", "Enter your name and choose a password to create your account.", { fields });
  }
  const user = await createUser({ email: invite.email, name: input.name, passwordHash: await hashPassword(input.password) });
  const accepted = await acceptInvite({ tokenHash, userId: user.id, now });
  if (!accepted) throw new AppError("bad_request", "This invitation was already used.");
  return { siteId: accepted.siteId, cookie: await startSession(user.id) };
}
