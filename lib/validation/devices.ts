import type { DeviceKind } from "@/lib/catalogue/device-kinds";

/** Shapes of the inventory API over JSON (dates as strings). */
export type DeviceDto = {
  id: string;
  siteId: string;
  zoneId: string | null;
  floorId: string | null;
  name: string;
  kind: DeviceKind;
  unicastAddress: number;
  elementCount: number;
  profile: Record<string, unknown>;
  x: number | null;
  y: number | null;
  createdAt: string;
};

export type ZoneDto = { id: string; siteId: string; name: string; groupAddress: number; sortOrder: number; deviceCount: number };
