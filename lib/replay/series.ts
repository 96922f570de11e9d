/**
 * Level and relay series for a chart, bounded whatever the window holds: the
 * window is cut into buckets and each bucket keeps at most its first, lowest,
 * highest and last point (min/max downsampling), so a step that lasted one
 * minute in a year still shows, and memory does not grow with the log.
 */
export type Point = [at: number, value: number];

export const SERIES_BUCKETS = 300;

export function createStepSeries(from: number, to: number, buckets = SERIES_BUCKETS) {
  const span = Math.max(1, to - from);
  type Bucket = { index: number; first: Point; min: Point; max: Point; last: Point };
  const kept: Bucket[] = [];
  let lastValue: number | null = null;

  return {
    /** Records the value from `at` on; a repeat of the current value is ignored. */
    add(at: number, value: number) {
      if (value === lastValue) return;
      lastValue = value;
      const index = Math.min(buckets - 1, Math.max(0, Math.floor(((at - from) / span) * buckets)));
      const point: Point = [at, value];
      const b = kept[kept.length - 1];
      if (!b || b.index !== index) {
        kept.push({ index, first: point, min: point, max: point, last: point });
        return;
      }
      if (value < b.min[1]) b.min = point;
      if (value > b.max[1]) b.max = point;
      b.last = point;
    },
    get value() {
      return lastValue;
    },
    /** The points in time order, ending with the last value held to `to`. */
    points(): Point[] {
      const out: Point[] = [];
      for (const b of kept) {
        const four = [b.first, b.min, b.max, b.last].sort((x, y) => x[0] - y[0]);
        for (const p of four) if (out[out.length - 1] !== p) out.push(p);
      }
      if (lastValue !== null && (out.length === 0 || out[out.length - 1][0] < to)) out.push([to, lastValue]);
      return out;
    },
  };
}

export type StepSeries = ReturnType<typeof createStepSeries>;
