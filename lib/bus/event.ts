import { z } from "zod";

/**
 * A device event as the gateway or the Test bench sends it. Kinds are the
 * catalogue's report names; a kind the device cannot report is accepted here and
 * explained in the trace, so a misconfigured gateway shows up in the Event log.
 */
export const deviceEventSchema = z.object({
  id: z.string().min(1, "Every event needs an id, so sending it twice is harmless.").max(200),
  siteId: z.string().min(1),
  at: z.number().int("Times are whole milliseconds since 1970 (UTC).").nonnegative(),
  device: z.string().min(1, "Name the device that reported."),
  kind: z.string().min(1, "Say what the device reported."),
  // Button number, lux, °C, %RH, "open"/"closed", true/false (motion, fire alarm) or nothing.
  value: z.union([z.number().finite(), z.boolean(), z.string().max(40), z.null()]),
});
