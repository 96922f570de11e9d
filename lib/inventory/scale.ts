/**
 * Floor-plan scale: the integrator clicks two points on the plan image and types
 * the real distance between them. Positions are then kept in metres, so a plan
 * replaced by a sharper scan of the same drawing keeps every device in place.
 * Both systems have their origin at the image's top-left corner with y down,
 * as images are addressed, so no flip is needed between them.
 */
export type PlanPoint = { x: number; y: number };

export type ScaleResult = { ok: true; pixelsPerMetre: number } | { ok: false; field: "points" | "distanceM"; message: string };

/** Pixels per metre from two points in image pixels and the real distance between them in metres. */
export function scaleFromTwoPoints(a: PlanPoint, b: PlanPoint, distanceM: number): ScaleResult {
  if (![a.x, a.y, b.x, b.y].every(Number.isFinite)) return { ok: false, field: "points", message: "Both points must be on the plan." };
  if (!Number.isFinite(distanceM) || distanceM <= 0) return { ok: false, field: "distanceM", message: "The distance must be more than 0 m." };
  const pixels = Math.hypot(b.x - a.x, b.y - a.y);
  if (pixels === 0) return { ok: false, field: "points", message: "The two points are the same; pick two points apart, the further the better." };
  return { ok: true, pixelsPerMetre: pixels / distanceM };
}

export function pixelToMetre(point: PlanPoint, pixelsPerMetre: number): PlanPoint {
  checkScale(pixelsPerMetre);
  return { x: point.x / pixelsPerMetre, y: point.y / pixelsPerMetre };
}

export function metreToPixel(point: PlanPoint, pixelsPerMetre: number): PlanPoint {
  checkScale(pixelsPerMetre);
  return { x: point.x * pixelsPerMetre, y: point.y * pixelsPerMetre };
}

/** Distance between two positions in metres, as a device-to-device spacing check would want it. */
export function distanceM(a: PlanPoint, b: PlanPoint): number {
  return Math.hypot(b.x - a.x, b.y - a.y);
}

function checkScale(pixelsPerMetre: number): void {
  if (!Number.isFinite(pixelsPerMetre) || pixelsPerMetre <= 0) throw new RangeError(`scale must be > 0 px/m, got ${pixelsPerMetre}`);
}
