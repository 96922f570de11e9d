import type { Metadata } from "next";
import Link from "next/link";
import { AuthCard } from "@/components/auth/auth-card";
import { ForgotPasswordForm } from "@/components/auth/forgot-password-form";

export const metadata: Metadata = { title: "Reset your password" };

export default function ForgotPasswordPage() {
  return (
    <AuthCard
      title="Reset your password"
      footer={
        <Link href="/sign-in" className="font-semibold underline">
          Back to sign in
        </Link>
      }
    >
      <p className="mb-4 text-sm text-slate">We will e-mail a link that lets you choose a new password. It works once, for one hour.</p>
      <ForgotPasswordForm />
    </AuthCard>
  );
}
