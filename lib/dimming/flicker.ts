/**
 * Flicker metrics for a luminaire's light output, and the risk bands people use
 * to judge them. Percent flicker and flicker index are the IES metrics; the
 * IEEE 1789 bands were written down from memory and are labelled so wherever
 * they are shown, so nobody mistakes them for a checked citation.
 */
export const IEEE_1789_SOURCE = "IEEE 1789-2015 (from memory, not verified)";

/** 100·(Lmax − Lmin)/(Lmax + Lmin). IEEE 1789 calls the same quantity "Mod%". */
export function percentFlicker(samples: readonly number[]): number {
  const [min, max] = range(samples);
  // No light at all does not flicker; avoid 0/0.
  return max + min === 0 ? 0 : (100 * (max - min)) / (max + min);
}

/**
 * Area above the mean divided by the total area. `samples` must be equally
 * spaced and cover whole periods, otherwise the mean is biased.
 */
export function flickerIndex(samples: readonly number[]): number {
  range(samples);
  const total = samples.reduce((sum, s) => sum + s, 0);
  if (total === 0) return 0;
  const mean = total / samples.length;
  const aboveMean = samples.reduce((sum, s) => sum + Math.max(0, s - mean), 0);
  return aboveMean / total;
}

export type Pwm = {
  frequencyHz: number;
  /** Fraction of each period at the high level, 0…1. */
  duty: number;
  /** Mod% = 100·(high − low)/(high + low); 100 for a PWM that goes fully dark. */
  modulationDepthPct: number;
};

/**
 * Percent flicker and flicker index of a rectangular PWM waveform, in closed
 * form: with high = 1 + m and low = 1 − m, FI = 2·m·D·(1 − D) / (1 + m·(2D − 1)).
 */
export function pwmFlicker(pwm: Pwm): { percentFlicker: number; flickerIndex: number } {
  checkPwm(pwm);
  const m = pwm.modulationDepthPct / 100;
  const d = pwm.duty;
  const mean = 1 + m * (2 * d - 1);
  return { percentFlicker: pwm.modulationDepthPct, flickerIndex: mean === 0 ? 0 : (2 * m * d * (1 - d)) / mean };
}

export type FlickerRisk = "no-observable-effect" | "low-risk" | "above-low-risk";

export type Ieee1789Assessment = {
  /** Highest Mod% counted as low risk at this frequency; null = no limit. */
  lowRiskLimitPct: number | null;
  /** Highest Mod% with no observable effect at this frequency; null = no limit. */
  noEffectLimitPct: number | null;
  risk: FlickerRisk;
  source: typeof IEEE_1789_SOURCE;
};

/**
 * The IEEE 1789 recommended-practice bands: low risk Mod% ≤ 0.025·f below 90 Hz,
 * ≤ 0.08·f from 90 to 1250 Hz, unlimited above; no observable effect ≤ 0.01·f
 * below 90 Hz, ≤ 0.0333·f from 90 to 3000 Hz, unlimited above.
 */
export function ieee1789Risk(frequencyHz: number, modulationPct: number): Ieee1789Assessment {
  if (!Number.isFinite(frequencyHz) || frequencyHz <= 0) throw new RangeError(`frequency must be > 0 Hz, got ${frequencyHz}`);
  if (!Number.isFinite(modulationPct) || modulationPct < 0 || modulationPct > 100) throw new RangeError(`Mod% must be 0–100, got ${modulationPct}`);
  const lowRiskLimitPct = frequencyHz < 90 ? 0.025 * frequencyHz : frequencyHz <= 1250 ? 0.08 * frequencyHz : null;
  const noEffectLimitPct = frequencyHz < 90 ? 0.01 * frequencyHz : frequencyHz <= 3000 ? 0.0333 * frequencyHz : null;
  const within = (limit: number | null) => limit === null || modulationPct <= limit;
  const risk: FlickerRisk = within(noEffectLimitPct) ? "no-observable-effect" : within(lowRiskLimitPct) ? "low-risk" : "above-low-risk";
  return { lowRiskLimitPct, noEffectLimitPct, risk, source: IEEE_1789_SOURCE };
}

/**
 * Worst-case brightness deviation between camera frames, in percent, for an
 * on/off PWM: an exposure of tₑ holds f·tₑ periods plus a fraction, and that
 * fraction can add or miss at most one dark part, (1 − D)/f, of the exposure.
 * Derived here, not taken from a standard; capped at 100 % because below one
 * period per exposure the bound says nothing more.
 */
export function cameraBandingBoundPct(frequencyHz: number, duty: number, exposureS: number): number {
  checkPwm({ frequencyHz, duty, modulationDepthPct: 100 });
  if (!Number.isFinite(exposureS) || exposureS <= 0) throw new RangeError(`exposure must be > 0 s, got ${exposureS}`);
  return Math.min(100, (100 * (1 - duty)) / (frequencyHz * exposureS));
}

function checkPwm({ frequencyHz, duty, modulationDepthPct }: Pwm): void {
  if (!Number.isFinite(frequencyHz) || frequencyHz <= 0) throw new RangeError(`PWM frequency must be > 0 Hz, got ${frequencyHz}`);
  if (!Number.isFinite(duty) || duty < 0 || duty > 1) throw new RangeError(`duty must be 0–1, got ${duty}`);
  if (!Number.isFinite(modulationDepthPct) || modulationDepthPct < 0 || modulationDepthPct > 100) {
    throw new RangeError(`modulation depth must be 0–100 %, got ${modulationDepthPct}`);
  }
}

function range(samples: readonly number[]): [number, number] {
  if (samples.length === 0) throw new RangeError("need at least one sample");
  let min = Infinity;
  let max = -Infinity;
  for (const s of samples) {
    if (!Number.isFinite(s) || s < 0) throw new RangeError(`light output samples must be finite and ≥ 0, got ${s}`);
    min = Math.min(min, s);
    max = Math.max(max, s);
  }
  return [min, max];
}
