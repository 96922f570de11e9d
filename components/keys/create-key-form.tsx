"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useQueryClient } from "@tanstack/react-query";
import { useForm } from "react-hook-form";
import { Field } from "@/components/forms/field";
import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { keyCreateSchema, type KeyCreatedResponse, type KeyCreateInput } from "@/lib/validation/keys";

export function CreateKeyForm({ siteId, onCreated }: { siteId: string; onCreated: (created: KeyCreatedResponse) => void }) {
  const queryClient = useQueryClient();
  const form = useForm<KeyCreateInput>({ resolver: zodResolver(keyCreateSchema), defaultValues: { name: "" } });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    const created = await submitJson<KeyCreateInput, KeyCreatedResponse>(`/api/sites/${encodeURIComponent(siteId)}/keys`, values, form.setError);
    if (!created) return;
    form.reset({ name: "" });
    onCreated(created);
    void queryClient.invalidateQueries({ queryKey: ["sites", siteId, "keys"] });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <HydratedFieldset>
        <FormError message={errors.root?.server?.message} />
        <Field label="Key name" autoComplete="off" hint="Name it after the gateway it goes in, e.g. “Ground-floor gateway”." registration={form.register("name")} error={errors.name} />
        <SubmitButton isPending={isSubmitting} pendingText="Creating…">
          Create key
        </SubmitButton>
      </HydratedFieldset>
    </form>
  );
}
