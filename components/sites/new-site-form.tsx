"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { Field } from "@/components/forms/field";
import { FormError, SubmitButton } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { createSiteSchema, type CreateSiteInput } from "@/lib/validation/auth";

type SiteValues = { id: string; name: string; address: string; timeZone: string; latitude: number; longitude: number };

/** Creates a site, or (with `site`) edits one. */
export function NewSiteForm({ site }: { site?: SiteValues }) {
  const router = useRouter();
  const form = useForm<CreateSiteInput>({
    resolver: zodResolver(createSiteSchema),
    defaultValues: site ? { name: site.name, address: site.address, timeZone: site.timeZone, latitude: site.latitude, longitude: site.longitude } : { name: "", address: "", timeZone: "UTC", latitude: 0, longitude: 0 },
  });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    const res = await submitJson<CreateSiteInput, { site: { id: string } }>(site ? `/api/sites/${site.id}` : "/api/sites", values, form.setError, site ? "PATCH" : "POST");
    if (res) {
      router.push(`/sites/${res.site.id}`);
      router.refresh();
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      <HydratedFieldset>
      <FormError message={errors.root?.server?.message} />
      <Field label="Site name" registration={form.register("name")} error={errors.name} />
      <Field label="Address" hint="Free text, for people; not used for sun times." registration={form.register("address")} error={errors.address} />
      <Field label="Time zone" hint="IANA name, e.g. UTC, WET, CET, EET." registration={form.register("timeZone")} error={errors.timeZone} />
      <div className="grid grid-cols-2 gap-4">
        <Field label="Latitude (°)" type="number" step="any" inputMode="decimal" registration={form.register("latitude", { valueAsNumber: true })} error={errors.latitude} />
        <Field label="Longitude (°)" type="number" step="any" inputMode="decimal" registration={form.register("longitude", { valueAsNumber: true })} error={errors.longitude} />
      </div>
      <SubmitButton isPending={isSubmitting} pendingText="Saving…">
        {site ? "Save site" : "Create site"}
      </SubmitButton>
      </HydratedFieldset>
    </form>
  );
}
