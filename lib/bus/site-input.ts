import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import type { SiteInput } from "./site-model";
import type { SceneConfig } from "./types";

/** The columns of site, zone and device rows the engine reads; extra columns are ignored. */
export type SiteRows = {
  site: { timeZone: string; latitude: number; longitude: number };
  devices: { id: string; kind: DeviceKind; zoneId?: string | null; unicastAddress: number; name?: string }[];
  zones: { id: string; groupAddress?: number | null; name?: string }[];
  scenes?: SceneConfig[];
};

/** Database-shaped rows → what createEngine takes, so the store and the tests build a site the same way. */
export function toSiteInput(rows: SiteRows, extra: Partial<SiteInput["site"]> = {}): SiteInput {
  return {
    site: { timeZone: rows.site.timeZone, latitude: rows.site.latitude, longitude: rows.site.longitude, ...extra },
    devices: rows.devices.map((d) => ({ id: d.id, kind: d.kind, zoneId: d.zoneId ?? null, unicastAddress: d.unicastAddress, ...(d.name ? { name: d.name } : {}) })),
    zones: rows.zones.map((z) => ({ id: z.id, groupAddress: z.groupAddress ?? null, ...(z.name ? { name: z.name } : {}) })),
    scenes: rows.scenes ?? [],
  };
}
