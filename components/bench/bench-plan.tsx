"use client";

import { useId, useState } from "react";
import { PlanView } from "@/components/plan/plan-view";
import { isLuminaire } from "@/lib/catalogue/device-kinds";
import type { BenchView } from "@/lib/validation/bench";
import type { DeviceDto } from "@/lib/validation/devices";

/** The floor plan with each luminaire glowing at its bench level; choosing a control device jumps to its control. */
export function BenchPlan({ view, levels, onPick }: { view: BenchView; levels: Record<string, number>; onPick: (deviceId: string) => void }) {
  const selectId = useId();
  const withPlan = view.floors.filter((f) => f.plan && f.pixelsPerMetre);
  const [floorId, setFloorId] = useState<string | null>(null);
  const floor = withPlan.find((f) => f.id === floorId) ?? withPlan[0];
  if (!floor?.plan) return null;
  // PlanView draws inventory devices; the bench knows the fields it reads.
  const placed: DeviceDto[] = view.devices
    .filter((d) => d.floorId === floor.id && d.x !== null && d.y !== null)
    .map((d) => ({ ...d, siteId: view.site.id, elementCount: 1, profile: {}, createdAt: "" }));
  const shown = new Map<string, number | null>(placed.filter((d) => isLuminaire(d.kind)).map((d) => [d.id, levels[d.id] ?? 0]));
  return (
    <section aria-labelledby={`${selectId}-title`} className="space-y-2">
      <div className="flex flex-wrap items-end gap-3">
        <h2 id={`${selectId}-title`} className="mr-auto font-bold">Floor plan</h2>
        {withPlan.length > 1 ? (
          <div className="flex flex-col">
            <label htmlFor={selectId} className="text-xs text-slate">Floor</label>
            <select id={selectId} value={floor.id} onChange={(e) => setFloorId(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-1 text-sm">
              {withPlan.map((f) => <option key={f.id} value={f.id}>{f.name}</option>)}
            </select>
          </div>
        ) : null}
      </div>
      {/* Marker labels near the edge would widen the page on a phone. */}
      <div className="overflow-hidden rounded-xl">
        <PlanView
          siteId={view.site.id}
          floor={{ ...floor, plan: floor.plan }}
          devices={placed}
          canEdit={false}
          selectedId={null}
          onSelect={(id) => {
            if (id) onPick(id);
          }}
          onMove={() => undefined}
          onPlanClick={() => undefined}
          levels={shown}
          scalePoints={[]}
        />
      </div>
      <p className="text-xs text-slate">▲ switch · ● sensor · ■ luminaire, driver or relay · ◆ fire-alarm input · glow = level on the bench. Select a switch or sensor to jump to its control.</p>
    </section>
  );
}
