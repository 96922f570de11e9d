/** Energy with a unit that suits its size: J, mJ or µJ (units are always shown). */
export function formatJoules(j: number): string {
  const a = Math.abs(j);
  if (a >= 1) return `${sig(j)} J`;
  if (a >= 1e-3) return `${sig(j * 1e3)} mJ`;
  return `${sig(j * 1e6)} µJ`;
}

export function sig(x: number, digits = 3): string {
  if (!Number.isFinite(x)) return "∞";
  if (x === 0) return "0";
  const v = Number(x.toPrecision(digits));
  return Math.abs(v) >= 1e5 ? v.toExponential(2) : v.toLocaleString("en-GB", { maximumFractionDigits: 6 });
}

export function formatMargin(margin: number | null): string {
  if (margin === null || !Number.isFinite(margin)) return "∞";
  return `${margin >= 0 ? "+" : "−"}${sig(Math.abs(margin * 100), 3)} %`;
}

export function formatHours(h: number | null): string {
  if (h === null) return "—";
  if (h >= 48) return `${sig(h / 24)} days`;
  return `${sig(h)} h`;
}

export function formatInterval(s: number | null): string {
  if (s === null) return "none";
  if (s >= 120) return `${sig(s / 60)} min`;
  return `${sig(s)} s`;
}

/** "Mon 14:00" in the site's time zone. */
export function hourLabel(ms: number, timeZone: string): string {
  return new Intl.DateTimeFormat("en-GB", { timeZone, weekday: "short", hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(ms);
}
