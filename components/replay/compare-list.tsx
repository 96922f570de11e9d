"use client";

import { formatSiteTime } from "@/lib/eventlog/local-input";
import type { Difference, ReplayResult } from "@/lib/replay/types";
import { deviceLabel, type SiteContext } from "@/components/events/types";

export type PickedTrace = { title: string; trace: Difference["traceA"] };

/**
 * Where the two rule sets' outcomes differ. A step whose lighting already
 * differed before it (it follows from an earlier difference) is listed under
 * the difference it follows from, so what decides differently stands out.
 */
export function CompareList({ ctx, result, onPick }: { ctx: SiteContext; result: ReplayResult; onPick: (t: PickedTrace) => void }) {
  const compare = result.compare!;
  const [a, b] = result.runs.map((r) => r.label);
  const groups: { root: Difference | null; follow: Difference[] }[] = [];
  for (const d of compare.differences) {
    if (!d.isKnockOn || !groups.length) groups.push({ root: d.isKnockOn ? null : d, follow: d.isKnockOn ? [d] : [] });
    else groups[groups.length - 1].follow.push(d);
  }
  const row = (d: Difference) => (
    <div className="space-y-1">
      <p className="text-sm">
        <strong>{formatSiteTime(d.at, ctx.timeZone)}</strong> · {d.device ? `${d.kind} from ${deviceLabel(ctx, d.device)}` : d.kind}
        {d.value !== null && d.value !== undefined ? ` = ${String(d.value)}` : ""}
      </p>
      <ul className="text-xs">
        {d.onlyA.map((x, i) => (
          <li key={`a${i}`}>
            <span className="mr-1 rounded bg-ink px-1 font-bold text-fog">only with {a}</span>
            {x}
          </li>
        ))}
        {d.onlyB.map((x, i) => (
          <li key={`b${i}`}>
            <span className="mr-1 rounded bg-harvest px-1 font-bold text-ink">only with {b}</span>
            {x}
          </li>
        ))}
      </ul>
      <p className="flex flex-wrap gap-2 text-xs">
        <button type="button" className="rounded border border-line px-2 py-0.5 font-semibold" onClick={() => onPick({ title: `Trace with ${a}, ${formatSiteTime(d.at, ctx.timeZone)}`, trace: d.traceA })}>
          Trace with {a}
        </button>
        <button type="button" className="rounded border border-line px-2 py-0.5 font-semibold" onClick={() => onPick({ title: `Trace with ${b}, ${formatSiteTime(d.at, ctx.timeZone)}`, trace: d.traceB })}>
          Trace with {b}
        </button>
      </p>
    </div>
  );
  return (
    <section aria-labelledby="compare-h" className="rounded-xl border border-line bg-paper p-4">
      <h2 id="compare-h" className="text-lg font-bold">
        Compare: {a} vs {b}
      </h2>
      <p className="text-sm" role="status">
        {compare.root === 0 && compare.knockOn === 0
          ? "The two rule sets do the same with every event of this window."
          : `${compare.root} step${compare.root === 1 ? "" : "s"} decided differently${compare.knockOn ? `; ${compare.knockOn} later step${compare.knockOn === 1 ? "" : "s"} differ${compare.knockOn === 1 ? "s" : ""} only as a consequence` : ""}.`}
        {compare.isCut ? " Only the first differences are listed; narrow the window to see the rest." : ""}
      </p>
      <ol aria-label="Differences" className="mt-3 space-y-3">
        {groups.map((g, i) => (
          <li key={i} className="rounded-lg border border-line p-3">
            {g.root ? row(g.root) : <p className="text-xs text-slate">Follows from a difference before the window shown.</p>}
            {g.follow.length ? (
              <details className="mt-2">
                <summary className="cursor-pointer text-xs font-semibold text-slate">
                  {g.follow.length} later step{g.follow.length === 1 ? "" : "s"} that follow from this
                </summary>
                <ol aria-label="Follow-on differences" className="mt-2 space-y-2 border-l-2 border-line pl-3">
                  {g.follow.map((d, j) => (
                    <li key={j}>{row(d)}</li>
                  ))}
                </ol>
              </details>
            ) : null}
          </li>
        ))}
      </ol>
    </section>
  );
}
