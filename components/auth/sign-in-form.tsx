"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { Field } from "@/components/forms/field";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { signInSchema, type SignInInput } from "@/lib/validation/auth";
import { safeNext } from "./safe-next";

export function SignInForm({ next }: { next?: string }) {
  const router = useRouter();
  const form = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: "", password: "" } });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    const ok = await submitJson("/api/auth/sign-in", values, form.setError);
    if (ok) {
      router.replace(safeNext(next));
      router.refresh();
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <HydratedFieldset>
      <FormError message={errors.root?.server?.message} />
      <Field label="E-mail" type="email" autoComplete="email" registration={form.register("email")} error={errors.email} />
      <Field label="Password" type="password" autoComplete="current-password" registration={form.register("password")} error={errors.password} />
      <SubmitButton isPending={isSubmitting} pendingText="Signing in…">
        Sign in
      </SubmitButton>
      <Link href="/forgot-password" className="text-sm font-semibold underline">
        Forgot your password?
      </Link>
      </HydratedFieldset>
    </form>
  );
}
