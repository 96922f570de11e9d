"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Field } from "@/components/forms/field";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { forgotPasswordSchema } from "@/lib/validation/auth";
import type { z } from "zod";

type Input = z.input<typeof forgotPasswordSchema>;

export function ForgotPasswordForm() {
  const [sent, setSent] = useState<string | null>(null);
  const form = useForm<Input>({ resolver: zodResolver(forgotPasswordSchema), defaultValues: { email: "" } });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    const res = await submitJson<Input, { message: string }>("/api/auth/forgot-password", values, form.setError);
    if (res) setSent(res.message);
  });

  if (sent) {
    return (
      <p role="status" className="rounded-md border border-moss/50 bg-moss/10 px-3 py-2 text-sm font-semibold">
        {sent}
      </p>
    );
  }
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <HydratedFieldset>
      <FormError message={errors.root?.server?.message} />
      <Field label="E-mail" type="email" autoComplete="email" registration={form.register("email")} error={errors.email} />
      <SubmitButton isPending={isSubmitting} pendingText="Sending…">
        Send reset link
      </SubmitButton>
      </HydratedFieldset>
    </form>
  );
}
