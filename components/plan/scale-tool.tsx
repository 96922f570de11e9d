"use client";

import { useId, useState } from "react";

type Point = { x: number; y: number };

/** Two clicks on the plan, then the real distance between them. */
export function ScaleTool({ points, onSave, onCancel }: { points: Point[]; onSave: (metres: number) => Promise<void>; onCancel: () => void }) {
  const id = useId();
  const [metres, setMetres] = useState("");
  const [error, setError] = useState<string | null>(null);
  const pixels = points.length === 2 ? Math.hypot(points[0].x - points[1].x, points[0].y - points[1].y) : null;
  return (
    <div className="rounded-lg border border-clay/50 bg-clay/5 p-3 text-sm" role="region" aria-label="Set the plan's scale">
      <p className="font-semibold">{points.length < 2 ? `Click point ${points.length + 1} of 2 on the plan — the two ends of a length you know (a wall, a door).` : `The two points are ${pixels!.toFixed(0)} px apart.`}</p>
      {points.length === 2 ? (
        <form
          className="mt-2 flex flex-wrap items-end gap-2"
          onSubmit={async (e) => {
            e.preventDefault();
            const m = Number(metres);
            if (!Number.isFinite(m) || m <= 0) return setError("Enter the distance in metres, more than 0");
            try {
              setError(null);
              await onSave(m);
            } catch (err) {
              setError(err instanceof Error ? err.message : String(err));
            }
          }}
        >
          <div className="flex flex-col">
            <label htmlFor={id} className="font-semibold">Distance (m)</label>
            <input id={id} inputMode="decimal" value={metres} onChange={(e) => setMetres(e.target.value)} className="w-28 rounded-md border border-line bg-paper px-2 py-1" aria-invalid={error ? true : undefined} />
          </div>
          <button type="submit" className="rounded-md bg-ink px-3 py-1.5 font-semibold text-fog">Save scale</button>
        </form>
      ) : null}
      {error ? <p role="alert" className="mt-1 font-semibold text-clay">{error}</p> : null}
      <button type="button" onClick={onCancel} className="mt-2 font-semibold text-slate underline">Cancel</button>
    </div>
  );
}
