import type { Metadata } from "next";
import Link from "next/link";
import { AuthCard } from "@/components/auth/auth-card";
import { ResetPasswordForm } from "@/components/auth/reset-password-form";
import { tokenSchema } from "@/lib/validation/auth";

export const metadata: Metadata = { title: "Choose a new password" };

export default async function ResetPasswordPage({ searchParams }: { searchParams: Promise<{ token?: string }> }) {
  const { token } = await searchParams;
  const parsed = tokenSchema.safeParse(token);
  return (
    <AuthCard title="Choose a new password">
      {parsed.success ? (
        <ResetPasswordForm token={parsed.data} />
      ) : (
        <p role="alert" className="text-clay">
          This link is not complete. Open it again from the e-mail, or{" "}
          <Link href="/forgot-password" className="font-semibold underline">
            ask for a new one
          </Link>
          .
        </p>
      )}
    </AuthCard>
  );
}
