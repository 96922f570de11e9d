"use client";

import { useQuery } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import Link from "next/link";
import { useMemo, useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import { DataTable } from "@/components/ui/data-table";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import { PowerBadge } from "@/components/ui/power-badge";
import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import type { EnergySummary, SiteEnergyResponse } from "@/lib/energy/summary";
import type { EnergyQuery } from "@/lib/validation/energy";
import { formatHours, formatJoules, formatMargin, formatInterval, sig } from "./format";
import { QuerySwitch } from "./source-switch";
import { VERDICT_LABEL, VerdictBadge } from "./verdict-badge";

const col = createColumnHelper<EnergySummary>();
const RANK = { short: 0, tight: 1, covered: 2 } as const;

export function energyHref(siteId: string, query: EnergyQuery, deviceId?: string) {
  return `/sites/${siteId}/energy${deviceId ? `/${deviceId}` : ""}?source=${query.source}&week=${query.week}`;
}

export function EnergyPanel({ siteId, query }: { siteId: string; query: EnergyQuery }) {
  const budget = useQuery({
    queryKey: ["sites", siteId, "energy", query.source, query.week],
    queryFn: () => fetchJson<SiteEnergyResponse>(`/api/sites/${siteId}/energy?source=${query.source}&week=${query.week}`),
  });
  const [sorting, setSorting] = useState<SortingState>([{ id: "verdict", desc: false }]);

  const columns = useMemo(
    () => [
      col.accessor("name", {
        header: "Device",
        cell: (c) => (
          <span className="flex min-w-[10rem] flex-col">
            <Link href={energyHref(siteId, query, c.row.original.deviceId)} className="font-semibold underline decoration-line underline-offset-2 hover:decoration-ink">
              {c.getValue()}
            </Link>
            <span className="text-xs text-slate">{DEVICE_KIND_INFO[c.row.original.kind].label}</span>
          </span>
        ),
      }),
      col.accessor((d) => RANK[d.verdict], {
        id: "verdict",
        header: "Verdict",
        cell: ({ row: { original: d } }) => (
          <span className="flex min-w-[11rem] flex-col items-start gap-0.5">
            <VerdictBadge verdict={d.verdict} />
            {d.ruleImpact ? (
              <span className="text-xs font-semibold text-clay">
                Because of rule {d.ruleImpact.ruleNodeIds.join(", ")} — {VERDICT_LABEL[d.ruleImpact.verdictWithout]} without it
              </span>
            ) : null}
            {d.brownoutHours > 0 ? <span className="text-xs">Browns out {d.brownoutHours} h a week</span> : null}
            {d.isTypical ? <span className="text-xs text-slate">Typical values in its profile</span> : null}
          </span>
        ),
      }),
      col.accessor((d) => d.margin ?? Number.POSITIVE_INFINITY, { id: "margin", header: "Margin", sortDescFirst: false, cell: (c) => <span className="whitespace-nowrap tabular-nums">{formatMargin(c.row.original.margin)}</span> }),
      col.accessor((d) => d.zoneName ?? "—", { id: "zone", header: "Zone", cell: (c) => <span className="whitespace-nowrap">{c.getValue()}</span> }),
      col.accessor("power", { header: "Power", cell: (c) => <PowerBadge power={c.getValue()} /> }),
      col.accessor("harvestPerDayJ", { header: "Harvest / day", cell: (c) => <span className="whitespace-nowrap tabular-nums">{formatJoules(c.getValue())}</span> }),
      col.accessor("spendPerDayJ", { header: "Spend / day", cell: (c) => <span className="whitespace-nowrap tabular-nums">{formatJoules(c.getValue())}</span> }),
      col.accessor("messagesPerDay", { header: "Messages / day", cell: (c) => <span className="tabular-nums">{sig(c.getValue())}</span> }),
      col.accessor((d) => d.darkHours ?? -1, { id: "dark", header: "In darkness from full", cell: (c) => <span className="whitespace-nowrap">{formatHours(c.row.original.darkHours)}</span> }),
      col.display({
        id: "limits",
        header: "Needs / affords",
        cell: ({ row: { original: d } }) =>
          d.kinetic ? (
            <span className="block min-w-[9rem] text-xs">
              a press pays {d.kinetic.affordablePerActuation}, rules send {d.kinetic.neededPerActuation}
            </span>
          ) : (
            <span className="block min-w-[9rem] text-xs">
              ≥ {sig(d.leastLux?.lux ?? 0)} lx, {sig(d.leastLux?.hoursPerDay ?? 0)} h/day
              <br />
              reports ≥ {formatInterval(d.shortestIntervalS)} apart
            </span>
          ),
      }),
    ],
    [siteId, query],
  );

  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table returns fresh functions by design.
  const table = useReactTable({
    data: budget.data?.devices ?? [],
    columns,
    getRowId: (d) => d.deviceId,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  const hrefFor = (name: string, value: string) => energyHref(siteId, { ...query, [name]: value } as EnergyQuery);
  const count = (v: EnergySummary["verdict"]) => budget.data?.devices.filter((d) => d.verdict === v).length ?? 0;

  return (
    <div className="space-y-5">
      <div className="flex flex-wrap items-end gap-x-6 gap-y-3">
        <div className="mr-auto">
          <h1 className="text-2xl font-extrabold">Energy budget</h1>
          <p className="text-sm text-slate">Can each battery-free device pay for the messages its rules ask of it?</p>
        </div>
        <QuerySwitch label="Rules" name="source" value={query.source} options={[{ value: "active", label: "Active" }, { value: "draft", label: "Draft" }]} hrefFor={hrefFor} />
        <QuerySwitch label="Week" name="week" value={query.week} options={[{ value: "shortest", label: "Shortest days" }, { value: "longest", label: "Longest days" }]} hrefFor={hrefFor} />
      </div>
      {budget.isPending ? <LoadingPanel label="Working out the energy budget…" /> : null}
      {budget.isError ? <ErrorPanel title="The energy budget could not be worked out." detail={budget.error.message} onRetry={() => void budget.refetch()} /> : null}
      {budget.data ? (
        <>
          <p className="text-sm" aria-live="polite">
            {budget.data.weekLabel}, under the {budget.data.source === "draft" ? "draft" : "active"} rules: <strong>{count("short")} Short</strong>, {count("tight")} Tight, {count("covered")} Covered of {budget.data.devices.length} battery-free devices.
          </p>
          {budget.data.notes.map((n) => (
            <p key={n} role="note" className="rounded-md border border-harvest/60 bg-harvest/10 px-3 py-2 text-sm">
              {n}
            </p>
          ))}
          {budget.data.devices.length === 0 ? <p className="text-slate">This site has no battery-free devices.</p> : <DataTable table={table} caption="Energy budget of the site's battery-free devices" rowClassName={(r) => (r.original.verdict === "short" ? "bg-clay/5" : "")} />}
          <p className="text-xs text-slate">
            Open a device to see every figure with its formula and inputs, its week of stored energy, and what-if controls. Verdicts: Short when it spends more than it harvests or browns out; Tight with less than 30 % to spare; Covered otherwise.
          </p>
        </>
      ) : null}
    </div>
  );
}
