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

/** The live engine's view: what the lights, relays and site mode are now (null before any event). */
export type LiveSummary = {
  mode: string;
  emergency: { active: boolean; since: number | null };
  levels: Record<string, number>;
  relays: Record<string, boolean>;
  at: number | null;
};

export type SiteOverview = {
  site: { id: string; name: string; address: string; timeZone: string; latitude: number; longitude: number };
  zones: OverviewZone[];
  unassigned: OverviewDevice[];
  live: LiveSummary | null;
};

/** The route adds the caller's role so the view can adapt (occupants see only their zones). */
export type SiteOverviewResponse = SiteOverview & { role: Role };
