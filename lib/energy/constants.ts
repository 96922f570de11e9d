/**
 * Every fixed number the Energy budget uses, with where it comes from. Published
 * values name their source; assumptions say so, and the page shows them beside
 * the figures they feed so an integrator can challenge them.
 */
export type Sourced = { value: number; unit: string; source: string };

const s = (value: number, unit: string, source: string): Sourced => ({ value, unit, source });

export const ENERGY_CONSTANTS = {
  /** Luminous efficacy of radiation of white LED light (references: 280–350 lm/W); the middle of the range. */
  ledLer: s(315, "lm/W", "White LED light ≈ 280–350 lm/W (Ohno, Opt. Eng. 44, 2005; from memory)"),
  /** Daylight's luminous efficacy: far more of its power lies outside the visible band. */
  daylightLer: s(110, "lm/W", "Daylight ≈ 93–125 lm/W (from memory, not verified)"),
  /** CIE overcast sky, horizontal illuminance E = a + b·sin(solar altitude). */
  overcastA: s(300, "lx", "Overcast-sky illuminance 300 + 21 000·sin(altitude) lx (Krochmann, from memory)"),
  overcastB: s(21_000, "lx", "Overcast-sky illuminance 300 + 21 000·sin(altitude) lx (Krochmann, from memory)"),
  /** Illuminance at a device whose zone is at 100 %: a lit shop or gallery interior. */
  luxAtFull: s(300, "lx", "Assumption, no source: a lit shop or gallery interior at full level — set yours with the what-if"),
  /** Each mesh message goes out as one unsegmented Network PDU at its largest: AdvA 6 + AD (1 + 1 + 29) octets. */
  advPayloadOctets: s(37, "octets", "Mesh Profile 1.0.1: Network PDU ≤ 29 octets, AD length + type 2, AdvA 6 (computed)"),
  /** Radio start-up per channel, spent at TX current. */
  rampUs: s(80, "µs", "Assumption, from memory: radio start-up ≈ 40–140 µs per channel"),
  /** Waking the processor, encrypting and building one mesh message. */
  wakeUj: s(5, "µJ", "Assumption, no source: wake-up, AES-CCM and packet build per message"),
  /** A verdict with less margin than this is Tight: cells get dusty, capacitors age. */
  tightMargin: s(0.3, "", "Common practice, no source: keep 30 % headroom"),
  /** Activity the rules cannot tell us; the event log replaces these when it has history. */
  actuationsPerDay: s(20, "presses/day", "Assumption, no source: a busy switch"),
  motionEventsPerDay: s(40, "events/day", "Assumption, no source: a front path or shop entrance"),
  motionBlindS: s(30, "s", "Assumption, no source: a motion sensor's blind time after each report"),
  contactChangesPerDay: s(20, "changes/day", "Assumption, no source: ten openings and closings"),
  thresholdCrossingsPerDay: s(2, "crossings/day", "Assumption, no source: once up and once down a day"),
  /** When no rule or schedule lights a zone but a person's switch does. */
  manualUseHours: s(8, "h/day", "Assumption, no source: a zone switched by hand is lit 09:00–17:00"),
} as const;

export const SECONDS_PER_DAY = 86_400;
export const HOURS_PER_WEEK = 168;
