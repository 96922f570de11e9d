import { z } from "zod";

/** Ids in URLs: short, lower-case, no path tricks. */
export const idSchema = z
  .string()
  .min(1)
  .max(64)
  .regex(/^[a-z0-9][a-z0-9-]*$/, "is not a valid id");

export const siteParamsSchema = z.object({ siteId: idSchema }).strict();
