"use client";

import { useCallback, useState } from "react";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import type { DeviceDto } from "@/lib/validation/devices";
import { CsvImport } from "./csv-import";
import { DeviceDetail } from "./device-detail";
import { DeviceForm } from "./device-form";
import { DevicesTable } from "./devices-table";
import { sendJson, useDevices, useInvalidateInventory, useZones } from "./use-inventory";
import { ZonesCard } from "./zones-card";

export function DevicesPanel({ siteId, canEdit }: { siteId: string; canEdit: boolean }) {
  const devices = useDevices(siteId);
  const zones = useZones(siteId);
  const invalidate = useInvalidateInventory(siteId);
  const [editingId, setEditingId] = useState<string | "new" | null>(null);
  const [message, setMessage] = useState<{ kind: "ok" | "error"; text: string } | null>(null);

  const onDelete = useCallback(
    async (d: DeviceDto) => {
      if (!window.confirm(`Delete ${d.name}? Rules that use it will stop working until they are changed.`)) return;
      try {
        await sendJson(`/api/sites/${siteId}/devices/${d.id}`, "DELETE");
        setMessage({ kind: "ok", text: `${d.name} deleted.` });
        await invalidate();
      } catch (err) {
        setMessage({ kind: "error", text: err instanceof Error ? err.message : String(err) });
      }
    },
    [invalidate, siteId],
  );

  const onBulkZone = useCallback(
    async (ids: string[], zoneId: string | null) => {
      try {
        const { updated } = await sendJson<{ updated: number }>(`/api/sites/${siteId}/devices/bulk-zone`, "POST", { deviceIds: ids, zoneId });
        setMessage({ kind: "ok", text: `${updated} devices moved.` });
        await invalidate();
      } catch (err) {
        setMessage({ kind: "error", text: err instanceof Error ? err.message : String(err) });
      }
    },
    [invalidate, siteId],
  );

  const editing: DeviceDto | "new" | null = editingId === "new" ? "new" : (devices.data?.find((d) => d.id === editingId) ?? null);
  const setEditing = (d: DeviceDto | "new" | null) => setEditingId(d === "new" ? "new" : (d?.id ?? null));

  if (devices.isPending || zones.isPending) return <LoadingPanel label="Loading devices…" />;
  if (devices.isError || zones.isError) return <ErrorPanel title="The devices could not be loaded." detail={(devices.error ?? zones.error)?.message} onRetry={() => void invalidate()} />;

  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_24rem]">
      <section aria-labelledby="devices-heading" className="min-w-0 space-y-4">
        <div className="flex flex-wrap items-center gap-3">
          <h1 id="devices-heading" className="mr-auto text-2xl font-extrabold">
            Devices
          </h1>
          <a href={`/api/sites/${siteId}/devices/export`} className="rounded-md border border-line bg-paper px-3 py-1.5 text-sm font-semibold">
            Export CSV
          </a>
          {canEdit ? (
            <button type="button" onClick={() => setEditing("new")} className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog">
              Add device
            </button>
          ) : null}
        </div>
        <p role={message?.kind === "error" ? "alert" : "status"} aria-live="polite" className={`text-sm font-semibold ${message?.kind === "error" ? "text-clay" : "text-moss"}`}>
          {message?.text}
        </p>
        {editing ? (
          <div className="rounded-xl border border-slate/40 bg-paper p-4">
            <h2 className="mb-3 text-lg font-bold">{editing === "new" ? "Add a device" : `Edit ${editing.name}`}</h2>
            <DeviceForm
              key={editing === "new" ? "new" : `${editing.id}-${editing.kind}`}
              siteId={siteId}
              zones={zones.data}
              device={editing === "new" ? undefined : editing}
              onDone={() => {
                setEditing(null);
                void invalidate();
              }}
            />
            {editing !== "new" ? <DeviceDetail siteId={siteId} device={editing} onSaved={invalidate} /> : null}
          </div>
        ) : null}
        <DevicesTable devices={devices.data} zones={zones.data} canEdit={canEdit} onEdit={setEditing} onDelete={onDelete} onBulkZone={onBulkZone} />
      </section>
      <aside className="space-y-6">
        <ZonesCard siteId={siteId} zones={zones.data} canEdit={canEdit} onChanged={invalidate} />
        {canEdit ? <CsvImport siteId={siteId} onImported={invalidate} /> : null}
      </aside>
    </div>
  );
}
