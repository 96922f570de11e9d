/**
 * 0–10 V dimming (IEC 60929 Annex E, carried on as IEC 63128): the driver
 * sources a small current and the controller sinks it; ≥ 10 V asks for maximum,
 * ≤ 1 V for the driver's minimum — never off. Off is done by a relay breaking
 * the driver's supply, so a 0 % request becomes "relay open" with the control
 * line parked at 1 V, ready for the next switch-on at minimum.
 */
export const ZERO_TEN_SOURCE = "IEC 60929 Annex E / IEC 63128";
export const ZERO_TEN_MIN_V = 1;
export const ZERO_TEN_MAX_V = 10;
/** The most control current one driver may source into the control line. */
export const ZERO_TEN_MAX_CURRENT_PER_DRIVER_MA = 2;

/**
 * The curve between 1 V and 10 V is driver-specific (the standard does not fix
 * it), so we use a convention: straight line from (min level, 1 V) to (100 %, 10 V).
 * Shown to users as a convention, not as the driver's real response.
 */
export const ZERO_TEN_CURVE_NOTE = "Linear from 1 V at the driver's minimum to 10 V at 100 % — a convention; the real curve is driver-specific.";

export type ZeroTenSetting =
  | { relay: "open"; volts: typeof ZERO_TEN_MIN_V; label: "off (relay)"; note: string }
  | { relay: "closed"; volts: number; label: string; isAtMinimum: boolean };

/**
 * Control voltage for a level in percent. `minLevelPct` is the driver's minimum
 * light output (what it gives at 1 V); requests between 0 and that minimum are
 * held at 1 V and flagged, because the driver cannot go lower without switching off.
 */
export function levelToZeroTen(levelPct: number, minLevelPct = 0): ZeroTenSetting {
  if (!Number.isFinite(levelPct) || levelPct < 0 || levelPct > 100) throw new RangeError(`level must be 0–100 %, got ${levelPct}`);
  if (!Number.isFinite(minLevelPct) || minLevelPct < 0 || minLevelPct >= 100) throw new RangeError(`minimum level must be 0–<100 %, got ${minLevelPct}`);
  if (levelPct === 0) {
    return { relay: "open", volts: ZERO_TEN_MIN_V, label: "off (relay)", note: "0–10 V cannot switch a driver off: the relay opens and the control line stays at 1 V (minimum)." };
  }
  const fraction = Math.max(0, (levelPct - minLevelPct) / (100 - minLevelPct));
  const volts = ZERO_TEN_MIN_V + fraction * (ZERO_TEN_MAX_V - ZERO_TEN_MIN_V);
  return { relay: "closed", volts, label: `${volts.toFixed(2)} V`, isAtMinimum: levelPct <= minLevelPct };
}

/** The level a control voltage asks for under the same linear convention; ≤ 1 V is the minimum, ≥ 10 V is 100 %. */
export function zeroTenToLevel(volts: number, minLevelPct = 0): number {
  if (!Number.isFinite(volts) || volts < 0) throw new RangeError(`control voltage must be ≥ 0 V, got ${volts}`);
  const clamped = Math.min(ZERO_TEN_MAX_V, Math.max(ZERO_TEN_MIN_V, volts));
  return minLevelPct + ((clamped - ZERO_TEN_MIN_V) / (ZERO_TEN_MAX_V - ZERO_TEN_MIN_V)) * (100 - minLevelPct);
}

/**
 * How many drivers one control output can sink, given its sink capacity in mA,
 * with each driver allowed to source up to 2 mA. Rounded down: the last driver
 * must fit entirely or the line is pulled above the level asked for.
 */
export function maxDriversOnControl(sinkCapacityMa: number): number {
  if (!Number.isFinite(sinkCapacityMa) || sinkCapacityMa < 0) throw new RangeError(`sink capacity must be ≥ 0 mA, got ${sinkCapacityMa}`);
  // The small epsilon keeps 0.6 / 0.2-style float quotients from losing a whole driver.
  return Math.floor(sinkCapacityMa / ZERO_TEN_MAX_CURRENT_PER_DRIVER_MA + 1e-9);
}
