"use client";

import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import { zodResolver } from "@hookform/resolvers/zod";
import { Controller, useForm, useWatch } from "react-hook-form";
import { z } from "zod";
import { Field } from "@/components/forms/field";
import { FormError, SaveOrCancel } from "@/components/forms/submit-button";
import { submitJson } from "@/components/forms/submit-json";
import { describeTransitionTime, encodeTransitionTime } from "@/lib/mesh/transition-time";
import type { DeviceDto, ZoneDto } from "@/lib/validation/devices";
import type { SceneDto } from "@/lib/validation/scenes";
import { LevelsEditor } from "./levels-editor";
import { ScenePreview } from "./scene-preview";

const formSchema = z.object({
  number: z.number("Enter a scene number").int("A whole number").min(1, "Scene number 0 is prohibited by the Mesh Model (§5.1.3.1); use 1–65535").max(65535, "At most 65535"),
  name: z.string().trim().min(1, "Give the scene a name").max(100, "Use at most 100 characters"),
  fadeSeconds: z.number("Enter the fade in seconds").min(0, "Fade cannot be negative").max(37200, "At most 620 minutes"),
  isOccupantRecallable: z.boolean(),
  levels: z.array(z.object({ zoneId: z.string().optional(), deviceId: z.string().optional(), level: z.number() })),
});
type FormValues = z.infer<typeof formSchema>;

export function SceneForm({ siteId, scene, nextNumber, zones, devices, onDone }: { siteId: string; scene?: SceneDto; nextNumber: number; zones: ZoneDto[]; devices: DeviceDto[]; onDone: () => void }) {
  const form = useForm<FormValues>({
    resolver: zodResolver(formSchema),
    defaultValues: {
      number: scene?.number ?? nextNumber,
      name: scene?.name ?? "",
      fadeSeconds: (scene?.fadeMs ?? 2000) / 1000,
      isOccupantRecallable: scene?.isOccupantRecallable ?? false,
      levels: scene?.levels ?? [],
    },
  });
  const { errors, isSubmitting } = form.formState;
  const [fadeSeconds, levels] = useWatch({ control: form.control, name: ["fadeSeconds", "levels"] });
  const fadeMs = Number.isFinite(fadeSeconds) && fadeSeconds >= 0 ? Math.round(fadeSeconds * 1000) : 0;
  const octet = encodeTransitionTime(Math.min(fadeMs, 620 * 60_000));

  const onSubmit = form.handleSubmit(async (v) => {
    const body = { number: v.number, name: v.name, fadeMs: Math.round(v.fadeSeconds * 1000), isOccupantRecallable: v.isOccupantRecallable, levels: v.levels };
    const ok = await submitJson(scene ? `/api/sites/${siteId}/scenes/${scene.id}` : `/api/sites/${siteId}/scenes`, body, form.setError, scene ? "PUT" : "POST");
    if (ok) onDone();
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4" aria-label={scene ? `Edit scene ${scene.name}` : "New scene"}>
      <HydratedFieldset>
      <FormError message={errors.root?.server?.message} />
      <div className="grid gap-4 sm:grid-cols-3">
        <Field label="Scene number" type="number" min={1} max={65535} registration={form.register("number", { valueAsNumber: true })} error={errors.number} />
        <Field label="Name" registration={form.register("name")} error={errors.name} />
        <Field
          label="Fade (s)"
          type="number"
          step="0.1"
          min={0}
          hint={`Sent as transition time 0x${octet.toString(16).toUpperCase().padStart(2, "0")} (${describeTransitionTime(fadeMs)}; Mesh Model §3.1.3)`}
          registration={form.register("fadeSeconds", { valueAsNumber: true })}
          error={errors.fadeSeconds}
        />
      </div>
      <label className="flex items-center gap-2 text-sm font-semibold">
        <input type="checkbox" {...form.register("isOccupantRecallable")} />
        Occupants may recall this scene (in their zones)
      </label>
      <div className="grid gap-4 xl:grid-cols-2">
        <div>
          <h3 className="mb-2 font-bold">Levels</h3>
          <Controller control={form.control} name="levels" render={({ field }) => <LevelsEditor zones={zones} devices={devices} value={field.value} onChange={field.onChange} />} />
          {errors.levels ? (
            <p role="alert" className="text-sm font-semibold text-clay">
              {errors.levels.message ?? "Some levels are not valid"}
            </p>
          ) : null}
        </div>
        <div>
          <h3 className="mb-2 font-bold">Preview</h3>
          <ScenePreview levels={levels} zones={zones} devices={devices} />
        </div>
      </div>
      <SaveOrCancel isPending={isSubmitting} label={scene ? "Save scene" : "Create scene"} onCancel={onDone} />
      </HydratedFieldset>
    </form>
  );
}
