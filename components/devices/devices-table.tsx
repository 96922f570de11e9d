"use client";

import { createColumnHelper, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type RowSelectionState, type SortingState } from "@tanstack/react-table";
import { useId, useMemo, useState } from "react";
import { DataTable } from "@/components/ui/data-table";
import { PowerBadge } from "@/components/ui/power-badge";
import { DEVICE_KIND_INFO, DEVICE_KINDS } from "@/lib/catalogue/device-kinds";
import { formatAddress } from "@/lib/mesh/address";
import type { DeviceDto, ZoneDto } from "@/lib/validation/devices";

const col = createColumnHelper<DeviceDto>();

type Props = {
  devices: DeviceDto[];
  zones: ZoneDto[];
  canEdit: boolean;
  onEdit: (d: DeviceDto) => void;
  onDelete: (d: DeviceDto) => void;
  onBulkZone: (ids: string[], zoneId: string | null) => Promise<void>;
};

export function DevicesTable({ devices, zones, canEdit, onEdit, onDelete, onBulkZone }: Props) {
  const searchId = useId();
  const kindId = useId();
  const zoneFilterId = useId();
  const bulkId = useId();
  const [sorting, setSorting] = useState<SortingState>([{ id: "address", desc: false }]);
  const [search, setSearch] = useState("");
  const [kind, setKind] = useState("");
  const [zoneFilter, setZoneFilter] = useState("");
  const [selection, setSelection] = useState<RowSelectionState>({});
  const [bulkZone, setBulkZone] = useState("");
  const zoneName = useMemo(() => new Map(zones.map((z) => [z.id, z.name])), [zones]);

  const data = useMemo(() => devices.filter((d) => (!kind || d.kind === kind) && (!zoneFilter || (zoneFilter === "none" ? !d.zoneId : d.zoneId === zoneFilter))), [devices, kind, zoneFilter]);

  const columns = useMemo(
    () => [
      ...(canEdit
        ? [
            col.display({
              id: "select",
              header: ({ table }) => <input type="checkbox" aria-label="Select all shown devices" checked={table.getIsAllRowsSelected()} onChange={table.getToggleAllRowsSelectedHandler()} />,
              cell: ({ row }) => <input type="checkbox" aria-label={`Select ${row.original.name}`} checked={row.getIsSelected()} onChange={row.getToggleSelectedHandler()} />,
            }),
          ]
        : []),
      col.accessor("name", { header: "Name", cell: (c) => <span className="font-semibold">{c.getValue()}</span> }),
      col.accessor((d) => DEVICE_KIND_INFO[d.kind].label, { id: "kind", header: "Kind" }),
      col.accessor((d) => DEVICE_KIND_INFO[d.kind].power, { id: "power", header: "Power", cell: (c) => <PowerBadge power={c.getValue()} /> }),
      col.accessor((d) => (d.zoneId ? (zoneName.get(d.zoneId) ?? "?") : "—"), { id: "zone", header: "Zone" }),
      col.accessor("unicastAddress", {
        id: "address",
        header: "Unicast",
        cell: (c) => <span className="font-mono">{formatAddress(c.getValue())}{c.row.original.elementCount > 1 ? `–${formatAddress(c.getValue() + c.row.original.elementCount - 1)}` : ""}</span>,
      }),
      ...(canEdit
        ? [
            col.display({
              id: "actions",
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row }) => (
                <span className="flex justify-end gap-1">
                  <button type="button" onClick={() => onEdit(row.original)} className="rounded-md px-2 py-1 font-semibold hover:bg-fog">
                    Edit<span className="sr-only"> {row.original.name}</span>
                  </button>
                  <button type="button" onClick={() => onDelete(row.original)} className="rounded-md px-2 py-1 font-semibold text-clay hover:bg-clay/10">
                    Delete<span className="sr-only"> {row.original.name}</span>
                  </button>
                </span>
              ),
            }),
          ]
        : []),
    ],
    [canEdit, onDelete, onEdit, zoneName],
  );

  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table returns fresh functions by design.
  const table = useReactTable({
    data,
    columns,
    getRowId: (d) => d.id,
    state: { sorting, globalFilter: search, rowSelection: selection },
    onSortingChange: setSorting,
    onGlobalFilterChange: setSearch,
    onRowSelectionChange: setSelection,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });
  const selectedIds = Object.keys(selection).filter((k) => selection[k]);

  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-end gap-3">
        <div className="flex flex-col">
          <label htmlFor={searchId} className="text-sm text-slate">Search</label>
          <input id={searchId} type="search" value={search} onChange={(e) => setSearch(e.target.value)} placeholder="Name, kind, zone" className="w-56 rounded-md border border-line bg-paper px-2 py-1.5" />
        </div>
        <div className="flex flex-col">
          <label htmlFor={kindId} className="text-sm text-slate">Kind</label>
          <select id={kindId} value={kind} onChange={(e) => setKind(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-1.5">
            <option value="">All kinds</option>
            {DEVICE_KINDS.map((k) => (
              <option key={k} value={k}>{DEVICE_KIND_INFO[k].label}</option>
            ))}
          </select>
        </div>
        <div className="flex flex-col">
          <label htmlFor={zoneFilterId} className="text-sm text-slate">In zone</label>
          <select id={zoneFilterId} value={zoneFilter} onChange={(e) => setZoneFilter(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-1.5">
            <option value="">Any zone</option>
            <option value="none">No zone</option>
            {zones.map((z) => (
              <option key={z.id} value={z.id}>{z.name}</option>
            ))}
          </select>
        </div>
        <p aria-live="polite" className="ml-auto text-sm text-slate">
          {table.getRowModel().rows.length} of {devices.length} devices{selectedIds.length ? ` · ${selectedIds.length} selected` : ""}
        </p>
      </div>
      {canEdit && selectedIds.length > 0 ? (
        <div className="flex flex-wrap items-end gap-2 rounded-lg border border-harvest/60 bg-harvest/10 p-3">
          <div className="flex flex-col">
            <label htmlFor={bulkId} className="text-sm font-semibold">Move {selectedIds.length} selected to</label>
            <select id={bulkId} value={bulkZone} onChange={(e) => setBulkZone(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-1.5">
              <option value="">No zone</option>
              {zones.map((z) => (
                <option key={z.id} value={z.id}>{z.name}</option>
              ))}
            </select>
          </div>
          <button type="button" className="rounded-md bg-ink px-3 py-1.5 font-semibold text-fog" onClick={async () => { await onBulkZone(selectedIds, bulkZone || null); setSelection({}); }}>
            Move
          </button>
        </div>
      ) : null}
      <DataTable table={table} caption="Devices of this site" rowClassName={(row) => (row.getIsSelected() ? "bg-harvest/5" : "")} />
    </div>
  );
}
