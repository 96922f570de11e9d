/**
 * The DALI logarithmic dimming curve (IEC 62386-102, clause M): arc power level
 * n = 1…254 maps to X(n) = 10^((n − 1)/(253/3) − 1) % of full light output, so
 * level 1 is 0.1 % and 254 is 100 %; 0 means off. 255 ("MASK") is not a level:
 * on the bus it means "no change", so it is refused here rather than mapped.
 */
export const DALI_OFF = 0;
export const DALI_MIN_ARC = 1;
export const DALI_MAX_ARC = 254;
export const DALI_SOURCE = "IEC 62386-102 clause M";

// 253/3 kept as a real division: written 253 / 3 in a language with integer
// division it becomes 84 and every level above 1 comes out wrong.
const ARC_STEPS_PER_DECADE = 253 / 3;

/** Light output in percent for an arc power level 0…254. */
export function daliArcToPercent(arc: number): number {
  if (!Number.isInteger(arc) || arc < DALI_OFF || arc > DALI_MAX_ARC) {
    throw new RangeError(`DALI arc level must be an integer 0–254, got ${arc}`);
  }
  if (arc === DALI_OFF) return 0;
  return 10 ** ((arc - 1) / ARC_STEPS_PER_DECADE - 1);
}

/**
 * The arc level whose light output is nearest to `percent` (nearest in percent,
 * not in log space, so a request is never off by more than half a step of what
 * people see measured). 0 % is off; any light at all asks for at least level 1,
 * because rounding a small non-zero request down to 0 would switch the lamp off.
 */
export function percentToDaliArc(percent: number): number {
  if (!Number.isFinite(percent) || percent < 0 || percent > 100) {
    throw new RangeError(`level must be 0–100 %, got ${percent}`);
  }
  if (percent === 0) return DALI_OFF;
  const exact = 1 + ARC_STEPS_PER_DECADE * (Math.log10(percent) + 1);
  if (exact <= DALI_MIN_ARC) return DALI_MIN_ARC;
  if (exact >= DALI_MAX_ARC) return DALI_MAX_ARC;
  const below = Math.floor(exact);
  const above = below + 1;
  const isBelowNearer = percent - daliArcToPercent(below) <= daliArcToPercent(above) - percent;
  return isBelowNearer ? below : above;
}
