import { z } from "zod";
import { idSchema } from "./site";

/** Largest import file accepted: a year of a busy site as NDJSON is ~150 MB. */
export const MAX_IMPORT_BYTES = 256 * 1024 * 1024;
/** Events a page of the Event log holds; the table fetches more as it scrolls. */
export const EVENT_PAGE_MAX = 500;

const ms = z.coerce.number({ error: "Give the time as milliseconds since 1970 (UTC)." }).int("Times are whole milliseconds.").nonnegative();
const optionalText = z.string().trim().max(100).optional().transform((v) => (v ? v : undefined));

/** What narrows the Event log (list, export, tail): a window [from, to) and device, zone or kind. */
export const eventFilterSchema = z
  .object({
    from: ms.optional(),
    to: ms.optional(),
    device: optionalText,
    zone: optionalText,
    kind: optionalText,
  })
  .refine((f) => f.from === undefined || f.to === undefined || f.from < f.to, { message: "The end of the time range must be after its start.", path: ["to"] });
export type EventFilter = Partial<z.infer<typeof eventFilterSchema>>;

/** A keyset cursor "at:seq": events strictly older (list) or, for the tail, a sequence number. */
const cursor = z
  .string()
  .regex(/^\d+:\d+$/, "A cursor is at:seq.")
  .transform((c) => {
    const [at, seq] = c.split(":").map(Number);
    return { at, seq };
  });

export const eventListQuerySchema = z.object({
  before: cursor.optional(),
  afterSeq: z.coerce.number().int().nonnegative().optional(),
  limit: z.coerce.number().int().min(1).max(EVENT_PAGE_MAX).default(200),
});

export const eventSeqParamsSchema = z.object({ siteId: idSchema, seq: z.coerce.number().int().positive("is not an event number") }).strict();

export const exportQuerySchema = z.object({ format: z.enum(["ndjson", "csv"], { error: 'The format is "ndjson" or "csv".' }).default("ndjson") });

export const importQuerySchema = z.object({
  format: z.enum(["ndjson", "csv"], { error: 'The format is "ndjson" or "csv".' }),
  /** check: read and report, write nothing. commit: write (all or nothing, unless acceptValid). */
  mode: z.enum(["check", "commit"]).default("check"),
  acceptValid: z
    .enum(["0", "1", "true", "false"])
    .default("0")
    .transform((v) => v === "1" || v === "true"),
});

/** Which rules a replay runs: the live one, the Canvas draft, or a numbered version. */
export const ruleSetChoiceSchema = z.discriminatedUnion(
  "kind",
  [z.object({ kind: z.literal("active") }).strict(), z.object({ kind: z.literal("draft") }).strict(), z.object({ kind: z.literal("version"), versionId: z.string().min(1).max(100) }).strict()],
  { error: "Choose the active rules, the draft, or a version." },
);
export type RuleSetChoice = z.infer<typeof ruleSetChoiceSchema>;

/** A year is the most one replay covers: longer windows are split by the person. */
export const MAX_REPLAY_WINDOW_MS = 366 * 86_400_000;

export const replayRequestSchema = z
  .object({
    from: z.number({ error: "Choose when the window starts." }).int().nonnegative(),
    to: z.number({ error: "Choose when the window ends." }).int().nonnegative(),
    ruleSets: z.array(ruleSetChoiceSchema).min(1, "Choose a rule set.").max(2, "Compare takes two rule sets."),
    device: z.string().max(100).optional(),
    zone: z.string().max(100).optional(),
  })
  .strict()
  .refine((r) => r.from < r.to, { message: "The window must end after it starts.", path: ["to"] })
  .refine((r) => r.to - r.from <= MAX_REPLAY_WINDOW_MS, { message: "A replay covers at most a year; choose a shorter window.", path: ["to"] });
export type ReplayRequest = z.infer<typeof replayRequestSchema>;

export const replayParamsSchema = z.object({ siteId: idSchema, jobId: z.string().uuid("is not a replay id") }).strict();

/** A row of the Event log with a short account of what the live engine did with it. */
export type EventRow = {
  seq: number;
  eventId: string;
  at: number;
  device: string;
  kind: string;
  value: number | boolean | string | null;
  source: "gateway" | "bench" | "import" | "console";
  /** Null when the live engine never ran it (an imported event: history for Replay). */
  outcome: { fired: number; actions: number; changes: number } | null;
};
