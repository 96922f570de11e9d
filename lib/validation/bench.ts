import { z } from "zod";
import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import type { Step } from "@/lib/bus/types";
import { SENSOR_RANGES } from "@/lib/catalogue/sensor-ranges";
import { isHhMm } from "@/lib/sun/schedule";
import type { FloorDto } from "./floors";

/**
 * What a person can do on the Test bench, as data: the API takes it, the bench
 * stores it with each step, and a scenario is a list of them played again later.
 */
const device = z.string({ error: "Choose a device." }).min(1, "Choose a device.").max(100, "Device ids are at most 100 characters.");
const button = z
  .number({ error: "Choose which button: 1 to 4." })
  .int("Choose which button: 1 to 4.")
  .min(1, "Choose which button: 1 to 4.")
  .max(4, "Choose which button: 1 to 4.");

export const hhMm = z.string({ error: "Give a time as HH:MM (24-hour)." }).refine(isHhMm, "Give a time as HH:MM (24-hour), e.g. 18:30.");
export const isoDate = z
  .string({ error: "Give a date as YYYY-MM-DD." })
  .regex(/^\d{4}-\d{2}-\d{2}$/, "Give a date as YYYY-MM-DD.")
  .refine((s) => {
    const [y, m, d] = s.split("-").map(Number);
    const t = new Date(Date.UTC(y, m - 1, d));
    return y >= 2000 && y <= 2100 && t.getUTCMonth() === m - 1 && t.getUTCDate() === d;
  }, "Pick a real date between 2000 and 2100.");

/** Readings the bench can send, with the range a sensor can report (lib/catalogue/sensor-ranges.ts). */
export const READING_MEASURES = {
  "light-level": { ...SENSOR_RANGES.lux, label: "Light level", step: 1 },
  temperature: { ...SENSOR_RANGES.celsius, label: "Temperature", step: 0.5 },
  humidity: { ...SENSOR_RANGES.percent, label: "Relative humidity", step: 1 },
} as const;
export type ReadingMeasure = keyof typeof READING_MEASURES;

/** Longest single skip: a week is enough to watch every schedule come round. */
export const MAX_SKIP_MINUTES = 7 * 24 * 60;

const reading = z
  .object({
    type: z.literal("reading"),
    device,
    measure: z.enum(Object.keys(READING_MEASURES) as [ReadingMeasure, ...ReadingMeasure[]], { error: "A reading is a light level, temperature or relative humidity." }),
    value: z.number({ error: "Enter a number." }).refine(Number.isFinite, "Enter a number."),
  })
  .superRefine((a, ctx) => {
    const r = READING_MEASURES[a.measure];
    if (a.value < r.min || a.value > r.max) ctx.addIssue({ code: "custom", path: ["value"], message: `${a.value} ${r.unit} is outside what the sensor reports (${r.min}–${r.max} ${r.unit}).` });
  });

export const benchActionSchema = z.discriminatedUnion(
  "type",
  [
    z.object({ type: z.literal("press"), device, button }),
    z.object({ type: z.literal("release"), device, button }),
    z.object({ type: z.literal("long-press"), device, button }),
    z.object({ type: z.literal("call"), device }),
    z.object({ type: z.literal("turn"), device }),
    z.object({ type: z.literal("walk-past"), device }),
    z.object({ type: z.literal("contact"), device, state: z.enum(["open", "closed"], { error: 'A contact is "open" or "closed".' }) }),
    reading,
    z.object({ type: z.literal("fire-alarm"), device, state: z.enum(["active", "cleared"], { error: 'A fire-alarm input is "active" or "cleared".' }) }),
    z.object({ type: z.literal("clear-emergency") }),
    z.object({
      type: z.literal("skip"),
      minutes: z
        .number({ error: `Skip a whole number of minutes, 1 to ${MAX_SKIP_MINUTES}.` })
        .int(`Skip a whole number of minutes, 1 to ${MAX_SKIP_MINUTES}.`)
        .min(1, `Skip a whole number of minutes, 1 to ${MAX_SKIP_MINUTES}.`)
        .max(MAX_SKIP_MINUTES, `Skip a whole number of minutes, 1 to ${MAX_SKIP_MINUTES}.`),
    }),
    z.object({ type: z.literal("skip-to"), time: hhMm }),
    z.object({ type: z.literal("set-date"), date: isoDate, time: hhMm }),
  ],
  { error: "Unknown bench action." },
);
export type BenchAction = z.infer<typeof benchActionSchema>;
export type DeviceAction = Extract<BenchAction, { device: string }>;

export const benchSourceSchema = z.enum(["active", "draft"], { error: 'Run the "active" rule set or the "draft".' });
export type BenchSource = z.infer<typeof benchSourceSchema>;

/** Off unless a person ticks it: bench notices are shown as "would send" and never leave the console. */
const deliverNotices = z.boolean({ error: "deliverNotices is true or false." }).default(false);

export const benchRunSchema = z.strictObject({ action: benchActionSchema, deliverNotices });
/** Skip ahead by minutes, or to the next time the site's clock shows HH:MM. */
export const benchClockSchema = z.union(
  [z.strictObject({ minutes: z.number(), deliverNotices }), z.strictObject({ time: z.string(), deliverNotices })],
  { error: "Skip ahead by minutes or to a time (HH:MM)." },
);
export const benchDateSchema = z.strictObject({ date: isoDate, time: hhMm });
export const benchResetSchema = z.strictObject({ source: benchSourceSchema.optional() });
export const benchPatchSchema = z.strictObject({ source: benchSourceSchema });
export const benchQuerySchema = z.object({ source: benchSourceSchema.optional() });

export const scenarioNameSchema = z.string({ error: "Name the scenario." }).trim().min(1, "Name the scenario.").max(80, "Keep the name under 80 characters.");
export const MAX_SCENARIO_STEPS = 200;
export const scenarioInputSchema = z.strictObject({
  name: scenarioNameSchema,
  steps: z.array(benchActionSchema).min(1, "A scenario needs at least one step.").max(MAX_SCENARIO_STEPS, `A scenario holds at most ${MAX_SCENARIO_STEPS} steps.`),
});
/** Saving what the bench did since the last reset, under a name. */
export const scenarioFromSessionSchema = z.strictObject({ name: scenarioNameSchema, fromSession: z.literal(true) });
export const scenarioCreateSchema = z.union([scenarioInputSchema, scenarioFromSessionSchema]);
export const scenarioPlaySchema = z.strictObject({ deliverNotices });

export const scenarioParamsSchema = z.object({ siteId: z.string().regex(/^[a-z0-9][a-z0-9-]*$/).max(64), scenarioId: z.string().regex(/^[a-z0-9][a-z0-9-]*$/, "is not a valid id").max(64) }).strict();

/* ---- Shapes over JSON (route → client) ---- */

export type BenchDevice = {
  id: string;
  name: string;
  kind: DeviceKind;
  zoneId: string | null;
  floorId: string | null;
  x: number | null;
  y: number | null;
  unicastAddress: number;
  /** Buttons a rocker has (from its profile); 1 for a call button. */
  buttons: number;
};

/** Reset is not an action a scenario repeats, but the feed shows what it did. */
export type BenchStepAction = BenchAction | { type: "reset"; from: "live" | "fresh" };
export type BenchStepInput = { actionId: string; action: BenchStepAction; part: { event: { id: string; at: number; kind: string; value: unknown; device: string } } | { advanceTo: number }; delivered: boolean };
export type BenchStepDto = { seq: number; at: number; input: BenchStepInput; output: Pick<Step, "changes" | "commands" | "notices" | "trace"> };

export type BenchStateDto = {
  now: number | null;
  mode: string;
  emergency: { active: boolean; since: number | null; scene: number | null; ruleId: string | null };
  levels: Record<string, number>;
  /** Which override level holds each luminaire now (Emergency > Manual > Sensor > Schedule), and until when. */
  holding: Record<string, { level: string; until: number | null }>;
  relays: Record<string, boolean>;
  sensors: { lux: Record<string, number>; temperature: Record<string, number>; humidity: Record<string, number>; contacts: Record<string, string>; fireAlarms: Record<string, boolean>; occupied: Record<string, boolean> };
  timers: { due: number; label: string }[];
};

export type BenchView = {
  site: { id: string; name: string; timeZone: string };
  session: { id: string; source: BenchSource; versionId: string | null; versionNumber: number | null; draftRevision: number | null; updatedAt: number };
  rules: { activeVersion: { id: string; number: number } | null; draftRevision: number };
  state: BenchStateDto;
  devices: BenchDevice[];
  zones: { id: string; name: string; groupAddress: number }[];
  floors: FloorDto[];
  steps: BenchStepDto[];
  canClearEmergency: boolean;
};

export type BenchScenarioDto = { id: string; name: string; steps: BenchAction[]; updatedAt: number };
export type ScenarioPlayResult = { played: number; stopped: { step: number; message: string } | null; view: BenchView };
