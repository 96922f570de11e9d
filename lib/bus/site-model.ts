import { DEVICE_KIND_INFO, isLuminaire } from "@/lib/catalogue/device-kinds";
import type { DeviceConfig, SceneConfig, SiteConfig, ZoneConfig } from "./types";

/**
 * Lookups over a site's configuration, built once per engine. Lists keep the
 * order the site gave, and every output walks them rather than a Map, so the
 * order of commands never depends on how a Map was filled.
 */
export type SiteModel = {
  site: SiteConfig;
  gatewayAddress: number;
  ttl: number;
  occupancyMs: number;
  manualHoldMs: number;
  devices: Map<string, DeviceConfig>;
  zones: Map<string, ZoneConfig>;
  zoneOrder: string[];
  luminaireOrder: Map<string, number>;
  luminairesByZone: Map<string, string[]>;
  motionSensorsByZone: Map<string, string[]>;
  scenes: Map<number, SceneConfig>;
};

// The top of the unicast range stays clear of devices numbered up from 0x0001.
const DEFAULT_GATEWAY = 0x7fff;
// Enough for a small building's few relays; common practice, no source.
const DEFAULT_TTL = 7;
const DEFAULT_OCCUPANCY_MIN = 15;
const DEFAULT_MANUAL_HOLD_MIN = 120;

export type SiteInput = {
  site: SiteConfig & { manualHoldMinutes?: number };
  devices: DeviceConfig[];
  zones: ZoneConfig[];
  scenes: SceneConfig[];
};

export function buildSiteModel(input: SiteInput): SiteModel {
  const luminairesByZone = new Map<string, string[]>();
  const motionSensorsByZone = new Map<string, string[]>();
  const luminaireOrder = new Map<string, number>();
  for (const d of input.devices) {
    if (isLuminaire(d.kind)) {
      luminaireOrder.set(d.id, luminaireOrder.size);
      if (d.zoneId) push(luminairesByZone, d.zoneId, d.id);
    }
    if (d.zoneId && DEVICE_KIND_INFO[d.kind].reports.includes("motion")) push(motionSensorsByZone, d.zoneId, d.id);
  }
  return {
    site: input.site,
    gatewayAddress: input.site.gatewayAddress ?? DEFAULT_GATEWAY,
    ttl: input.site.ttl ?? DEFAULT_TTL,
    occupancyMs: (input.site.occupancyMinutes ?? DEFAULT_OCCUPANCY_MIN) * 60_000,
    manualHoldMs: (input.site.manualHoldMinutes ?? DEFAULT_MANUAL_HOLD_MIN) * 60_000,
    devices: new Map(input.devices.map((d) => [d.id, d])),
    zones: new Map(input.zones.map((z) => [z.id, z])),
    zoneOrder: input.zones.map((z) => z.id),
    luminaireOrder,
    luminairesByZone,
    motionSensorsByZone,
    scenes: new Map(input.scenes.map((s) => [s.number, s])),
  };
}

function push(map: Map<string, string[]>, key: string, value: string) {
  const list = map.get(key);
  if (list) list.push(value);
  else map.set(key, [value]);
}

/** A scene's level per luminaire: a luminaire entry beats its zone's entry; luminaire order. */
export function sceneLevels(model: SiteModel, scene: SceneConfig): { deviceId: string; level: number }[] {
  const levels = new Map<string, number>();
  for (const entry of scene.levels) {
    if (entry.zoneId) for (const id of model.luminairesByZone.get(entry.zoneId) ?? []) if (!levels.has(id)) levels.set(id, entry.level);
  }
  for (const entry of scene.levels) if (entry.deviceId && model.luminaireOrder.has(entry.deviceId)) levels.set(entry.deviceId, entry.level);
  return byLuminaireOrder(model, [...levels].map(([deviceId, level]) => ({ deviceId, level })));
}

export function byLuminaireOrder<T extends { deviceId: string }>(model: SiteModel, items: T[]): T[] {
  return items.sort((a, b) => (model.luminaireOrder.get(a.deviceId) ?? 0) - (model.luminaireOrder.get(b.deviceId) ?? 0));
}

export function allLuminaires(model: SiteModel): string[] {
  return [...model.luminaireOrder.keys()];
}

export function deviceName(model: SiteModel, id: string | null): string {
  if (!id) return "";
  return model.devices.get(id)?.name ?? id;
}

export function zoneName(model: SiteModel, zoneId: string | null | undefined): string {
  if (!zoneId) return "";
  return model.zones.get(zoneId)?.name ?? zoneId;
}
