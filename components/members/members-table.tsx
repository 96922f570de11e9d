"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { createColumnHelper, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { useId, useMemo, useState } from "react";
import { DataTable } from "@/components/ui/data-table";
import { fetchJson } from "@/components/api/fetch-json";
import { ROLE_LABEL, type Role } from "@/lib/auth/roles";
import type { MembersResponse } from "@/lib/validation/members";
import { RoleSelect } from "./role-select";

type Member = MembersResponse["members"][number];
const col = createColumnHelper<Member>();

export function MembersTable({ siteId, data }: { siteId: string; data: MembersResponse }) {
  const queryClient = useQueryClient();
  const filterId = useId();
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);
  const [filter, setFilter] = useState("");
  const [message, setMessage] = useState<{ kind: "error" | "ok"; text: string } | null>(null);
  const zoneName = useMemo(() => new Map(data.zones.map((z) => [z.id, z.name])), [data.zones]);

  const change = useMutation({
    mutationFn: (v: { userId: string; role: Role; zoneIds: string[] | null; method: "PATCH" | "DELETE" }) =>
      fetchJson(`/api/sites/${siteId}/members/${v.userId}`, {
        method: v.method,
        headers: { "content-type": "application/json" },
        body: v.method === "PATCH" ? JSON.stringify({ role: v.role, zoneIds: v.zoneIds }) : undefined,
      }),
    onSuccess: (_r, v) => {
      setMessage({ kind: "ok", text: v.method === "DELETE" ? "Member removed." : "Role changed." });
      void queryClient.invalidateQueries({ queryKey: ["sites", siteId, "members"] });
    },
    onError: (err) => setMessage({ kind: "error", text: err.message }),
  });

  const columns = useMemo(
    () => [
      col.accessor("name", { header: "Name", cell: (c) => <span className="font-semibold">{c.getValue()}{c.row.original.userId === data.me ? " (you)" : ""}</span> }),
      col.accessor("email", { header: "E-mail" }),
      col.accessor("role", {
        header: "Role",
        sortingFn: (a, b) => ROLE_LABEL[a.original.role].localeCompare(ROLE_LABEL[b.original.role]),
        cell: (c) => (
          <RoleSelect
            label={`Role of ${c.row.original.name}`}
            value={c.getValue()}
            disabled={change.isPending}
            onChange={(role) => change.mutate({ userId: c.row.original.userId, role, zoneIds: role === "occupant" ? c.row.original.zoneIds : null, method: "PATCH" })}
          />
        ),
      }),
      col.accessor((m) => (m.role === "occupant" && m.zoneIds ? m.zoneIds.map((z) => zoneName.get(z) ?? "?").join(", ") : "Whole site"), { id: "zones", header: "Zones" }),
      col.display({
        id: "actions",
        header: () => <span className="sr-only">Actions</span>,
        cell: (c) => (
          <button
            type="button"
            className="rounded-md px-2 py-1 text-sm font-semibold text-clay hover:bg-clay/10"
            disabled={change.isPending}
            onClick={() => {
              if (window.confirm(`Remove ${c.row.original.name} from this site?`)) change.mutate({ userId: c.row.original.userId, role: c.row.original.role, zoneIds: null, method: "DELETE" });
            }}
          >
            Remove<span className="sr-only"> {c.row.original.name}</span>
          </button>
        ),
      }),
    ],
    [change, data.me, zoneName],
  );

  // eslint-disable-next-line react-hooks/incompatible-library -- TanStack Table returns fresh functions by design.
  const table = useReactTable({
    data: data.members,
    columns,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
  });

  return (
    <div className="mt-4 space-y-3">
      <div className="flex items-end gap-3">
        <div className="flex flex-col">
          <label htmlFor={filterId} className="text-sm text-slate">
            Filter members
          </label>
          <input id={filterId} type="search" value={filter} onChange={(e) => setFilter(e.target.value)} className="w-64 rounded-md border border-line bg-paper px-2 py-1.5" />
        </div>
        <p aria-live="polite" className={`text-sm font-semibold ${message?.kind === "error" ? "text-clay" : "text-moss"}`} role={message?.kind === "error" ? "alert" : "status"}>
          {message?.text}
        </p>
      </div>
      <DataTable table={table} caption="Members of this site" />
    </div>
  );
}
