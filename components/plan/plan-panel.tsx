"use client";

import { useId, useMemo, useState } from "react";
import { sendJson, useDevices, useInvalidateInventory } from "@/components/devices/use-inventory";
import { resolveLevels } from "@/components/scenes/levels-editor";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import type { DeviceDto } from "@/lib/validation/devices";
import { PlanView } from "./plan-view";
import { ScaleTool } from "./scale-tool";
import { UploadPlanForm } from "./upload-plan-form";
import { useFloors, useScenes } from "./use-floors";

type Point = { x: number; y: number };

export function PlanPanel({ siteId, canEdit }: { siteId: string; canEdit: boolean }) {
  const floors = useFloors(siteId);
  const devices = useDevices(siteId);
  const scenes = useScenes(siteId);
  const invalidate = useInvalidateInventory(siteId);
  const floorSelectId = useId();
  const sceneSelectId = useId();
  const [floorId, setFloorId] = useState<string | null>(null);
  const [selectedId, setSelectedId] = useState<string | null>(null);
  const [scalePoints, setScalePoints] = useState<Point[] | null>(null);
  const [previewSceneId, setPreviewSceneId] = useState("");
  const [message, setMessage] = useState<{ kind: "ok" | "error"; text: string } | null>(null);

  const floor = floors.data?.find((f) => f.id === floorId) ?? floors.data?.[0];
  const levels = useMemo(() => {
    const scene = scenes.data?.find((s) => s.id === previewSceneId);
    return scene && devices.data ? resolveLevels(scene.levels, devices.data) : undefined;
  }, [previewSceneId, scenes.data, devices.data]);

  if (floors.isPending || devices.isPending) return <LoadingPanel label="Loading the plan…" />;
  if (floors.isError || devices.isError) return <ErrorPanel title="The plan could not be loaded." detail={(floors.error ?? devices.error)?.message} onRetry={() => void invalidate()} />;

  const placed = floor ? devices.data.filter((d) => d.floorId === floor.id && d.x !== null && d.y !== null) : [];
  const unplaced = devices.data.filter((d) => !placed.includes(d) && (!d.floorId || d.x === null));
  const selected = devices.data.find((d) => d.id === selectedId) ?? null;

  async function move(d: DeviceDto, at: Point) {
    try {
      await sendJson(`/api/sites/${siteId}/devices/${d.id}`, "PATCH", { floorId: floor!.id, x: Math.round(at.x * 100) / 100, y: Math.round(at.y * 100) / 100 });
      setMessage({ kind: "ok", text: `${d.name} placed at ${at.x.toFixed(2)} m, ${at.y.toFixed(2)} m.` });
      await invalidate();
    } catch (err) {
      setMessage({ kind: "error", text: err instanceof Error ? err.message : String(err) });
    }
  }

  function onPlanClick(px: Point) {
    if (!floor) return;
    if (scalePoints) return setScalePoints(scalePoints.length >= 2 ? [px] : [...scalePoints, px]);
    if (canEdit && selected && floor.pixelsPerMetre && !placed.includes(selected)) void move(selected, { x: px.x / floor.pixelsPerMetre, y: px.y / floor.pixelsPerMetre });
  }

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-4">
        <h1 className="mr-auto text-2xl font-extrabold">Floor plan</h1>
        {floors.data.length ? (
          <div className="flex flex-col">
            <label htmlFor={floorSelectId} className="text-sm text-slate">Floor</label>
            <select id={floorSelectId} value={floor?.id} onChange={(e) => { setFloorId(e.target.value); setScalePoints(null); }} className="rounded-md border border-line bg-paper px-2 py-1.5">
              {floors.data.map((f) => <option key={f.id} value={f.id}>{f.name}</option>)}
            </select>
          </div>
        ) : null}
        <div className="flex flex-col">
          <label htmlFor={sceneSelectId} className="text-sm text-slate">Preview a scene</label>
          <select id={sceneSelectId} value={previewSceneId} onChange={(e) => setPreviewSceneId(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-1.5">
            <option value="">No preview</option>
            {scenes.data?.map((s) => <option key={s.id} value={s.id}>{s.number} · {s.name}</option>)}
          </select>
        </div>
        {canEdit && floor?.plan ? (
          <button type="button" onClick={() => setScalePoints([])} className="rounded-md border border-line bg-paper px-3 py-1.5 text-sm font-semibold">
            Set scale
          </button>
        ) : null}
      </div>
      <p role={message?.kind === "error" ? "alert" : "status"} aria-live="polite" className={`text-sm font-semibold ${message?.kind === "error" ? "text-clay" : "text-moss"}`}>{message?.text}</p>
      {scalePoints && floor ? (
        <ScaleTool
          points={scalePoints}
          onCancel={() => setScalePoints(null)}
          onSave={async (metres) => {
            await sendJson(`/api/sites/${siteId}/floors/${floor.id}`, "PATCH", { scale: { a: scalePoints[0], b: scalePoints[1], distanceM: metres } });
            setScalePoints(null);
            setMessage({ kind: "ok", text: "Scale saved." });
            await invalidate();
          }}
        />
      ) : null}
      <div className="grid gap-4 lg:grid-cols-[1fr_16rem]">
        <div className="min-w-0 space-y-2">
          {!floor ? <p className="text-slate">No floors yet{canEdit ? ": add one with its plan below." : "."}</p> : null}
          {floor && !floor.plan ? <p className="text-slate">This floor has no plan image yet.</p> : null}
          {floor?.plan && !floor.pixelsPerMetre ? <p role="status" className="font-semibold text-clay">Set the scale before placing devices: positions are stored in metres.</p> : null}
          {floor?.plan ? (
            <PlanView siteId={siteId} floor={{ ...floor, plan: floor.plan }} devices={placed} canEdit={canEdit} selectedId={selectedId} onSelect={setSelectedId} onMove={move} onPlanClick={onPlanClick} levels={levels} scalePoints={scalePoints ?? []} />
          ) : null}
          {floor?.plan && floor.pixelsPerMetre ? (
            <p className="text-xs text-slate">
              Scale {floor.pixelsPerMetre.toFixed(1)} px/m · ▲ switch · ● sensor · ■ luminaire, driver or relay · ◆ fire-alarm input{levels ? " · glow = scene level" : ""}
            </p>
          ) : null}
        </div>
        <aside className="space-y-3">
          <h2 className="font-bold">Not on this plan ({unplaced.length})</h2>
          {canEdit ? <p className="text-xs text-slate">Select a device, then click on the plan to place it. Placed devices drag, or move with the arrow keys (Shift: 1 m).</p> : null}
          <ul className="max-h-[28rem] space-y-1 overflow-auto">
            {unplaced.map((d) => (
              <li key={d.id}>
                <button type="button" aria-pressed={selectedId === d.id} onClick={() => setSelectedId(selectedId === d.id ? null : d.id)} className={`w-full rounded-md border px-2 py-1 text-left text-sm ${selectedId === d.id ? "border-ink bg-ink text-fog" : "border-line bg-paper"}`}>
                  {d.name}
                </button>
              </li>
            ))}
          </ul>
        </aside>
      </div>
      {canEdit ? (
        <section className="space-y-3 rounded-xl border border-line bg-paper p-4">
          <h2 className="font-bold">Floors and plans</h2>
          {floor ? <UploadPlanForm siteId={siteId} floorId={floor.id} onDone={invalidate} /> : null}
          <UploadPlanForm siteId={siteId} onDone={invalidate} />
        </section>
      ) : null}
    </div>
  );
}
