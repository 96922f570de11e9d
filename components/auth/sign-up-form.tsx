"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { Field } from "@/components/forms/field";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { signUpSchema, type SignUpInput } from "@/lib/validation/auth";

export function SignUpForm() {
  const router = useRouter();
  const form = useForm<SignUpInput>({ resolver: zodResolver(signUpSchema), defaultValues: { name: "", email: "", password: "" } });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    const ok = await submitJson("/api/auth/sign-up", values, form.setError);
    if (ok) {
      router.replace("/sites");
      router.refresh();
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <HydratedFieldset>
      <FormError message={errors.root?.server?.message} />
      <Field label="Your name" autoComplete="name" registration={form.register("name")} error={errors.name} />
      <Field label="E-mail" type="email" autoComplete="email" registration={form.register("email")} error={errors.email} />
      <Field label="Password" type="password" autoComplete="new-password" hint="At least 10 characters. A few unrelated words make a strong one." registration={form.register("password")} error={errors.password} />
      <SubmitButton isPending={isSubmitting} pendingText="Creating your account…">
        Create account
      </SubmitButton>
      </HydratedFieldset>
    </form>
  );
}
