import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";
import { NOTICE_KINDS } from "./notice-kind";
import { deviceRef, fadeMs, level, modeName, nodeId, position, sceneNumber, timerName, wholeMinutes, zoneRef } from "./graph-fields";

/** What happens when a path's gates all pass. */
function action<T extends string, P extends z.ZodType>(type: T, params: P) {
  return z.object({ id: nodeId, kind: z.literal("action"), type: z.literal(type), params, position });
}

const levelTarget = z.union([z.object({ zone: zoneRef }).strict(), z.object({ device: deviceRef }).strict()], {
  error: "Choose a zone or a single luminaire.",
});

export const NOTICE_CHANNELS = ["push", "in-app", "email"] as const;
export type NoticeChannel = (typeof NOTICE_CHANNELS)[number];

const recipients = z.union(
  [
    z.object({ role: z.enum(ROLES, { error: "Choose integrator, manager or occupant." }) }).strict(),
    z.object({ people: z.array(z.string().min(1), { error: "Choose who gets the notice." }).min(1, "Choose who gets the notice.") }).strict(),
  ],
  { error: "Choose a role or the people who get the notice." },
);

export const actionNodeSchema = z.discriminatedUnion(
  "type",
  [
    action("recall-scene", z.object({ scene: sceneNumber })),
    action("set-level", z.object({ target: levelTarget, level, fadeMs })),
    // Off when any luminaire in the zone is lit, otherwise on at `level`.
    action("toggle-zone", z.object({ zone: zoneRef, level: level.default(100), fadeMs })),
    action("relay-on", z.object({ device: deviceRef })),
    action("relay-off", z.object({ device: deviceRef })),
    action("relay-on-for", z.object({ device: deviceRef, minutes: wholeMinutes(1440) })),
    action(
      "notice",
      z.object({
        to: recipients,
        channels: z
          .array(z.enum(NOTICE_CHANNELS, { error: "Channels are push, in-app and email." }), { error: "Pick at least one channel." })
          .min(1, "Pick at least one channel."),
        // {device}, {zone} and {time} are filled in when the notice is sent.
        text: z.string({ error: "Write the notice text." }).trim().min(1, "Write the notice text.").max(500, "Keep notices under 500 characters."),
        // What the notice is about, for people's preferences; left out, the trigger decides (motion → visitor …).
        kind: z.enum(NOTICE_KINDS, { error: `Kinds are ${NOTICE_KINDS.join(", ")}.` }).optional(),
      }),
    ),
    action(
      "start-timer",
      z.object({
        name: timerName,
        minutes: z.number({ error: "Enter the timer length in minutes." }).positive("A timer must run for some time.").max(1440, "Timers run at most 24 hours (1440 min)."),
      }),
    ),
    action("cancel-timer", z.object({ name: timerName })),
    // Everything not in the scene goes off unless othersOff is false.
    action("latch-emergency", z.object({ scene: sceneNumber, othersOff: z.boolean().default(true) })),
    action("clear-emergency", z.object({ fadeMs }).default({})),
    action("set-site-mode", z.object({ mode: modeName })),
    action("hold-zone", z.object({ zone: zoneRef, minutes: wholeMinutes(1440) })),
  ],
  { error: "This action type is not one the engine knows." },
);

export type ActionNode = z.output<typeof actionNodeSchema>;
export type ActionType = ActionNode["type"];
