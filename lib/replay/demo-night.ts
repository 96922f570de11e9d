import type { DeviceEvent } from "@/lib/bus/types";

/**
 * An evening and night of the demo site (Larch Lane Studio, zone WET = UTC in
 * November) with one false trigger: at 03:12 something crosses the front path
 * (a fox, say) and the path lights come on for nobody. A real visitor at 18:06
 * lights them too — rightly. Used by the tests and as a sample file to import.
 */
export const NIGHT = { day: Date.UTC(2024, 10, 12), falseTriggerId: "night-0312-path-motion", visitorId: "night-1806-path-motion" } as const;

const dev = (key: string) => `larch-lane-dev-${key}`;
/** Local wall time on 12 November (day 0) or the morning after (day 1). */
export const nightAt = (day: 0 | 1, hh: number, mm: number, ss = 0) => NIGHT.day + day * 86_400_000 + ((hh * 60 + mm) * 60 + ss) * 1000;

export function demoNightLog(siteId = "larch-lane"): DeviceEvent[] {
  const e = (id: string, at: number, device: string, kind: string, value: DeviceEvent["value"]): DeviceEvent => ({ id, siteId, at, device: dev(device), kind, value });
  return [
    e("night-1600-window-lux", nightAt(0, 16, 0), "lux-window", "light-level", 650),
    e("night-1620-workshop-temp", nightAt(0, 16, 20), "climate-workshop", "temperature", 22.5),
    e("night-1645-workshop-press", nightAt(0, 16, 45), "rocker-workshop", "press", 1),
    e("night-1645-workshop-release", nightAt(0, 16, 45, 1), "rocker-workshop", "release", 1),
    e("night-1710-counter-call", nightAt(0, 17, 10), "call-counter", "press", 1),
    e("night-1740-workshop-press", nightAt(0, 17, 40), "rocker-workshop", "press", 1),
    e("night-1740-workshop-release", nightAt(0, 17, 40, 1), "rocker-workshop", "release", 1),
    e("night-1805-path-lux", nightAt(0, 18, 5), "sensor-path", "light-level", 4),
    e(NIGHT.visitorId, nightAt(0, 18, 6), "sensor-path", "motion", true),
    e("night-2130-flat-press", nightAt(0, 21, 30), "rocker-flat", "press", 2),
    e("night-2130-flat-release", nightAt(0, 21, 30, 1), "rocker-flat", "release", 2),
    e("night-2310-flat-press", nightAt(0, 23, 10), "rocker-flat", "press", 1),
    e("night-2310-flat-release", nightAt(0, 23, 10, 1), "rocker-flat", "release", 1),
    e(NIGHT.falseTriggerId, nightAt(1, 3, 12), "sensor-path", "motion", true),
    e("night-0640-path-lux", nightAt(1, 6, 40), "sensor-path", "light-level", 12),
    e("night-0730-workshop-temp", nightAt(1, 7, 30), "climate-workshop", "temperature", 19.8),
  ];
}

/** The window that holds the night: from 15:00 to 08:00 the next morning. */
export const NIGHT_WINDOW = { from: nightAt(0, 15, 0), to: nightAt(1, 8, 0) };
