import { z } from "zod";
import { idSchema } from "./site";

/** Which rules the budget reads: the live (active) version or the draft being edited on the Canvas. */
export const ENERGY_SOURCES = ["active", "draft"] as const;
export type EnergySource = (typeof ENERGY_SOURCES)[number];

export const energyQuerySchema = z
  .object({
    source: z.enum(ENERGY_SOURCES, { error: "must be active or draft" }).default("active"),
    week: z.enum(["shortest", "longest"], { error: "must be shortest or longest (days of the year)" }).default("shortest"),
  })
  .strict();
export type EnergyQuery = z.output<typeof energyQuerySchema>;

/** Reads ?source=…&week=… from a URL; unknown parameters are refused so a typo is not silently ignored. */
export function parseEnergyQuery(url: string | URL): EnergyQuery {
  return energyQuerySchema.parse(Object.fromEntries(new URL(url).searchParams));
}

/** For pages: a bad ?source or ?week falls back to the defaults, so a stale link still shows the budget. */
export function readEnergyQuery(search: Record<string, string | string[] | undefined>): EnergyQuery {
  const pick = (k: string) => (typeof search[k] === "string" ? search[k] : undefined);
  const parsed = energyQuerySchema.safeParse({ source: pick("source"), week: pick("week") });
  return parsed.success ? parsed.data : energyQuerySchema.parse({});
}

/** GET …/energy/short?source=: which rules the Short list reads; `newlyShort` always compares the draft with the active rules. */
export const energyShortQuerySchema = energyQuerySchema.pick({ source: true }).strict();

/** One device that runs short of energy, and the Canvas nodes (rules) that make it so. */
export type ShortDeviceDto = { deviceId: string; name: string; margin: number | null; ruleNodeIds: string[] };
/** GET /api/sites/{siteId}/energy/short */
export type ShortDevicesDto = { source: EnergySource; short: ShortDeviceDto[]; newlyShort: ShortDeviceDto[] };

export const deviceEnergyParamsSchema = z.object({ siteId: idSchema, deviceId: idSchema }).strict();

/** The what-if controls on the device view, with the bounds the profile schema uses. */
export const whatIfSchema = z.object({
  luxAtFull: z.number({ error: "Enter the illuminance in lx." }).min(0, "Illuminance cannot be negative.").max(100_000, "Keep it under 100 000 lx."),
  cellAreaCm2: z.number({ error: "Enter the cell area in cm²." }).gt(0, "The cell needs some area (more than 0 cm²).").max(500, "At most 500 cm²."),
  reportingIntervalS: z.number({ error: "Enter seconds between reports." }).int("Whole seconds.").min(1, "At least 1 s.").max(604_800, "At most a week (604 800 s)."),
  repeats: z.number({ error: "Enter the repeats (0–7)." }).int("Whole repeats.").min(0, "0 to 7 repeats.").max(7, "0 to 7 repeats."),
});
export type WhatIfFields = z.output<typeof whatIfSchema>;
