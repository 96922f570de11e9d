import { z } from "zod";
import { button, deviceRef, hysteresis, modeName, nodeId, position, reading, timeOfDay, timerName, wholeMinutes } from "./graph-fields";

/** Something a device (or the clock) reports: where every path starts. */
function trigger<T extends string, P extends z.ZodType>(type: T, params: P) {
  return z.object({ id: nodeId, kind: z.literal("trigger"), type: z.literal(type), params, position });
}

const onDevice = z.object({ device: deviceRef });
const onButton = z.object({ device: deviceRef, button });
/**
 * How often the rule asks the sensor to report, in seconds. The engine ignores
 * it (it reacts to whatever arrives); the Energy budget charges the device for it.
 */
const reportSeconds = z
  .number({ error: "Enter how often the sensor reports, in whole seconds (1 to 86400)." })
  .int("Enter how often the sensor reports, in whole seconds (1 to 86400).")
  .min(1, "Enter how often the sensor reports, in whole seconds (1 to 86400).")
  .max(86_400, "Enter how often the sensor reports, in whole seconds (1 to 86400).")
  .optional();
const lux = z.object({ device: deviceRef, lux: reading("lx"), hysteresisLux: hysteresis("lx", 0), reportSeconds });
const celsius = z.object({ device: deviceRef, celsius: reading("°C"), hysteresis: hysteresis("°C", 0.5), reportSeconds });
const humidity = z.object({ device: deviceRef, percent: reading("%RH"), hysteresis: hysteresis("%RH", 2), reportSeconds });

export const triggerNodeSchema = z.discriminatedUnion(
  "type",
  [
    trigger("rocker-press", onButton),
    trigger("rocker-release", onButton),
    trigger("rocker-long-press", onButton),
    trigger("call-button-press", onDevice),
    trigger("door-handle-turn", onDevice),
    trigger("motion-detected", onDevice),
    trigger("vacancy", z.object({ device: deviceRef, minutes: wholeMinutes(240) })),
    trigger("light-level-below", lux),
    trigger("light-level-above", lux),
    trigger("contact-opened", onDevice),
    trigger("contact-closed", onDevice),
    trigger("contact-left-open", z.object({ device: deviceRef, minutes: wholeMinutes(1440) })),
    trigger("temperature-above", celsius),
    trigger("temperature-below", celsius),
    trigger("humidity-above", humidity),
    trigger("humidity-below", humidity),
    trigger("fire-alarm-active", onDevice),
    trigger("fire-alarm-cleared", onDevice),
    trigger("time-of-day", z.object({ at: timeOfDay })),
    // No mode means "whenever the site mode changes".
    trigger("site-mode-changed", z.object({ mode: modeName.optional() })),
    trigger("timer-fired", z.object({ name: timerName })),
  ],
  { error: "This trigger type is not one the engine knows." },
);

export type TriggerNode = z.output<typeof triggerNodeSchema>;
export type TriggerType = TriggerNode["type"];
