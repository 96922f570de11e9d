"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Field } from "@/components/forms/field";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { passwordSchema } from "@/lib/validation/auth";

const schema = z
  .object({ password: passwordSchema, confirm: z.string() })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords are not the same" });
type Input = z.input<typeof schema>;

export function ResetPasswordForm({ token }: { token: string }) {
  const router = useRouter();
  const form = useForm<Input>({ resolver: zodResolver(schema), defaultValues: { password: "", confirm: "" } });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async ({ password }) => {
    const ok = await submitJson("/api/auth/reset-password", { token, password }, form.setError);
    if (ok) {
      router.replace("/sites?reset=1");
      router.refresh();
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <HydratedFieldset>
      <FormError message={errors.root?.server?.message} />
      <Field label="New password" type="password" autoComplete="new-password" hint="At least 10 characters. Every other session of this account is signed out." registration={form.register("password")} error={errors.password} />
      <Field label="New password again" type="password" autoComplete="new-password" registration={form.register("confirm")} error={errors.confirm} />
      <SubmitButton isPending={isSubmitting} pendingText="Saving…">
        Set new password
      </SubmitButton>
      </HydratedFieldset>
    </form>
  );
}
