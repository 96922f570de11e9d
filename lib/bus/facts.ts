import type { Clock, FactSource } from "@/lib/rules/registry";
import { localMinuteParts, minuteOfDay, type LocalDateTime, type Weekday } from "@/lib/sun/local-time";
import { sunTimesOn } from "@/lib/sun/sun-times";
import type { Runtime } from "./runtime";

/**
 * What gates can read at instant `at`. A class rather than an object of arrow
 * functions: one is made per trigger, and the clock is worked out only if a gate asks.
 */
class RuntimeFacts implements FactSource {
  private parts: Readonly<LocalDateTime> | null = null;
  private clockValue: Clock | null = null;

  constructor(
    private readonly rt: Runtime,
    private readonly at: number,
  ) {}

  private local(): Readonly<LocalDateTime> {
    return (this.parts ??= localMinuteParts(this.at, this.rt.model.site.timeZone));
  }

  clock(): Clock {
    if (!this.clockValue) {
      const p = this.local();
      const sun = sunMinutes(this.rt.model.site, p);
      this.clockValue = { minute: p.hour * 60 + p.minute, sunrise: sun.sunrise, sunset: sun.sunset };
    }
    return this.clockValue;
  }

  weekday(): Weekday {
    return this.local().weekday;
  }

  siteMode(): string {
    return this.rt.state.mode;
  }

  isEmergencyActive(): boolean {
    return this.rt.state.emergency.active;
  }

  lux(device: string): number | null {
    return this.rt.state.sensors.lux[device] ?? null;
  }

  isZoneOccupied(zone: string): boolean {
    return isZoneOccupied(this.rt, zone);
  }
}

type SunMinutes = { sunrise: number | null; sunset: number | null };
// Sunrise and sunset in local minutes per site and local date: a pure function of
// both, asked on every time gate, so remember them (a cache, bounded).
const sunCache = new Map<string, SunMinutes>();

function sunMinutes(site: Runtime["model"]["site"], date: Readonly<LocalDateTime>): SunMinutes {
  const key = `${site.latitude}|${site.longitude}|${site.timeZone}|${date.year}-${date.month}-${date.day}`;
  let hit = sunCache.get(key);
  if (!hit) {
    const sun = sunTimesOn(date, site.latitude, site.longitude);
    hit = {
      sunrise: sun.sunrise === null ? null : minuteOfDay(sun.sunrise, site.timeZone),
      sunset: sun.sunset === null ? null : minuteOfDay(sun.sunset, site.timeZone),
    };
    if (sunCache.size >= 4096) sunCache.clear();
    sunCache.set(key, hit);
  }
  return hit;
}

export function factSource(rt: Runtime, at: number): FactSource {
  return new RuntimeFacts(rt, at);
}

export function isZoneOccupied(rt: Runtime, zone: string): boolean {
  for (const id of rt.model.motionSensorsByZone.get(zone) ?? []) if (rt.state.sensors.occupied[id]) return true;
  return false;
}
