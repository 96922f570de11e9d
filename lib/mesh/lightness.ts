/**
 * Light levels. The console speaks in percent; the mesh carries Light Lightness
 * Actual (0–65535, perceptual) and Linear (0–65535, proportional to light output).
 * Percent maps linearly onto Actual: that is how a dimmer slider is read, and it
 * keeps 0 % = off and 100 % = 65535 exact.
 */
export const LIGHTNESS_MAX = 0xffff;

/** 0–100 % → Light Lightness Actual, rounded to the nearest integer (clamped to 0–100 % first). */
export function levelToActual(percent: number): number {
  if (!Number.isFinite(percent)) throw new RangeError(`level must be a number, got ${percent}`);
  const clamped = Math.min(100, Math.max(0, percent));
  return Math.round((clamped * LIGHTNESS_MAX) / 100);
}

/** Light Lightness Actual → percent, unrounded (callers format for display). */
export function actualToLevel(actual: number): number {
  assertLightness(actual);
  return (actual * 100) / LIGHTNESS_MAX;
}

/**
 * Actual → Linear: Linear = ⌈65535·(Actual/65535)²⌉ (Mesh Model 1.0.1 §6.1.2.2.1).
 * Done in integers (Actual² < 2^53) so the ceiling never suffers a float error.
 */
export function actualToLinear(actual: number): number {
  assertLightness(actual);
  const square = actual * actual;
  const quotient = Math.floor(square / LIGHTNESS_MAX);
  return quotient * LIGHTNESS_MAX < square ? quotient + 1 : quotient;
}

/**
 * Linear → Actual: Actual = 65535·√(Linear/65535) (Mesh Model 1.0.1 §6.1.2.2.1).
 * The spec leaves rounding open; we round to nearest (halves up), computed as
 * √(Linear·65535) so there is one rounding step. Consequences, checked over all
 * 65536 values in tests: Linear → Actual → Linear comes back equal or one higher
 * (the ceiling above), never lower; Actual → Linear → Actual cannot be exact at
 * the dim end, where many Actual values share one Linear value.
 */
export function linearToActual(linear: number): number {
  assertLightness(linear);
  return Math.round(Math.sqrt(linear * LIGHTNESS_MAX));
}

function assertLightness(value: number) {
  if (!Number.isInteger(value) || value < 0 || value > LIGHTNESS_MAX) throw new RangeError(`lightness must be an integer 0–65535, got ${value}`);
}
