"use client";

import { NamedOptions } from "@/components/ui/named-options";
import { useId, useMemo, useState } from "react";
import { TraceView } from "@/components/events/trace-view";
import { deviceLabel, type SiteContext } from "@/components/events/types";
import { formatSiteTime } from "@/lib/eventlog/local-input";
import type { ReplayResult, TimelineEntry } from "@/lib/replay/types";
import { CompareList, type PickedTrace } from "./compare-list";
import { LevelChart } from "./level-chart";

/** A replay's timeline, level and relay chart, and (for two rule sets) the Compare, with a Trace beside. */
export function ReplayResults({ ctx, result }: { ctx: SiteContext; result: ReplayResult }) {
  const id = useId();
  const [runIndex, setRunIndex] = useState(0);
  const [device, setDevice] = useState("");
  const [zone, setZone] = useState("");
  const [picked, setPicked] = useState<PickedTrace | null>(null);
  const run = result.runs[runIndex] ?? result.runs[0];
  const zoneOf = useMemo(() => new Map(ctx.devices.map((d) => [d.id, d.zoneId])), [ctx.devices]);

  const timeline = useMemo(() => {
    if (!device && !zone) return run.timeline;
    return run.timeline.filter((t) => {
      if (device) return t.device === device || t.effects.some((e) => e.startsWith(deviceLabel(ctx, device)));
      const names = ctx.devices.filter((d) => d.zoneId === zone).map((d) => d.name);
      return (t.device !== null && zoneOf.get(t.device) === zone) || t.effects.some((e) => names.some((n) => e.startsWith(n)));
    });
  }, [run.timeline, device, zone, ctx, zoneOf]);
  const zones = zone ? run.series.zones.filter((z) => z.id === zone) : run.series.zones;
  const relays = device ? run.series.relays.filter((r) => r.id === device) : zone ? run.series.relays.filter((r) => zoneOf.get(r.id) === zone) : run.series.relays;

  const pick = (t: TimelineEntry) => setPicked({ title: `${t.kind}${t.device ? ` from ${deviceLabel(ctx, t.device)}` : ""}, ${formatSiteTime(t.at, ctx.timeZone)} (${run.label})`, trace: t.trace });
  const pickNear = (at: number) => {
    let best: TimelineEntry | null = null;
    for (const t of timeline) if (!best || Math.abs(t.at - at) < Math.abs(best.at - at)) best = t;
    if (best) pick(best);
  };
  const field = "mt-1 w-full rounded-md border border-line bg-paper px-2 py-1.5 text-sm";

  return (
    <div className="space-y-6">
      <section aria-label="Summary" className="grid gap-3 sm:grid-cols-2">
        {result.runs.map((r) => (
          <div key={r.label} className="rounded-xl border border-line bg-paper p-3 text-sm">
            <p className="font-bold">{r.label}</p>
            <p>
              {result.events} events · {r.counts.firings} rule firings · {r.counts.actions} actions · {r.counts.changes} changes · {r.counts.notices} notices · {r.counts.commands} commands
            </p>
          </div>
        ))}
      </section>

      {result.compare ? <CompareList ctx={ctx} result={result} onPick={setPicked} /> : null}

      <fieldset className="grid gap-3 rounded-xl border border-line bg-paper p-4 sm:grid-cols-3">
        <legend className="px-1 text-sm font-bold">Show</legend>
        {result.runs.length > 1 ? (
          <label className="text-sm font-semibold" htmlFor={`${id}-run`}>
            Rule set
            <select id={`${id}-run`} className={field} value={runIndex} onChange={(e) => setRunIndex(Number(e.target.value))}>
              {result.runs.map((r, i) => (
                <option key={r.label} value={i}>
                  {r.label}
                </option>
              ))}
            </select>
          </label>
        ) : null}
        <label className="text-sm font-semibold" htmlFor={`${id}-dev`}>
          Device
          <select id={`${id}-dev`} className={field} value={device} onChange={(e) => (setDevice(e.target.value), setZone(""))}>
            <NamedOptions all="All devices" items={ctx.devices} />
          </select>
        </label>
        <label className="text-sm font-semibold" htmlFor={`${id}-zone`}>
          Zone
          <select id={`${id}-zone`} className={field} value={zone} onChange={(e) => (setZone(e.target.value), setDevice(""))}>
            <NamedOptions all="All zones" items={ctx.zones} />
          </select>
        </label>
      </fieldset>

      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        <div className="min-w-0 space-y-4">
          <LevelChart title={`Zone levels (mean of each zone's luminaires) — ${run.label}`} lines={zones} unit="%" timeZone={ctx.timeZone} window={result.window} onPick={pickNear} />
          <LevelChart title={`Relays — ${run.label}`} lines={relays} unit="on/off" timeZone={ctx.timeZone} window={result.window} onPick={pickNear} height={140} />
          <section aria-labelledby={`${id}-tl`} className="rounded-xl border border-line bg-paper p-3">
            <h2 id={`${id}-tl`} className="text-lg font-bold">
              Timeline — {run.label}
            </h2>
            <p className="text-xs text-slate">
              Steps where a rule was considered or something changed ({timeline.length}
              {run.isTimelineCut ? `; only the first ${run.timeline.length} are kept — narrow the window or filter the replay to see later ones` : ""}).
            </p>
            <ol aria-label="Timeline" className="mt-2 max-h-[32rem] space-y-1 overflow-auto">
              {timeline.map((t, i) => (
                <li key={`${t.key}-${i}`} className="rounded-md border border-line/70 px-2 py-1 text-sm">
                  <button type="button" className="w-full text-left" onClick={() => pick(t)} aria-label={`Trace: ${t.kind}${t.device ? ` from ${deviceLabel(ctx, t.device)}` : ""} at ${formatSiteTime(t.at, ctx.timeZone)}`}>
                    <span className="font-mono text-xs">{formatSiteTime(t.at, ctx.timeZone)}</span> · {t.device ? `${t.kind} from ${deviceLabel(ctx, t.device)}` : t.kind}
                    {t.value !== null && t.value !== undefined ? ` = ${String(t.value)}` : ""}
                    <span className="block text-xs text-slate">{t.fired.length ? `Fired: ${t.fired.join(", ")}` : "No rule fired"}{t.effects.length ? ` · ${t.effects.filter((e) => !e.startsWith("Action")).slice(0, 3).join("; ")}` : ""}</span>
                  </button>
                </li>
              ))}
            </ol>
          </section>
        </div>
        <aside aria-labelledby={`${id}-trace`} className="h-fit rounded-xl border border-line bg-paper p-4 lg:sticky lg:top-4">
          <h2 id={`${id}-trace`} className="text-lg font-bold">
            Trace
          </h2>
          {picked ? (
            <>
              <p className="mb-2 text-sm font-semibold">{picked.title}</p>
              <TraceView trace={picked.trace} timeZone={ctx.timeZone} label={picked.title} />
            </>
          ) : (
            <p className="text-sm text-slate">Choose a step in the timeline, a point on the chart or a difference to see which rules it woke and why.</p>
          )}
        </aside>
      </div>
    </div>
  );
}
