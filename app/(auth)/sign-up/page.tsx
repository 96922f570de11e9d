import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { AuthCard } from "@/components/auth/auth-card";
import { SignUpForm } from "@/components/auth/sign-up-form";
import { getCurrentSession } from "@/lib/auth/current";

export const metadata: Metadata = { title: "Create an account" };

export default async function SignUpPage() {
  const { user } = await getCurrentSession();
  if (user) redirect("/sites");
  return (
    <AuthCard
      title="Create an account"
      footer={
        <>
          Already have one?{" "}
          <Link href="/sign-in" className="font-semibold underline">
            Sign in
          </Link>
        </>
      }
    >
      <p className="mb-4 text-sm text-slate">Integrators create an account and then their sites. Facilities managers and occupants are usually invited by e-mail.</p>
      <SignUpForm />
    </AuthCard>
  );
}
