/**
 * What a sensor can physically report (common practice, no source: full sun is
 * about 100,000–130,000 lx; indoor climate sensors cover −40…85 °C and 0–100 %RH).
 * Anything outside is a fault, not a reading. One table for the gateway API, the
 * Test bench and the rule checks, so a value one accepts the others accept too.
 */
export const SENSOR_RANGES = {
  lux: { min: 0, max: 200_000, unit: "lx" },
  celsius: { min: -40, max: 85, unit: "°C" },
  percent: { min: 0, max: 100, unit: "%RH" },
} as const;

/** The range for each reading kind a device reports. */
export const READING_RANGES = {
  "light-level": SENSOR_RANGES.lux,
  temperature: SENSOR_RANGES.celsius,
  humidity: SENSOR_RANGES.percent,
} as const;
