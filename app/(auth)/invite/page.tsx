import type { Metadata } from "next";
import Link from "next/link";
import { AcceptInviteForm } from "@/components/auth/accept-invite-form";
import { AuthCard } from "@/components/auth/auth-card";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { findLiveInvite } from "@/db/queries/invites";
import { getCurrentSession } from "@/lib/auth/current";
import { ROLE_LABEL } from "@/lib/auth/roles";
import { hashToken } from "@/lib/auth/tokens";
import { tokenSchema } from "@/lib/validation/auth";

export const metadata: Metadata = { title: "Invitation" };
export const dynamic = "force-dynamic";

export default async function InvitePage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  const parsed = tokenSchema.safeParse(token);
  const invite = parsed.success ? await findLiveInvite({ tokenHash: hashToken(parsed.data), now: new Date() }) : undefined;
  if (!parsed.success || !invite) {
    return (
      <AuthCard title="Invitation">
        <p role="alert" className="text-clay">
          This invitation has expired, was revoked or was already used. Ask the person who invited you to send a new one.
        </p>
      </AuthCard>
    );
  }
  const { user } = await getCurrentSession();
  const returnTo = `/invite?token=${parsed.data}`;
  return (
    <AuthCard title={`Join ${invite.siteName}`}>
      <p className="mb-4">
        You are invited as <strong>{ROLE_LABEL[invite.role]}</strong> with the e-mail <strong>{invite.email}</strong>.
      </p>
      {user && user.email !== invite.email ? (
        <div className="flex flex-col gap-3">
          <p role="alert" className="text-clay">
            You are signed in as {user.email}. Sign out, then open this link again to accept with {invite.email}.
          </p>
          <SignOutButton />
        </div>
      ) : !user && invite.hasAccount ? (
        <p>
          An account for this e-mail already exists.{" "}
          <Link href={`/sign-in?next=${encodeURIComponent(returnTo)}`} className="font-semibold underline">
            Sign in to accept
          </Link>
          .
        </p>
      ) : (
        <AcceptInviteForm token={parsed.data} isNewAccount={!user} />
      )}
    </AuthCard>
  );
}
