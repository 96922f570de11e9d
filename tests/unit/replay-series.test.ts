import { describe, expect, it } from "vitest";
import { onlyIn } from "@/lib/replay/outcome";
import { createStepSeries } from "@/lib/replay/series";

describe("step series downsampling", () => {
  it("keeps every change while there are few", () => {
    const s = createStepSeries(0, 1000, 10);
    s.add(0, 0);
    s.add(150, 100);
    s.add(150, 100);
    s.add(420, 0);
    expect(s.points()).toEqual([
      [0, 0],
      [150, 100],
      [420, 0],
      [1000, 0],
    ]);
  });

  it("bounds a long series to four points per bucket, and a short spike still shows", () => {
    const s = createStepSeries(0, 1_000_000, 100);
    for (let t = 0; t < 1_000_000; t += 10) {
      s.add(t, (t / 10) % 2 === 0 ? 20 : 40);
      if (t === 500_000) s.add(500_001, 100);
    }
    const points = s.points();
    expect(points.length).toBeLessThanOrEqual(4 * 100 + 1);
    expect(points.some(([, v]) => v === 100)).toBe(true);
    for (let i = 1; i < points.length; i++) expect(points[i][0]).toBeGreaterThanOrEqual(points[i - 1][0]);
  });
});

describe("multiset difference", () => {
  it("counts repeats", () => {
    expect(onlyIn(["a", "a", "b"], ["a", "c"])).toEqual(["a", "b"]);
    expect(onlyIn(["a"], ["a"])).toEqual([]);
  });
});
