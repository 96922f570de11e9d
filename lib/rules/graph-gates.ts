import { z } from "zod";
import { deviceRef, modeName, nodeId, position, reading, timeOfDay, weekdays, zoneRef } from "./graph-fields";

/** An "only if" check between a trigger and its actions; gates may chain. */
function gate<T extends string, P extends z.ZodType>(type: T, params: P) {
  return z.object({ id: nodeId, kind: z.literal("gate"), type: z.literal(type), params, position });
}

export const gateNodeSchema = z.discriminatedUnion(
  "type",
  [
    // from > to crosses midnight (22:00 → 06:00); either end may follow the sun.
    gate("time-window", z.object({ from: timeOfDay, to: timeOfDay })),
    gate("days-of-week", z.object({ days: weekdays })),
    gate("light-level-below", z.object({ device: deviceRef, lux: reading("lx") })),
    gate("zone-occupied", z.object({ zone: zoneRef })),
    gate("zone-vacant", z.object({ zone: zoneRef })),
    gate("site-mode-is", z.object({ modes: z.array(modeName, { error: "Pick at least one site mode." }).min(1, "Pick at least one site mode.") })),
    gate("emergency-not-active", z.object({}).default({})),
  ],
  { error: "This gate type is not one the engine knows." },
);

export type GateNode = z.output<typeof gateNodeSchema>;
export type GateType = GateNode["type"];
