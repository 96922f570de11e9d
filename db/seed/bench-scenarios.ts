import type { BenchAction } from "../../lib/validation/bench";
import type { Database } from "../client";
import { benchScenarios } from "../schema";
import { DEMO_SITE_ID } from "./demo-site";

const dev = (key: string) => `${DEMO_SITE_ID}-dev-${key}`;

/**
 * The demo site's two Test bench scenarios. Each starts by setting the date, so
 * it plays the same way whatever the live state is: 15 January 2025 and
 * 12 March 2025 are Wednesdays, a trading day in the demo rules (open 09:00,
 * closed from 17:30).
 */
export const demoBenchScenarios: { id: string; siteId: string; name: string; steps: BenchAction[] }[] = [
  {
    id: `${DEMO_SITE_ID}-bench-evening-visitor`,
    siteId: DEMO_SITE_ID,
    name: "evening visitor",
    steps: [
      { type: "set-date", date: "2025-01-15", time: "18:30" },
      { type: "reading", device: dev("sensor-path"), measure: "light-level", value: 4 },
      { type: "walk-past", device: dev("sensor-path") },
      { type: "skip", minutes: 10 },
    ],
  },
  {
    id: `${DEMO_SITE_ID}-bench-fire-drill`,
    siteId: DEMO_SITE_ID,
    name: "fire drill",
    steps: [
      { type: "set-date", date: "2025-03-12", time: "11:00" },
      { type: "fire-alarm", device: dev("fire-input"), state: "active" },
      { type: "press", device: dev("rocker-shop-door"), button: 2 },
      { type: "fire-alarm", device: dev("fire-input"), state: "cleared" },
      { type: "long-press", device: dev("rocker-flat"), button: 4 },
    ],
  },
];

type Tx = Parameters<Parameters<Database["transaction"]>[0]>[0];

/** Idempotent: a scenario that exists (by id or by name) is left as a person may have edited it. */
export async function seedBenchScenarios(tx: Tx): Promise<void> {
  await tx.insert(benchScenarios).values(demoBenchScenarios).onConflictDoNothing();
}
