"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useCallback, useMemo, useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import type { StateChange, TraceEntry } from "@/lib/bus/types";
import { formatSiteTime, localInputToInstant } from "@/lib/eventlog/local-input";
import type { EventRow } from "@/lib/validation/events";
import { EMPTY_FILTER, EventFilters, type FilterState } from "./event-filters";
import { EventTable } from "./event-table";
import { ImportPanel } from "./import-panel";
import { TraceView } from "./trace-view";
import { deviceLabel, type SiteContext } from "./types";
import { useEventLog } from "./use-event-log";

type TraceAnswer = { event: Omit<EventRow, "outcome">; step: { versionId: string | null; trace: TraceEntry[]; changes: StateChange[] } | null };

/** Filters → query string; a bad time range is said, not sent. */
function toQuery(f: FilterState, timeZone: string): { query: string; error: string | null } {
  const q = new URLSearchParams();
  if (f.device) q.set("device", f.device);
  if (f.zone) q.set("zone", f.zone);
  if (f.kind) q.set("kind", f.kind);
  const from = f.from ? localInputToInstant(f.from, timeZone) : null;
  const to = f.to ? localInputToInstant(f.to, timeZone) : null;
  if (from !== null && to !== null && from >= to) return { query: "", error: "The end of the time range must be after its start." };
  if (from !== null) q.set("from", String(from));
  if (to !== null) q.set("to", String(to));
  return { query: q.toString(), error: null };
}

export function EventLogPanel({ ctx }: { ctx: SiteContext }) {
  const [filter, setFilter] = useState<FilterState>(EMPTY_FILTER);
  const [isLive, setLive] = useState(false);
  const [selected, setSelected] = useState<number | null>(null);
  const { query, error } = useMemo(() => toQuery(filter, ctx.timeZone), [filter, ctx.timeZone]);
  const [applied, setApplied] = useState("");
  if (!error && query !== applied) setApplied(query);
  const { pages, rows, liveCount } = useEventLog(ctx.siteId, applied, isLive);
  const onMore = useCallback(() => void pages.fetchNextPage(), [pages]);
  const base = `/api/sites/${encodeURIComponent(ctx.siteId)}/events`;

  return (
    <div className="space-y-6">
      <header className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-3xl font-extrabold tracking-tight">Event log</h1>
          <p className="text-sm text-slate">Every event the site&apos;s devices reported, newest first, with what the live rules did. Times are the site&apos;s ({ctx.timeZone}).</p>
        </div>
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <label className="flex items-center gap-2 rounded-md border border-line bg-paper px-2 py-1.5">
            <input type="checkbox" checked={isLive} onChange={(e) => setLive(e.target.checked)} />
            Live tail {isLive ? <span className="text-xs text-moss">({liveCount} new)</span> : null}
          </label>
          <a className="rounded-md border border-line bg-paper px-3 py-1.5 font-semibold" href={`${base}/export?format=ndjson${applied ? `&${applied}` : ""}`} download>
            Export NDJSON
          </a>
          <a className="rounded-md border border-line bg-paper px-3 py-1.5 font-semibold" href={`${base}/export?format=csv${applied ? `&${applied}` : ""}`} download>
            Export CSV
          </a>
          <Link className="rounded-md bg-ink px-3 py-1.5 font-semibold text-fog" href={`/sites/${ctx.siteId}/replay`}>
            Replay…
          </Link>
        </div>
      </header>
      <EventFilters ctx={ctx} value={filter} onChange={setFilter} error={error} />
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_18rem]">
        <div className="min-w-0">
          {pages.isPending ? (
            <LoadingPanel label="Loading events…" />
          ) : pages.isError ? (
            <ErrorPanel title="The log could not be loaded." detail={pages.error.message} onRetry={() => void pages.refetch()} />
          ) : (
            <EventTable ctx={ctx} rows={rows} total={`${rows.length} shown`} hasMore={!!pages.hasNextPage} isFetchingMore={pages.isFetchingNextPage} onMore={onMore} selected={selected} onSelect={setSelected} />
          )}
        </div>
        <EventTrace ctx={ctx} seq={selected} />
      </div>
      <ImportPanel siteId={ctx.siteId} />
    </div>
  );
}

function EventTrace({ ctx, seq }: { ctx: SiteContext; seq: number | null }) {
  const q = useQuery({
    queryKey: ["sites", ctx.siteId, "event", seq],
    queryFn: () => fetchJson<TraceAnswer>(`/api/sites/${encodeURIComponent(ctx.siteId)}/events/${seq}`),
    enabled: seq !== null,
  });
  return (
    <aside aria-labelledby="trace-heading" className="h-fit rounded-xl border border-line bg-paper p-4 lg:sticky lg:top-4">
      <h2 id="trace-heading" className="text-lg font-bold">
        Trace
      </h2>
      {seq === null ? <p className="text-sm text-slate">Choose an event&apos;s time to see which rules it woke, which gates passed and what was done.</p> : null}
      {seq !== null && q.isPending ? <p className="text-sm text-slate">Loading…</p> : null}
      {q.isError ? <p role="alert" className="text-sm text-clay">{q.error.message}</p> : null}
      {q.data ? (
        <div className="space-y-2">
          <p className="text-sm">
            <strong>{q.data.event.kind}</strong> from {deviceLabel(ctx, q.data.event.device)} at {formatSiteTime(q.data.event.at, ctx.timeZone)} <span className="text-xs text-slate">(id {q.data.event.eventId}, {q.data.event.source})</span>
          </p>
          {q.data.step ? (
            <TraceView trace={q.data.step.trace} timeZone={ctx.timeZone} label="Trace of this event" />
          ) : (
            <p className="text-sm text-slate">
              The live engine did not run this event ({q.data.event.source === "import" ? "it was imported as history" : "no step recorded"}). <Link className="underline" href={`/sites/${ctx.siteId}/replay`}>Replay</Link> a window around it to see its Trace under any rule set.
            </p>
          )}
        </div>
      ) : null}
    </aside>
  );
}
