"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm, type Resolver } from "react-hook-form";
import { z } from "zod";
import { Field } from "@/components/forms/field";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { nameSchema, passwordSchema } from "@/lib/validation/auth";

const newAccountSchema = z.object({ name: nameSchema, password: passwordSchema });
const existingAccountSchema = z.object({ name: z.string().optional(), password: z.string().optional() });
type FormValues = z.infer<typeof existingAccountSchema>;

/** Accept as the signed-in person (`isNewAccount` false) or create the account on the way. */
export function AcceptInviteForm({ token, isNewAccount }: { token: string; isNewAccount: boolean }) {
  const router = useRouter();
  const form = useForm<FormValues>({
    resolver: (isNewAccount ? zodResolver(newAccountSchema) : zodResolver(existingAccountSchema)) as Resolver<FormValues>,
    defaultValues: isNewAccount ? { name: "", password: "" } : {},
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    const res = await submitJson<typeof values, { siteId: string }>("/api/invites/accept", { token, ...values }, form.setError);
    if (res) {
      router.replace(`/sites/${res.siteId}`);
      router.refresh();
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <HydratedFieldset>
      <FormError message={errors.root?.server?.message} />
      {isNewAccount ? (
        <>
          <Field label="Your name" autoComplete="name" registration={form.register("name")} error={errors.name} />
          <Field label="Choose a password" type="password" autoComplete="new-password" hint="At least 10 characters." registration={form.register("password")} error={errors.password} />
        </>
      ) : null}
      <SubmitButton isPending={isSubmitting} pendingText="Accepting…">
        {isNewAccount ? "Create account and accept" : "Accept invitation"}
      </SubmitButton>
      </HydratedFieldset>
    </form>
  );
}
