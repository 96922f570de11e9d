import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { distanceM, metreToPixel, pixelToMetre, scaleFromTwoPoints } from "@/lib/inventory/scale";

describe("floor-plan scale", () => {
  it("is the pixel distance over the real distance (3-4-5 triangle)", () => {
    // Common practice, no source: Euclidean distance; 300 px by 400 px apart = 500 px.
    expect(scaleFromTwoPoints({ x: 100, y: 100 }, { x: 400, y: 500 }, 10)).toEqual({ ok: true, pixelsPerMetre: 50 });
  });

  it("does not depend on the order of the points", () => {
    const a = { x: 12, y: 840 };
    const b = { x: 960, y: 33 };
    expect(scaleFromTwoPoints(a, b, 7.5)).toEqual(scaleFromTwoPoints(b, a, 7.5));
  });

  it("refuses identical points, a zero or negative distance, and points off the plan", () => {
    expect(scaleFromTwoPoints({ x: 5, y: 5 }, { x: 5, y: 5 }, 3)).toMatchObject({ ok: false, field: "points" });
    expect(scaleFromTwoPoints({ x: 0, y: 0 }, { x: 5, y: 5 }, 0)).toMatchObject({ ok: false, field: "distanceM" });
    expect(scaleFromTwoPoints({ x: 0, y: 0 }, { x: 5, y: 5 }, -2)).toMatchObject({ ok: false, field: "distanceM" });
    expect(scaleFromTwoPoints({ x: 0, y: Number.NaN }, { x: 5, y: 5 }, 2)).toMatchObject({ ok: false, field: "points" });
  });

  it("converts pixels to metres and back", () => {
    expect(pixelToMetre({ x: 250, y: 125 }, 50)).toEqual({ x: 5, y: 2.5 });
    expect(metreToPixel({ x: 5, y: 2.5 }, 50)).toEqual({ x: 250, y: 125 });
    expect(() => pixelToMetre({ x: 1, y: 1 }, 0)).toThrow(RangeError);
  });

  it("a distance measured on the plan after scaling equals the distance typed in (property)", () => {
    const coordinate = fc.double({ min: 0, max: 10_000, noNaN: true });
    fc.assert(
      fc.property(coordinate, coordinate, coordinate, coordinate, fc.double({ min: 0.01, max: 500, noNaN: true }), (ax, ay, bx, by, metres) => {
        fc.pre(Math.hypot(bx - ax, by - ay) > 1e-3);
        const scale = scaleFromTwoPoints({ x: ax, y: ay }, { x: bx, y: by }, metres);
        if (!scale.ok) throw new Error(scale.message);
        const measured = distanceM(pixelToMetre({ x: ax, y: ay }, scale.pixelsPerMetre), pixelToMetre({ x: bx, y: by }, scale.pixelsPerMetre));
        expect(measured).toBeCloseTo(metres, 6);
        const back = metreToPixel(pixelToMetre({ x: ax, y: ay }, scale.pixelsPerMetre), scale.pixelsPerMetre);
        expect(back.x).toBeCloseTo(ax, 6);
        expect(back.y).toBeCloseTo(ay, 6);
      }),
    );
  });
});
