import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { AuthCard } from "@/components/auth/auth-card";
import { safeNext } from "@/components/auth/safe-next";
import { SignInForm } from "@/components/auth/sign-in-form";
import { getCurrentSession } from "@/lib/auth/current";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  const { next } = await searchParams;
  const { user } = await getCurrentSession();
  if (user) redirect(safeNext(next));
  return (
    <AuthCard
      title="Sign in"
      footer={
        <>
          New here?{" "}
          <Link href="/sign-up" className="font-semibold underline">
            Create an account
          </Link>
        </>
      }
    >
      <SignInForm next={next} />
    </AuthCard>
  );
}
