import type { Role } from "@/lib/auth/roles";
import type { DeviceKind } from "@/lib/catalogue/device-kinds";

/** Shape of GET /api/sites/{siteId}/overview, shared by the route and its client. */
export type OverviewDevice = {
  id: string;
  name: string;
  kind: DeviceKind;
  unicastAddress: number;
  elementCount: number;
  zoneId: string | null;
};

export type OverviewZone = { id: string; name: string; groupAddress: number; devices: OverviewDevice[] };

export type SiteOverview = {
  site: { id: string; name: string; address: string; timeZone: string; latitude: number; longitude: number };
  zones: OverviewZone[];
  unassigned: OverviewDevice[];
};

/** The route adds the caller's role so the view can adapt (occupants see only their zones). */
export type SiteOverviewResponse = SiteOverview & { role: Role };
