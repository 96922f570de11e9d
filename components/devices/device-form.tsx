"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import { useForm, useWatch } from "react-hook-form";
import { z } from "zod";
import { Field } from "@/components/forms/field";
import { SelectField } from "@/components/forms/select-field";
import { FormError, SaveOrCancel } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { DEVICE_KIND_INFO, DEVICE_KINDS } from "@/lib/catalogue/device-kinds";
import { formatAddress } from "@/lib/mesh/address";
import type { DeviceDto, ZoneDto } from "@/lib/validation/devices";

const formSchema = z.object({
  name: z.string().trim().min(1, "Give the device a name").max(100, "Use at most 100 characters"),
  kind: z.enum(DEVICE_KINDS),
  zoneId: z.string(),
  unicastAddress: z
    .string()
    .trim()
    .refine((v) => v === "" || /^(0x[0-9a-f]{1,4}|\d{1,5})$/i.test(v), "Enter hex like 0x0012, or leave empty to assign the next free address"),
  elementCount: z.number("Enter a whole number").int().min(1, "At least one element").max(255, "At most 255 elements"),
  buttons: z.enum(["2", "4"]),
});
type FormValues = z.infer<typeof formSchema>;

/** Add (no `device`) or edit a device; the server checks addresses against the rest of the site. */
export function DeviceForm({ siteId, zones, device, onDone }: { siteId: string; zones: ZoneDto[]; device?: DeviceDto; onDone: () => void }) {
  const form = useForm<FormValues>({
    resolver: zodResolver(formSchema),
    defaultValues: {
      name: device?.name ?? "",
      kind: device?.kind ?? "mesh-luminaire",
      zoneId: device?.zoneId ?? "",
      unicastAddress: device ? formatAddress(device.unicastAddress) : "",
      elementCount: device?.elementCount ?? 1,
      buttons: String(device?.profile.buttons ?? 4) === "2" ? "2" : "4",
    },
  });
  const { errors, isSubmitting } = form.formState;
  const kind = useWatch({ control: form.control, name: "kind" });

  const onSubmit = form.handleSubmit(async (v) => {
    const body = {
      name: v.name,
      kind: v.kind,
      zoneId: v.zoneId || null,
      ...(v.unicastAddress ? { unicastAddress: v.unicastAddress } : {}),
      elementCount: v.elementCount,
      // A profile belongs to its kind: changing the kind starts again from that kind's typical values.
      profile: { ...(device && device.kind === v.kind ? device.profile : {}), ...(v.kind === "kinetic-rocker" ? { buttons: Number(v.buttons) } : {}) },
    };
    const ok = await submitJson(device ? `/api/sites/${siteId}/devices/${device.id}` : `/api/sites/${siteId}/devices`, body, form.setError, device ? "PATCH" : "POST");
    if (ok) onDone();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4 sm:grid-cols-2" aria-label={device ? `Edit ${device.name}` : "Add a device"}>
      <HydratedFieldset>
      <div className="sm:col-span-2">
        <FormError message={errors.root?.server?.message} />
      </div>
      <Field label="Name" registration={form.register("name")} error={errors.name} />
      <SelectField label="Kind" registration={form.register("kind")} error={errors.kind} options={DEVICE_KINDS.map((k) => ({ value: k, label: DEVICE_KIND_INFO[k].label }))} />
      <SelectField label="Zone" registration={form.register("zoneId")} error={errors.zoneId} options={[{ value: "", label: "No zone" }, ...zones.map((z) => ({ value: z.id, label: z.name }))]} />
      <Field label="Unicast address" placeholder="automatic" hint="0x0001–0x7FFF. Empty: the next free range." registration={form.register("unicastAddress")} error={errors.unicastAddress} />
      <Field label="Elements" type="number" min={1} max={255} registration={form.register("elementCount", { valueAsNumber: true })} error={errors.elementCount} />
      {kind === "kinetic-rocker" ? <SelectField label="Buttons" registration={form.register("buttons")} error={errors.buttons} options={[{ value: "2", label: "2 buttons" }, { value: "4", label: "4 buttons" }]} /> : null}
      <SaveOrCancel isPending={isSubmitting} label={device ? "Save device" : "Add device"} onCancel={onDone} className="flex gap-2 sm:col-span-2" />
      </HydratedFieldset>
    </form>
  );
}
