"use client";

import { Area, CartesianGrid, ComposedChart, Line, ReferenceArea, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatJoules, hourLabel, sig } from "./format";

/** Contiguous runs of hour indices: [3,4,5,9] → [[3,5],[9,9]]. */
export function hourRuns(hours: number[]): [number, number][] {
  const runs: [number, number][] = [];
  for (const h of hours) {
    const last = runs[runs.length - 1];
    if (last && h === last[1] + 1) last[1] = h;
    else runs.push([h, h]);
  }
  return runs;
}

type Props = { storedJ: number[]; lux: number[]; brownoutHours: number[]; usableJ: number; hourStarts: number[]; timeZone: string };

/** Stored energy over the week (amber area), the light at the device (slate line) and brown-out hours (clay bands). */
export function StoreChart({ storedJ, lux, brownoutHours, usableJ, hourStarts, timeZone }: Props) {
  const data = storedJ.map((stored, h) => ({ h, stored, lux: lux[h] }));
  const runs = hourRuns(brownoutHours);
  const summary =
    runs.length === 0
      ? "It never browns out in this week."
      : `It browns out in ${brownoutHours.length} of the week's 168 hours: ${runs
          .slice(0, 6)
          .map(([a, b]) => `${hourLabel(hourStarts[a], timeZone)}–${hourLabel(hourStarts[b] + 3_600_000, timeZone)}`)
          .join("; ")}${runs.length > 6 ? " …" : ""}.`;
  return (
    <figure className="rounded-xl border border-line bg-paper p-3">
      <figcaption className="mb-2 text-sm">
        <span className="font-bold">Stored energy over the week, hour by hour</span> (usable store {formatJoules(usableJ)}). {summary}
      </figcaption>
      <div role="img" aria-label={`Chart of stored energy over the week. ${summary}`} className="h-64 w-full">
        <ResponsiveContainer width="100%" height="100%">
          <ComposedChart data={data} margin={{ top: 8, right: 8, bottom: 0, left: 0 }}>
            <CartesianGrid stroke="#d8ddd6" strokeDasharray="3 3" />
            <XAxis dataKey="h" type="number" domain={[0, 167]} ticks={[0, 24, 48, 72, 96, 120, 144]} tickFormatter={(h: number) => hourLabel(hourStarts[h], timeZone).slice(0, 3)} tick={{ fontSize: 12 }} />
            <YAxis yAxisId="j" tickFormatter={(v: number) => `${sig(v, 2)} J`} width={56} tick={{ fontSize: 12 }} domain={[0, usableJ]} />
            <YAxis yAxisId="lx" orientation="right" tickFormatter={(v: number) => `${sig(v, 2)} lx`} width={60} tick={{ fontSize: 12 }} />
            {runs.map(([a, b]) => (
              <ReferenceArea key={a} yAxisId="j" x1={a} x2={b + 1} fill="#b8553a" fillOpacity={0.25} stroke="#b8553a" strokeOpacity={0.5} ifOverflow="extendDomain" />
            ))}
            <ReferenceLine yAxisId="j" y={usableJ} stroke="#5b6b7a" strokeDasharray="4 4" />
            <Area yAxisId="j" type="stepAfter" dataKey="stored" name="Stored energy" stroke="#d99a1e" fill="#d99a1e" fillOpacity={0.3} isAnimationActive={false} />
            <Line yAxisId="lx" type="stepAfter" dataKey="lux" name="Illuminance at the device" stroke="#5b6b7a" dot={false} strokeWidth={1} isAnimationActive={false} />
            <Tooltip
              labelFormatter={(h) => hourLabel(hourStarts[Number(h)], timeZone)}
              formatter={(v, name) => (name === "Stored energy" ? formatJoules(Number(v)) : `${sig(Number(v))} lx`)}
            />
          </ComposedChart>
        </ResponsiveContainer>
      </div>
      <p className="mt-2 flex flex-wrap gap-4 text-xs text-slate">
        <span><span aria-hidden="true" className="mr-1 inline-block h-2.5 w-4 bg-harvest/60 align-middle" />Stored energy (J, left)</span>
        <span><span aria-hidden="true" className="mr-1 inline-block h-0.5 w-4 bg-slate align-middle" />Illuminance at the device (lx, right)</span>
        <span><span aria-hidden="true" className="mr-1 inline-block h-2.5 w-4 bg-clay/40 align-middle" />Brown-out hours</span>
        <span><span aria-hidden="true" className="mr-1 inline-block w-4 border-t border-dashed border-slate align-middle" />Full store</span>
      </p>
    </figure>
  );
}
