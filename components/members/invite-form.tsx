"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import { useQueryClient } from "@tanstack/react-query";
import { useId, useState } from "react";
import { Controller, useForm, useWatch } from "react-hook-form";
import { Field } from "@/components/forms/field";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { inviteSchema, type InviteInput } from "@/lib/validation/auth";
import { RoleSelect } from "./role-select";
import { ZonePicker } from "./zone-picker";

export function InviteForm({ siteId, zones }: { siteId: string; zones: { id: string; name: string }[] }) {
  const queryClient = useQueryClient();
  const roleId = useId();
  const [sentTo, setSentTo] = useState<string | null>(null);
  const form = useForm<InviteInput>({ resolver: zodResolver(inviteSchema), defaultValues: { email: "", role: "occupant", zoneIds: null } });
  const { errors, isSubmitting } = form.formState;
  const role = useWatch({ control: form.control, name: "role" });

  const onSubmit = form.handleSubmit(async (values) => {
    setSentTo(null);
    const res = await submitJson(`/api/sites/${siteId}/invites`, { ...values, zoneIds: values.role === "occupant" ? values.zoneIds : null }, form.setError);
    if (res) {
      setSentTo(values.email);
      form.reset({ email: "", role: values.role, zoneIds: null });
      void queryClient.invalidateQueries({ queryKey: ["sites", siteId, "members"] });
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <HydratedFieldset>
      <FormError message={errors.root?.server?.message} />
      {sentTo ? (
        <p role="status" className="rounded-md border border-moss/50 bg-moss/10 px-3 py-2 text-sm font-semibold">
          Invitation sent to {sentTo}.
        </p>
      ) : null}
      <Field label="E-mail" type="email" autoComplete="off" registration={form.register("email")} error={errors.email} />
      <div className="flex flex-col gap-1">
        <label htmlFor={roleId} className="text-sm font-semibold">
          Role
        </label>
        <Controller control={form.control} name="role" render={({ field }) => <RoleSelect id={roleId} value={field.value} onChange={field.onChange} />} />
      </div>
      {role === "occupant" ? (
        <Controller control={form.control} name="zoneIds" render={({ field }) => <ZonePicker legend="Zones they can see" zones={zones} value={field.value ?? null} onChange={field.onChange} />} />
      ) : null}
      <SubmitButton isPending={isSubmitting} pendingText="Sending…">
        Send invitation
      </SubmitButton>
      </HydratedFieldset>
    </form>
  );
}
