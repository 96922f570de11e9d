"use client";

import { useQuery } from "@tanstack/react-query";
import { useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import { useDevices, useInvalidateInventory, useZones, sendJson } from "@/components/devices/use-inventory";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import { describeTransitionTime, encodeTransitionTime } from "@/lib/mesh/transition-time";
import type { SceneDto } from "@/lib/validation/scenes";
import { SceneForm } from "./scene-form";

export function ScenesPanel({ siteId }: { siteId: string }) {
  const scenes = useQuery({ queryKey: ["sites", siteId, "inventory", "scenes"], queryFn: () => fetchJson<{ scenes: SceneDto[] }>(`/api/sites/${siteId}/scenes`).then((r) => r.scenes) });
  const zones = useZones(siteId);
  const devices = useDevices(siteId);
  const invalidate = useInvalidateInventory(siteId);
  const [editing, setEditing] = useState<SceneDto | "new" | null>(null);
  const [error, setError] = useState<string | null>(null);

  if (scenes.isPending || zones.isPending || devices.isPending) return <LoadingPanel label="Loading scenes…" />;
  if (scenes.isError || zones.isError || devices.isError) return <ErrorPanel title="The scenes could not be loaded." detail={(scenes.error ?? zones.error ?? devices.error)?.message} onRetry={() => void invalidate()} />;
  const nextNumber = Math.max(0, ...scenes.data.map((s) => s.number)) + 1;

  return (
    <div className="space-y-6">
      <div className="flex items-center gap-3">
        <h1 className="mr-auto text-2xl font-extrabold">Scenes</h1>
        <button type="button" onClick={() => setEditing("new")} className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog">
          New scene
        </button>
      </div>
      {error ? (
        <p role="alert" className="font-semibold text-clay">
          {error}
        </p>
      ) : null}
      {editing ? (
        <section className="rounded-xl border border-slate/40 bg-paper p-4">
          <h2 className="mb-3 text-lg font-bold">{editing === "new" ? "New scene" : `Edit ${editing.name}`}</h2>
          <SceneForm
            key={editing === "new" ? "new" : editing.id}
            siteId={siteId}
            scene={editing === "new" ? undefined : editing}
            nextNumber={nextNumber}
            zones={zones.data}
            devices={devices.data}
            onDone={() => {
              setEditing(null);
              void invalidate();
            }}
          />
        </section>
      ) : null}
      <div className="overflow-x-auto rounded-xl border border-line bg-paper">
        <table className="w-full text-sm">
          <caption className="sr-only">Scenes of this site</caption>
          <thead>
            <tr className="border-b border-line text-left text-slate">
              <th scope="col" className="px-3 py-2">No.</th>
              <th scope="col" className="px-3 py-2">Name</th>
              <th scope="col" className="px-3 py-2">Fade</th>
              <th scope="col" className="px-3 py-2">Targets</th>
              <th scope="col" className="px-3 py-2">Occupants</th>
              <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>
            </tr>
          </thead>
          <tbody>
            {scenes.data.length === 0 ? (
              <tr>
                <td colSpan={6} className="px-3 py-4 text-slate">No scenes yet.</td>
              </tr>
            ) : null}
            {scenes.data.map((s) => (
              <tr key={s.id} className="border-b border-line/60 last:border-0">
                <td className="px-3 py-1.5 font-mono">{s.number}</td>
                <td className="px-3 py-1.5 font-semibold">{s.name}</td>
                <td className="px-3 py-1.5">
                  {describeTransitionTime(s.fadeMs)} <span className="font-mono text-slate">(0x{encodeTransitionTime(s.fadeMs).toString(16).toUpperCase().padStart(2, "0")})</span>
                </td>
                <td className="px-3 py-1.5">{s.levels.length}</td>
                <td className="px-3 py-1.5">{s.isOccupantRecallable ? "May recall" : "—"}</td>
                <td className="px-3 py-1.5 text-right">
                  <button type="button" className="rounded-md px-2 py-1 font-semibold hover:bg-fog" onClick={() => setEditing(s)}>
                    Edit<span className="sr-only"> {s.name}</span>
                  </button>
                  <button
                    type="button"
                    className="rounded-md px-2 py-1 font-semibold text-clay hover:bg-clay/10"
                    onClick={async () => {
                      if (!window.confirm(`Delete scene ${s.number} ${s.name}?`)) return;
                      try {
                        setError(null);
                        await sendJson(`/api/sites/${siteId}/scenes/${s.id}`, "DELETE");
                        await invalidate();
                      } catch (err) {
                        setError(err instanceof Error ? err.message : String(err));
                      }
                    }}
                  >
                    Delete<span className="sr-only"> {s.name}</span>
                  </button>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
