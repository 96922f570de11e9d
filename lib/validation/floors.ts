import { z } from "zod";

/** Shape of a floor over JSON. */
export type FloorDto = {
  id: string;
  name: string;
  sortOrder: number;
  pixelsPerMetre: number | null;
  plan: { id: string; width: number; height: number; mimeType: string } | null;
};

export const floorPatchSchema = z
  .object({
    name: z.string().trim().min(1, "Give the floor a name").max(100, "Use at most 100 characters").optional(),
    scale: z
      .object({
        a: z.object({ x: z.number().min(0), y: z.number().min(0) }).strict(),
        b: z.object({ x: z.number().min(0), y: z.number().min(0) }).strict(),
        distanceM: z.number("Enter the distance in metres").positive("The distance must be more than 0 m").max(1000, "At most 1000 m"),
      })
      .strict()
      .optional(),
  })
  .strict();
