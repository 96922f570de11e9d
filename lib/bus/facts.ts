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
      const { timeZone, latitude, longitude } = this.rt.model.site;
      const p = this.local();
      const sun = sunTimesOn(p, latitude, longitude);
      this.clockValue = {
        minute: p.hour * 60 + p.minute,
        sunrise: sun.sunrise === null ? null : minuteOfDay(sun.sunrise, timeZone),
        sunset: sun.sunset === null ? null : minuteOfDay(sun.sunset, timeZone),
      };
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

export function factSource(rt: Runtime, at: number): FactSource {
  return new RuntimeFacts(rt, at);
}

export function isZoneOccupied(rt: Runtime, zone: string): boolean {
  for (const id of rt.model.motionSensorsByZone.get(zone) ?? []) if (rt.state.sensors.occupied[id]) return true;
  return false;
}
