"use client";

import { useRef, useState } from "react";
import type { DeviceDto } from "@/lib/validation/devices";
import type { FloorDto } from "@/lib/validation/floors";
import { MarkerShape } from "./device-marker";

type Point = { x: number; y: number };

type Props = {
  siteId: string;
  floor: FloorDto & { plan: NonNullable<FloorDto["plan"]> };
  devices: DeviceDto[];
  canEdit: boolean;
  selectedId: string | null;
  onSelect: (id: string | null) => void;
  /** Called with metres when a device is dropped, nudged or placed. */
  onMove: (device: DeviceDto, at: Point) => void;
  /** Click on the plan (image pixels) — for placing and for the scale tool. */
  onPlanClick: (px: Point) => void;
  levels?: Map<string, number | null>;
  scalePoints: Point[];
};

const STEP_M = 0.25;

export function PlanView({ siteId, floor, devices, canEdit, selectedId, onSelect, onMove, onPlanClick, levels, scalePoints }: Props) {
  const box = useRef<HTMLDivElement>(null);
  const [drag, setDrag] = useState<{ id: string; at: Point } | null>(null);
  const ppm = floor.pixelsPerMetre;
  const { width, height } = floor.plan;

  const toImagePx = (clientX: number, clientY: number): Point => {
    const rect = box.current!.getBoundingClientRect();
    return { x: Math.min(width, Math.max(0, ((clientX - rect.left) / rect.width) * width)), y: Math.min(height, Math.max(0, ((clientY - rect.top) / rect.height) * height)) };
  };
  const pct = (p: Point) => ({ left: `${(p.x / width) * 100}%`, top: `${(p.y / height) * 100}%` });

  return (
    <div
      ref={box}
      className="relative w-full select-none rounded-xl border border-line bg-paper"
      style={{ aspectRatio: `${width} / ${height}` }}
      onClick={(e) => {
        if (e.target === e.currentTarget || (e.target as HTMLElement).tagName === "IMG") onPlanClick(toImagePx(e.clientX, e.clientY));
      }}
    >
      {/* eslint-disable-next-line @next/next/no-img-element -- a member-only API image at its own size, not a static asset */}
      <img src={`/api/sites/${siteId}/floors/${floor.id}/plan?v=${floor.plan.id}`} alt={`Floor plan: ${floor.name}`} className="absolute inset-0 h-full w-full rounded-xl" draggable={false} />
      {scalePoints.map((p, i) => (
        <span key={i} aria-hidden="true" className="absolute -ml-2 -mt-2 h-4 w-4 rounded-full border-2 border-clay bg-paper" style={pct(p)} />
      ))}
      {ppm
        ? devices.map((d) => {
            const at = drag?.id === d.id ? drag.at : { x: d.x! * ppm, y: d.y! * ppm };
            const isSelected = selectedId === d.id;
            return (
              <button
                key={d.id}
                type="button"
                aria-label={`${d.name}, at ${d.x?.toFixed(2)} m, ${d.y?.toFixed(2)} m${canEdit ? "; arrow keys move it" : ""}`}
                aria-pressed={isSelected}
                className={`absolute -ml-2.5 -mt-2.5 flex touch-none flex-col items-center ${canEdit ? "cursor-grab" : ""} ${isSelected ? "z-10 rounded outline outline-2 outline-offset-2 outline-ink" : ""}`}
                style={pct(at)}
                onClick={() => onSelect(isSelected ? null : d.id)}
                onPointerDown={(e) => {
                  if (!canEdit) return;
                  e.currentTarget.setPointerCapture(e.pointerId);
                  setDrag({ id: d.id, at });
                }}
                onPointerMove={(e) => {
                  if (drag?.id === d.id) setDrag({ id: d.id, at: toImagePx(e.clientX, e.clientY) });
                }}
                onPointerUp={() => {
                  if (drag?.id !== d.id) return;
                  const moved = Math.hypot(drag.at.x - d.x! * ppm, drag.at.y - d.y! * ppm) > 2;
                  setDrag(null);
                  if (moved) onMove(d, { x: drag.at.x / ppm, y: drag.at.y / ppm });
                }}
                onKeyDown={(e) => {
                  if (!canEdit) return;
                  const step = e.shiftKey ? 1 : STEP_M;
                  const delta = { ArrowLeft: [-step, 0], ArrowRight: [step, 0], ArrowUp: [0, -step], ArrowDown: [0, step] }[e.key];
                  if (!delta) return;
                  e.preventDefault();
                  onMove(d, { x: Math.max(0, d.x! + delta[0]), y: Math.max(0, d.y! + delta[1]) });
                }}
              >
                <MarkerShape device={d} level={levels?.get(d.id)} />
                <span className={`mt-0.5 max-w-28 truncate rounded bg-paper/90 px-1 text-[10px] leading-tight ${isSelected ? "font-bold" : ""}`}>{d.name}</span>
              </button>
            );
          })
        : null}
    </div>
  );
}
