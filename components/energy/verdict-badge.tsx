import type { Verdict } from "@/lib/energy/types";

const STYLES: Record<Verdict, { label: string; mark: string; className: string }> = {
  covered: { label: "Covered", mark: "✓", className: "border-moss/50 bg-moss/10 text-moss" },
  tight: { label: "Tight", mark: "≈", className: "border-harvest/60 bg-harvest/15 text-ink" },
  short: { label: "Short", mark: "✕", className: "border-clay/50 bg-clay/10 text-clay" },
};

export const VERDICT_LABEL: Record<Verdict, string> = { covered: "Covered", tight: "Tight", short: "Short" };

/** The verdict as a word and a mark, so it never rests on colour alone. */
export function VerdictBadge({ verdict }: { verdict: Verdict }) {
  const s = STYLES[verdict];
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-bold ${s.className}`}>
      <span aria-hidden="true">{s.mark}</span>
      {s.label}
    </span>
  );
}
