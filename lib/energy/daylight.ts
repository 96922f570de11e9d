import { getPosition, getTimes } from "suncalc";
import { overcastSkyLux } from "./physics";

const HOUR_MS = 3_600_000;

export type DaylightHour = { litFraction: number; outdoorLux: number };

/**
 * Outdoor daylight for each hour starting at `hourStarts`: the share of the
 * hour between sunrise and sunset (suncalc, NOAA-equivalent) and the mean
 * overcast-sky illuminance over the hour, from the sun's altitude in the middle
 * of the lit part. Overcast is the sky daylight factors are defined under, and
 * the dull case a budget should survive.
 */
export function daylightByHour(hourStarts: readonly number[], latitude: number, longitude: number): DaylightHour[] {
  return hourStarts.map((start) => {
    const end = start + HOUR_MS;
    const t = getTimes(new Date(start + HOUR_MS / 2), latitude, longitude);
    let from: number;
    let to: number;
    if (t.sunrise && t.sunset && !Number.isNaN(t.sunrise.getTime()) && !Number.isNaN(t.sunset.getTime())) {
      from = Math.max(start, t.sunrise.getTime());
      to = Math.min(end, t.sunset.getTime());
    } else {
      // Polar day or night: the sun stays up or down all day.
      const up = getPosition(new Date(start + HOUR_MS / 2), latitude, longitude).altitude > 0;
      from = start;
      to = up ? end : start;
    }
    if (to <= from) return { litFraction: 0, outdoorLux: 0 };
    const litFraction = (to - from) / HOUR_MS;
    // suncalc 2 gives degrees.
    const altitude = (getPosition(new Date((from + to) / 2), latitude, longitude).altitude * Math.PI) / 180;
    return { litFraction, outdoorLux: litFraction * overcastSkyLux(altitude) };
  });
}
