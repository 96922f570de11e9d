"use client";

import { CartesianGrid, Legend, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { formatSiteTime } from "@/lib/eventlog/local-input";
import type { SeriesLine } from "@/lib/replay/types";

/** Distinct by dash as well as colour, so lines are told apart without colour. */
const STYLES = [
  { stroke: "#1d2833", dash: undefined },
  { stroke: "#d99a1e", dash: "6 3" },
  { stroke: "#4e7d4a", dash: "2 2" },
  { stroke: "#b8553a", dash: "8 2 2 2" },
  { stroke: "#5b6b7a", dash: "4 4" },
  { stroke: "#7a4e8c", dash: "1 3" },
  { stroke: "#2f6f8f", dash: "10 4" },
  { stroke: "#8c6a2f", dash: "3 6" },
];

/** Series of step values → rows for recharts, each series carried forward to every time. */
function rowsOf(lines: SeriesLine[]) {
  const times = [...new Set(lines.flatMap((l) => l.points.map((p) => p[0])))].sort((a, b) => a - b);
  const cursor = lines.map(() => 0);
  const last: (number | null)[] = lines.map(() => null);
  return times.map((t) => {
    const row: Record<string, number | null> = { t };
    lines.forEach((l, i) => {
      while (cursor[i] < l.points.length && l.points[cursor[i]][0] <= t) last[i] = l.points[cursor[i]++][1];
      row[l.id] = last[i];
    });
    return row;
  });
}

export function LevelChart({ title, lines, unit, timeZone, window, onPick, height = 240 }: { title: string; lines: SeriesLine[]; unit: "%" | "on/off"; timeZone: string; window: { from: number; to: number }; onPick?: (at: number) => void; height?: number }) {
  if (!lines.length) return null;
  const data = rowsOf(lines);
  return (
    <figure className="rounded-xl border border-line bg-paper p-3">
      <figcaption className="mb-1 text-sm font-bold">{title}</figcaption>
      <div style={{ height }} role="img" aria-label={`${title}: ${lines.map((l) => l.name).join(", ")} over the window. Choose a time to see the nearest timeline step.`}>
        <ResponsiveContainer width="100%" height="100%">
          <LineChart
            data={data}
            margin={{ top: 4, right: 12, bottom: 4, left: 0 }}
            onClick={(state) => {
              const label = (state as { activeLabel?: number | string } | null)?.activeLabel;
              if (onPick && label !== undefined) onPick(Number(label));
            }}
          >
            <CartesianGrid stroke="#d8ddd6" strokeDasharray="3 3" />
            <XAxis dataKey="t" type="number" domain={[window.from, window.to]} scale="time" tickFormatter={(t: number) => formatSiteTime(t, timeZone, false).split(" ").slice(-1)[0]} fontSize={11} />
            <YAxis domain={unit === "%" ? [0, 100] : [0, 1]} ticks={unit === "%" ? [0, 25, 50, 75, 100] : [0, 1]} tickFormatter={(v: number) => (unit === "%" ? `${v} %` : v ? "on" : "off")} fontSize={11} width={44} />
            <Tooltip labelFormatter={(t) => formatSiteTime(Number(t), timeZone)} formatter={(v, name) => [unit === "%" ? `${v} %` : v ? "on" : "off", lines.find((l) => l.id === name)?.name ?? String(name)]} />
            <Legend formatter={(id: string) => lines.find((l) => l.id === id)?.name ?? id} wrapperStyle={{ fontSize: 12 }} />
            {lines.map((l, i) => (
              <Line key={l.id} dataKey={l.id} type="stepAfter" dot={false} isAnimationActive={false} stroke={STYLES[i % STYLES.length].stroke} strokeDasharray={STYLES[i % STYLES.length].dash} strokeWidth={2} connectNulls />
            ))}
          </LineChart>
        </ResponsiveContainer>
      </div>
    </figure>
  );
}
