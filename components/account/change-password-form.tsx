"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Field } from "@/components/forms/field";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { changePasswordSchema } from "@/lib/validation/auth";

type Input = z.input<typeof changePasswordSchema>;

export function ChangePasswordForm() {
  const [isDone, setDone] = useState(false);
  const form = useForm<Input>({ resolver: zodResolver(changePasswordSchema), defaultValues: { currentPassword: "", newPassword: "" } });
  const { errors, isSubmitting } = form.formState;
  const onSubmit = form.handleSubmit(async (values) => {
    setDone(false);
    const ok = await submitJson("/api/auth/password", values, form.setError);
    if (ok) {
      setDone(true);
      form.reset();
    }
  });
  return (
    <form onSubmit={onSubmit} noValidate className="mt-4 flex max-w-sm flex-col gap-4">
      <HydratedFieldset>
      <FormError message={errors.root?.server?.message} />
      {isDone ? (
        <p role="status" className="rounded-md border border-moss/50 bg-moss/10 px-3 py-2 text-sm font-semibold">
          Password changed.
        </p>
      ) : null}
      <Field label="Current password" type="password" autoComplete="current-password" registration={form.register("currentPassword")} error={errors.currentPassword} />
      <Field label="New password" type="password" autoComplete="new-password" hint="At least 10 characters." registration={form.register("newPassword")} error={errors.newPassword} />
      <SubmitButton isPending={isSubmitting} pendingText="Saving…">
        Change password
      </SubmitButton>
      </HydratedFieldset>
    </form>
  );
}
