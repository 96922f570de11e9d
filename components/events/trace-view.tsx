"use client";

import type { TraceEntry } from "@/lib/bus/types";
import { formatSiteTime } from "@/lib/eventlog/local-input";

const hhmm = (minute: number) => `${String(Math.floor(minute / 60)).padStart(2, "0")}:${String(minute % 60).padStart(2, "0")}`;

function factText(value: unknown): string {
  if (value === null || value === undefined) return "unknown";
  if (typeof value === "object" && value && "minute" in value && typeof value.minute === "number") {
    // The clock fact: minutes since local midnight, with the day's sun times.
    const v = value as { minute: number; sunrise?: number | null; sunset?: number | null };
    const sun = typeof v.sunrise === "number" && typeof v.sunset === "number" ? ` (sunrise ${hhmm(v.sunrise)}, sunset ${hhmm(v.sunset)})` : "";
    return `${hhmm(v.minute)}${sun}`;
  }
  if (typeof value === "number") return String(Math.round(value * 100) / 100);
  return typeof value === "string" ? value : JSON.stringify(value);
}

/**
 * A Trace: for each trigger in a step, every candidate rule with each gate
 * (passed or failed, with the fact values it read) and the actions carried
 * out. Pass/fail is said in words and marks, not by colour alone.
 */
export function TraceView({ trace, timeZone, label }: { trace: TraceEntry[]; timeZone: string; label: string }) {
  if (!trace.length) return <p className="text-sm text-slate">Nothing to trace: no rule waits for this and nothing changed.</p>;
  return (
    <ol aria-label={label} className="space-y-3">
      {trace.map((entry, i) => (
        <li key={i} className="rounded-lg border border-line bg-fog/60 p-3 text-sm">
          <p className="font-semibold">
            {entry.trigger.type}
            {entry.trigger.value !== null && entry.trigger.value !== undefined ? <span className="font-normal"> = {factText(entry.trigger.value)}</span> : null}
            <span className="ml-2 text-xs font-normal text-slate">{formatSiteTime(entry.at, timeZone)} · {entry.origin.startsWith("timer:") ? "timer" : "event"}</span>
          </p>
          {entry.note ? <p className="text-xs text-slate">{entry.note}</p> : null}
          {entry.rules.length ? (
            <ul className="mt-2 space-y-2">
              {entry.rules.map((rule) => (
                <li key={rule.ruleId} className={`rounded-md border-l-4 bg-paper px-2 py-1 ${rule.passed ? "border-moss" : "border-line"}`}>
                  <p>
                    <span className={`mr-2 inline-block rounded px-1.5 text-xs font-bold ${rule.passed ? "bg-moss text-paper" : "bg-line text-ink"}`}>{rule.passed ? "✓ fired" : "✗ held back"}</span>
                    <span className="font-mono text-xs break-all">{rule.ruleId}</span>
                  </p>
                  {rule.gates.length ? (
                    <ul className="mt-1 ml-4 list-disc text-xs">
                      {rule.gates.map((g) => (
                        <li key={g.nodeId}>
                          Gate <span className="font-mono">{g.nodeId}</span> ({g.type}): <strong>{g.passed ? "passed" : "failed"}</strong>
                          {Object.keys(g.facts).length ? <span className="text-slate"> — {Object.entries(g.facts).map(([k, v]) => `${k} = ${factText(v)}`).join(", ")}</span> : null}
                        </li>
                      ))}
                    </ul>
                  ) : (
                    <p className="ml-4 text-xs text-slate">No gates: fires on every trigger.</p>
                  )}
                </li>
              ))}
            </ul>
          ) : null}
          {entry.actions.length ? (
            <ul aria-label="Actions taken" className="mt-2 space-y-0.5 text-xs">
              {entry.actions.map((a, j) => (
                <li key={j}>
                  → <span className="font-mono">{a.actionId ?? a.type}</span> ({a.type}): {a.outcome}
                </li>
              ))}
            </ul>
          ) : null}
        </li>
      ))}
    </ol>
  );
}
