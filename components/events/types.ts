import type { DeviceKind } from "@/lib/catalogue/device-kinds";

/** What the Event log and Replay pages know of the site, handed down by their server page. */
export type SiteContext = {
  siteId: string;
  timeZone: string;
  devices: { id: string; name: string; kind: DeviceKind; zoneId: string | null }[];
  zones: { id: string; name: string }[];
};

export function deviceLabel(ctx: SiteContext, id: string | null): string {
  if (!id) return "—";
  return ctx.devices.find((d) => d.id === id)?.name ?? id;
}
