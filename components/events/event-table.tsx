"use client";

import { useVirtualizer } from "@tanstack/react-virtual";
import { useEffect, useRef } from "react";
import { formatSiteTime } from "@/lib/eventlog/local-input";
import type { EventRow } from "@/lib/validation/events";
import { deviceLabel, type SiteContext } from "./types";

const ROW_PX = 40;
const COLS = "grid grid-cols-[10rem_minmax(9rem,1.3fr)_minmax(6rem,1fr)_5.5rem_4.5rem_4rem_minmax(8rem,1.2fr)] items-center gap-2 px-3";

function outcomeText(r: EventRow): string {
  if (!r.outcome) return r.source === "import" ? "imported (not run live)" : "—";
  const { fired, actions, changes } = r.outcome;
  if (!fired) return "no rule fired";
  return `${fired} rule${fired === 1 ? "" : "s"} · ${actions} action${actions === 1 ? "" : "s"} · ${changes} change${changes === 1 ? "" : "s"}`;
}

/**
 * The log as a virtualised ARIA table: only the rows in view are in the DOM,
 * so a year of events scrolls as lightly as a day. Scrolling near the end asks
 * for the next keyset page.
 */
export function EventTable({ ctx, rows, total, hasMore, isFetchingMore, onMore, selected, onSelect }: { ctx: SiteContext; rows: EventRow[]; total: string; hasMore: boolean; isFetchingMore: boolean; onMore: () => void; selected: number | null; onSelect: (seq: number) => void }) {
  const parent = useRef<HTMLDivElement>(null);
  const zoneOf = new Map(ctx.devices.map((d) => [d.id, d.zoneId]));
  const zoneName = new Map(ctx.zones.map((z) => [z.id, z.name]));
  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Virtual returns fresh functions by design.
  const v = useVirtualizer({ count: rows.length, getScrollElement: () => parent.current, estimateSize: () => ROW_PX, overscan: 12 });
  const items = v.getVirtualItems();
  const lastIndex = items.length ? items[items.length - 1].index : 0;
  useEffect(() => {
    if (hasMore && !isFetchingMore && lastIndex >= rows.length - 20) onMore();
  }, [lastIndex, rows.length, hasMore, isFetchingMore, onMore]);

  return (
    <div className="rounded-xl border border-line bg-paper">
      <div ref={parent} className="h-[28rem] overflow-auto" tabIndex={0} aria-label="Event log, scrollable">
        <div role="table" aria-label={`Event log (${total})`} aria-rowcount={rows.length + 1} className="min-w-[50rem] text-sm">
          <div role="rowgroup" className="sticky top-0 z-10 border-b border-line bg-paper">
            <div role="row" aria-rowindex={1} className={`${COLS} py-2 text-left font-semibold text-slate`}>
              {["Time (site)", "Device", "Zone", "Kind", "Value", "Source", "Live engine"].map((h) => (
                <span key={h} role="columnheader">
                  {h}
                </span>
              ))}
            </div>
          </div>
          <div role="rowgroup" style={{ height: v.getTotalSize(), position: "relative" }}>
            {items.map((item) => {
              const r = rows[item.index];
              const isSelected = r.seq === selected;
              return (
                <div
                  key={r.seq}
                  role="row"
                  aria-rowindex={item.index + 2}
                  aria-selected={isSelected}
                  className={`${COLS} absolute left-0 right-0 border-b border-line/60 ${isSelected ? "bg-harvest/15" : "hover:bg-fog"}`}
                  style={{ height: ROW_PX, transform: `translateY(${item.start}px)` }}
                >
                  <span role="cell" className="font-mono text-xs">
                    <button type="button" className="underline decoration-dotted underline-offset-2" onClick={() => onSelect(r.seq)} aria-label={`Trace of ${r.kind} from ${deviceLabel(ctx, r.device)} at ${formatSiteTime(r.at, ctx.timeZone)}`}>
                      {formatSiteTime(r.at, ctx.timeZone)}
                    </button>
                  </span>
                  <span role="cell" className="truncate" title={r.device}>
                    {deviceLabel(ctx, r.device)}
                  </span>
                  <span role="cell" className="truncate text-slate">
                    {zoneName.get(zoneOf.get(r.device) ?? "") ?? "—"}
                  </span>
                  <span role="cell">{r.kind}</span>
                  <span role="cell" className="truncate font-mono text-xs">
                    {r.value === null ? "—" : String(r.value)}
                  </span>
                  <span role="cell" className="text-xs text-slate">
                    {r.source}
                  </span>
                  <span role="cell" className="truncate text-xs">
                    {outcomeText(r)}
                  </span>
                </div>
              );
            })}
          </div>
        </div>
        {!rows.length ? <p className="p-4 text-sm text-slate">No events match these filters.</p> : null}
      </div>
      <p className="border-t border-line px-3 py-1.5 text-xs text-slate" aria-live="polite">
        {isFetchingMore ? "Loading more…" : hasMore ? `${rows.length} loaded; scroll for more.` : `${rows.length} event${rows.length === 1 ? "" : "s"}.`}
      </p>
    </div>
  );
}
