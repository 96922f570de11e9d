import type { TraceEntry } from "@/lib/bus/types";
import type { Point } from "./series";

/** The event a step ran for, or the end of the window (timers fired up to it). */
export type StepInput = { key: string; at: number; device: string | null; kind: string; value: unknown };

/** One line of a replay's timeline: something a rule waited for, or something changed. */
export type TimelineEntry = StepInput & { fired: string[]; effects: string[]; trace: TraceEntry[] };

export type RunCounts = { steps: number; firings: number; actions: number; changes: number; notices: number; commands: number };

export type SeriesLine = { id: string; name: string; points: Point[] };

export type RunResult = {
  label: string;
  counts: RunCounts;
  timeline: TimelineEntry[];
  /** More entries matched than are kept; narrow the window or filter to see them. */
  isTimelineCut: boolean;
  series: { zones: SeriesLine[]; relays: SeriesLine[] };
};

/** A step whose outcome differs between the two rule sets, with both traces. */
export type Difference = StepInput & {
  /** The two runs' lighting, relays or mode already differed before this step: it follows from an earlier difference. */
  isKnockOn: boolean;
  onlyA: string[];
  onlyB: string[];
  traceA: TraceEntry[];
  traceB: TraceEntry[];
};

export type ReplayResult = {
  window: { from: number; to: number };
  /** Events read from the log (every one went through each run). */
  events: number;
  runs: RunResult[];
  /** Present for a Compare (two runs). */
  compare: { differences: Difference[]; isCut: boolean; root: number; knockOn: number } | null;
};
