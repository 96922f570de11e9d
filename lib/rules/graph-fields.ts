import { z } from "zod";
import { isValidSceneNumber } from "@/lib/mesh/commands";
import { WEEKDAYS } from "@/lib/sun/local-time";
import { isHhMm } from "@/lib/sun/schedule";

/**
 * Field schemas shared by the node types. Messages are written for the person
 * editing the Canvas, not for a programmer: they say what to pick or type.
 */
export const nodeId = z.string({ error: "Every node needs an id." }).min(1, "Every node needs an id.");

export const deviceRef = z.string({ error: "Choose a device." }).min(1, "Choose a device.");
export const zoneRef = z.string({ error: "Choose a zone." }).min(1, "Choose a zone.");

export const position = z.object({ x: z.number(), y: z.number() }).optional();

export const button = z
  .number({ error: "Choose which button: 1 to 4." })
  .int("Choose which button: 1 to 4.")
  .min(1, "Choose which button: 1 to 4.")
  .max(4, "Choose which button: 1 to 4.");

export const wholeMinutes = (max: number) =>
  z
    .number({ error: `Enter minutes as a whole number from 1 to ${max}.` })
    .int(`Enter minutes as a whole number from 1 to ${max}.`)
    .min(1, `Enter minutes as a whole number from 1 to ${max}.`)
    .max(max, `Enter minutes as a whole number from 1 to ${max}.`);

/** Thresholds are checked against each sensor's range in validate.ts, where the device kind is known. */
export const reading = (unit: string) => z.number({ error: `Enter a number in ${unit}.` }).refine(Number.isFinite, `Enter a number in ${unit}.`);

export const hysteresis = (unit: string, fallback: number) =>
  z.number({ error: `Enter the margin in ${unit} (0 or more).` }).min(0, `The margin cannot be negative; use 0 for none.`).default(fallback);

export const level = z
  .number({ error: "Enter a level from 0 to 100 %." })
  .min(0, "Enter a level from 0 to 100 %.")
  .max(100, "Enter a level from 0 to 100 %.");

/** Fades longer than the mesh can carry (620 min) would be cut short, so refuse them here. */
export const fadeMs = z
  .number({ error: "Enter the fade in milliseconds." })
  .int("Enter the fade in whole milliseconds.")
  .min(0, "A fade cannot be negative.")
  .max(37_200_000, "A fade can be at most 620 minutes.")
  .optional();

export const sceneNumber = z
  .number({ error: "Choose a scene." })
  .refine(isValidSceneNumber, "Scene numbers run from 1 to 65535 (0 is not allowed on the mesh).");

export const modeName = z
  .string({ error: "Enter a site mode, like closed." })
  .regex(/^[a-z][a-z0-9-]{0,39}$/, "Site modes use lower-case letters, digits and dashes, like closed or away.");

export const timerName = z
  .string({ error: "Give the timer a name." })
  .trim()
  .min(1, "Give the timer a name.")
  .max(60, "Keep timer names under 60 characters.");

export const timeOfDay = z.discriminatedUnion(
  "kind",
  [
    z.object({ kind: z.literal("fixed"), time: z.string().refine(isHhMm, "Use a 24-hour time like 07:30.") }),
    z.object({
      kind: z.enum(["sunrise", "sunset"]),
      offsetMinutes: z
        .number({ error: "Enter minutes before (negative) or after sunrise/sunset." })
        .int("Enter whole minutes.")
        .min(-720, "Keep the offset within 12 hours of sunrise/sunset.")
        .max(720, "Keep the offset within 12 hours of sunrise/sunset.")
        .default(0),
    }),
  ],
  { error: "Choose a fixed time, sunrise or sunset." },
);

export const weekdays = z
  .array(z.enum(WEEKDAYS, { error: "Days are mon, tue, wed, thu, fri, sat, sun." }), { error: "Pick at least one day." })
  .min(1, "Pick at least one day.");
