import { z } from "zod";
import { DEVICE_KINDS } from "@/lib/catalogue/device-kinds";
import { GROUP_MAX, GROUP_MIN, UNICAST_MAX, UNICAST_MIN, formatAddress } from "@/lib/mesh/address";
import { idSchema } from "./site";

/** Ids of records inside a site: seed ids (lower-case words) or UUIDs. */
export const recordIdSchema = z.string().min(1).max(64).regex(/^[A-Za-z0-9-]+$/, "is not a valid id");

const nameField = (what: string) => z.string().trim().min(1, `Give the ${what} a name`).max(100, "Use at most 100 characters");

/** Accepts 18, "18" or "0x0012"; the API and forms share it. */
export const addressInput = (min: number, max: number, what: string) =>
  z.preprocess(
    (v) => (typeof v === "string" && v.trim() !== "" ? (/^0x/i.test(v.trim()) ? Number.parseInt(v.trim().slice(2), 16) : Number(v.trim())) : v),
    z
      .number(`Enter the ${what} as hex (0x…) or a number`)
      .int(`The ${what} is a whole number`)
      .min(min, `A ${what} is between ${formatAddress(min)} and ${formatAddress(max)} (Mesh Profile §3.4.2)`)
      .max(max, `A ${what} is between ${formatAddress(min)} and ${formatAddress(max)} (Mesh Profile §3.4.2)`),
  );

export const zoneInputSchema = z
  .object({
    name: nameField("zone"),
    groupAddress: addressInput(GROUP_MIN, GROUP_MAX, "group address").optional(),
  })
  .strict();

/** The device fields without defaults: a PATCH must leave out what it does not change. */
const deviceFields = {
  name: nameField("device"),
  kind: z.enum(DEVICE_KINDS, "Choose a device kind from the catalogue"),
  zoneId: recordIdSchema.nullable(),
  /** Empty: the next free range is assigned. */
  unicastAddress: addressInput(UNICAST_MIN, UNICAST_MAX, "unicast address"),
  elementCount: z.number().int().min(1, "A device has at least one element").max(255, "At most 255 elements (one octet in provisioning)"),
  profile: z.record(z.string(), z.unknown()),
  floorId: recordIdSchema.nullable(),
  x: z.number().min(0).max(1000, "At most 1000 m").nullable(),
  y: z.number().min(0).max(1000, "At most 1000 m").nullable(),
};

export const deviceInputSchema = z
  .object({
    ...deviceFields,
    zoneId: deviceFields.zoneId.default(null),
    unicastAddress: deviceFields.unicastAddress.optional(),
    elementCount: deviceFields.elementCount.default(1),
    profile: deviceFields.profile.default({}),
    floorId: deviceFields.floorId.default(null),
    x: deviceFields.x.default(null),
    y: deviceFields.y.default(null),
  })
  .strict();

export const devicePatchSchema = z.object(deviceFields).partial().strict();

export const bulkZoneSchema = z
  .object({ deviceIds: z.array(recordIdSchema).min(1, "Select at least one device").max(2000), zoneId: recordIdSchema.nullable() })
  .strict();

export const csvImportSchema = z
  .object({ csv: z.string().max(1024 * 1024, "The file is larger than 1 MiB"), mode: z.enum(["preview", "commit"]) })
  .strict();

/** 620 min is the longest transition the Mesh Model's transition-time octet can carry (§3.1.3). */
export const MAX_FADE_MS = 620 * 60 * 1000;

export const sceneInputSchema = z
  .object({
    number: z
      .number("Enter a scene number")
      .int("A scene number is a whole number")
      .min(1, "Scene number 0 is prohibited by the Mesh Model (§5.1.3.1); use 1–65535")
      .max(65535, "A scene number is at most 65535"),
    name: nameField("scene"),
    fadeMs: z.number().int().min(0, "Fade time cannot be negative").max(MAX_FADE_MS, "Fade time is at most 620 minutes").default(0),
    isOccupantRecallable: z.boolean().default(false),
    levels: z
      .array(
        z
          .object({ zoneId: recordIdSchema.optional(), deviceId: recordIdSchema.optional(), level: z.number().min(0, "Level is 0–100 %").max(100, "Level is 0–100 %") })
          .strict()
          .refine((l) => Boolean(l.zoneId) !== Boolean(l.deviceId), "Each level is for a zone or a luminaire"),
      )
      .max(500)
      .default([]),
  })
  .strict();

export const floorInputSchema = z.object({ name: nameField("floor") }).strict();

export const scaleInputSchema = z
  .object({
    a: z.object({ x: z.number().min(0), y: z.number().min(0) }).strict(),
    b: z.object({ x: z.number().min(0), y: z.number().min(0) }).strict(),
    metres: z.number("Enter the distance in metres").positive("The distance must be more than 0 m").max(1000, "At most 1000 m"),
  })
  .strict()
  .refine((v) => Math.hypot(v.a.x - v.b.x, v.a.y - v.b.y) >= 10, { message: "Pick two points at least 10 pixels apart", path: ["b"] });

export type DeviceInput = z.input<typeof deviceInputSchema>;
export type SceneInput = z.input<typeof sceneInputSchema>;

const recordId = recordIdSchema;
export const deviceParamsSchema = z.object({ siteId: idSchema, deviceId: recordId }).strict();
export const zoneParamsSchema = z.object({ siteId: idSchema, zoneId: recordId }).strict();
export const sceneParamsSchema = z.object({ siteId: idSchema, sceneId: recordId }).strict();
export const floorParamsSchema = z.object({ siteId: idSchema, floorId: recordId }).strict();
