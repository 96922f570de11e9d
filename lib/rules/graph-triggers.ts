import { z } from "zod";
import { button, deviceRef, hysteresis, modeName, nodeId, position, reading, timeOfDay, timerName, wholeMinutes } from "./graph-fields";

/** Something a device (or the clock) reports: where every path starts. */
function trigger<T extends string, P extends z.ZodType>(type: T, params: P) {
  return z.object({ id: nodeId, kind: z.literal("trigger"), type: z.literal(type), params, position });
}

const onDevice = z.object({ device: deviceRef });
const onButton = z.object({ device: deviceRef, button });
const lux = z.object({ device: deviceRef, lux: reading("lx"), hysteresisLux: hysteresis("lx", 0) });
const celsius = z.object({ device: deviceRef, celsius: reading("°C"), hysteresis: hysteresis("°C", 0.5) });
const humidity = z.object({ device: deviceRef, percent: reading("%RH"), hysteresis: hysteresis("%RH", 2) });

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
