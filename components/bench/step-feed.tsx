"use client";

import type { TraceEntry } from "@/lib/bus/types";
import { describeAction } from "@/lib/bench/describe";
import type { BenchStepDto, BenchView } from "@/lib/validation/bench";
import { formatBenchTime } from "./format";

type Names = (id: string) => string;

const FACT_UNITS: Record<string, string> = { lux: " lx" };

function factText(id: string, value: unknown, nameOf: Names): string {
  const colon = id.indexOf(":");
  const name = colon < 0 ? id : id.slice(0, colon);
  const subject = colon < 0 ? "" : ` of ${nameOf(id.slice(colon + 1))}`;
  const shown = value === null || value === undefined ? "unknown" : typeof value === "object" ? JSON.stringify(value) : `${String(value)}${FACT_UNITS[name] ?? ""}`;
  return `${name}${subject} = ${shown}`;
}

function TraceItem({ entry, nameOf, timeZone }: { entry: TraceEntry; nameOf: Names; timeZone: string }) {
  const { trigger } = entry;
  return (
    <li className="space-y-1 border-l-2 border-line pl-3">
      <p className="text-sm">
        <span className="font-mono text-xs text-slate">{formatBenchTime(entry.at, timeZone, false)}</span>{" "}
        <span className="font-semibold">{trigger.type}</span>
        {trigger.device ? ` · ${nameOf(trigger.device)}` : ""}
        {trigger.value !== null && trigger.value !== undefined ? ` · ${String(trigger.value)}` : ""}
      </p>
      {entry.note ? <p className="text-xs text-slate">{entry.note}</p> : null}
      {entry.rules.length ? (
        <ul className="space-y-1" aria-label="Rules considered">
          {entry.rules.map((r) => (
            <li key={r.ruleId} className="text-xs">
              <span className={`mr-1 rounded px-1 font-bold ${r.passed ? "bg-moss/15 text-moss" : "bg-fog text-slate"}`}>{r.passed ? "✓ ran" : "✗ did not run"}</span>
              rule <span className="font-mono break-all">{r.ruleId}</span>
              {r.gates.length ? (
                <ul className="ml-4 mt-0.5 list-disc">
                  {r.gates.map((g) => (
                    <li key={g.nodeId}>
                      only if <span className="font-semibold">{g.type}</span> ({g.nodeId}): {g.passed ? "passed" : "failed"} — saw {Object.entries(g.facts).map(([id, v]) => factText(id, v, nameOf)).join(", ") || "nothing"}
                    </li>
                  ))}
                </ul>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
      {entry.actions.length ? (
        <ul className="space-y-0.5 text-xs" aria-label="What happened">
          {entry.actions.map((a, i) => (
            <li key={i}>→ <span className="font-semibold">{a.type}</span>: {a.outcome}</li>
          ))}
        </ul>
      ) : null}
    </li>
  );
}

type Group = { actionId: string; steps: BenchStepDto[] };

function groupSteps(steps: BenchStepDto[]): Group[] {
  const groups: Group[] = [];
  for (const s of steps) {
    const last = groups.at(-1);
    if (last && last.actionId === s.input.actionId) last.steps.push(s);
    else groups.push({ actionId: s.input.actionId, steps: [s] });
  }
  return groups.reverse();
}

/** The latest bench actions, newest first, with every trace entry: rules considered, gates with the values they saw, what was done. */
export function StepFeed({ view, nameOf }: { view: BenchView; nameOf: Names }) {
  const groups = groupSteps(view.steps);
  return (
    <section aria-labelledby="bench-feed-title" className="space-y-2 [overflow-wrap:anywhere]">
      <h2 id="bench-feed-title" className="font-bold">What happened, and why</h2>
      {groups.length === 0 ? <p className="text-sm text-slate">Nothing yet: operate a device or skip ahead.</p> : null}
      <ol className="space-y-2">
        {groups.map((g, i) => {
          const first = g.steps[0];
          const action = first.input.action;
          const label = action.type === "reset" ? (action.from === "live" ? "Reset to a copy of the live state" : "Reset to a fresh state (the site has no live state yet)") : describeAction(action, nameOf);
          const entries = g.steps.flatMap((s) => s.output.trace);
          const counts = g.steps.reduce((n, s) => n + s.output.commands.length, 0);
          return (
            <li key={g.actionId} className="rounded-lg border border-line bg-paper">
              <details open={i === 0}>
                <summary className="cursor-pointer px-3 py-2">
                  <span className="font-semibold">{label}</span>{" "}
                  <span className="text-xs text-slate">
                    at {formatBenchTime(first.at, view.site.timeZone)} · {entries.length} trace {entries.length === 1 ? "entry" : "entries"} · {counts} mesh message{counts === 1 ? "" : "s"} (not sent)
                  </span>
                </summary>
                <ol className="space-y-2 px-3 pb-3">
                  {entries.length ? entries.map((e, j) => <TraceItem key={j} entry={e} nameOf={nameOf} timeZone={view.site.timeZone} />) : <li className="text-xs text-slate">No timer was due and nothing changed.</li>}
                </ol>
              </details>
            </li>
          );
        })}
      </ol>
    </section>
  );
}

/** Notices the bench produced, newest first: shown as "would send", or as sent when a person asked for real delivery. */
export function BenchNotices({ view }: { view: BenchView }) {
  const notices = view.steps.flatMap((s) => s.output.notices.map((n) => ({ ...n, delivered: s.input.delivered, seq: s.seq }))).reverse();
  return (
    <section aria-labelledby="bench-notices-title" className="space-y-2 [overflow-wrap:anywhere]">
      <h2 id="bench-notices-title" className="font-bold">Notices</h2>
      {notices.length === 0 ? <p className="text-sm text-slate">No notices yet.</p> : null}
      <ul className="space-y-1.5">
        {notices.slice(0, 12).map((n) => (
          <li key={`${n.seq}-${n.dedupeKey}`} className="rounded-lg border border-line bg-paper px-3 py-2 text-sm">
            <span className={`mr-2 rounded px-1.5 py-0.5 text-xs font-bold ${n.delivered ? "bg-harvest/20" : "bg-fog"}`}>{n.delivered ? "sent as a test" : "would send"}</span>
            {n.text}
            <span className="block text-xs text-slate">
              to {n.recipient.replace(/^role:/, "every ").replace(/^person:/, "")} by {n.channels.join(", ")} · {formatBenchTime(n.at, view.site.timeZone)}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
