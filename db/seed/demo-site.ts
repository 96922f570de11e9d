import type { DeviceKind } from "../../lib/catalogue/device-kinds";
import type { NewDevice, NewSite, NewZone } from "../schema";

/**
 * The invented demo site: a small craft gallery with a shop, a workshop with a
 * kiln, a textile display room and a flat upstairs. Ids are fixed so seeding
 * twice changes nothing.
 */
export const DEMO_SITE_ID = "larch-lane";

export const demoSite: NewSite = {
  id: DEMO_SITE_ID,
  name: "Larch Lane Studio",
  address: "4 Larch Lane (invented)",
  // A zone name with European summer-time rules and no city in it.
  timeZone: "WET",
  latitude: 51.2,
  longitude: -2.1,
};

type ZoneSeed = { key: string; name: string };

const zoneSeeds: ZoneSeed[] = [
  { key: "shop", name: "Shop floor" },
  { key: "window", name: "Shop window" },
  { key: "workshop", name: "Workshop" },
  { key: "textile", name: "Textile room" },
  { key: "path", name: "Front path" },
  { key: "back", name: "Back door" },
  { key: "escape", name: "Stairs and escape route" },
  { key: "flat", name: "Flat" },
];

export const demoZones: NewZone[] = zoneSeeds.map((z, i) => ({
  id: `${DEMO_SITE_ID}-zone-${z.key}`,
  siteId: DEMO_SITE_ID,
  name: z.name,
  groupAddress: 0xc000 + i,
  sortOrder: i,
}));

type DeviceSeed = { key: string; name: string; kind: DeviceKind; zone: string | null; elements?: number; profile?: Record<string, unknown> };

const deviceSeeds: DeviceSeed[] = [
  { key: "rocker-shop-door", name: "Shop door rocker", kind: "kinetic-rocker", zone: "shop", elements: 2, profile: { buttons: 4 } },
  { key: "call-counter", name: "Counter call button", kind: "kinetic-call-button", zone: "shop" },
  { key: "dl-shop-1", name: "Shop downlight 1", kind: "mesh-luminaire", zone: "shop" },
  { key: "dl-shop-2", name: "Shop downlight 2", kind: "mesh-luminaire", zone: "shop" },
  { key: "dl-shop-3", name: "Shop downlight 3", kind: "mesh-luminaire", zone: "shop" },
  { key: "track-shop-1", name: "Shop track head 1", kind: "mesh-luminaire", zone: "shop" },
  { key: "track-shop-2", name: "Shop track head 2", kind: "mesh-luminaire", zone: "shop" },
  { key: "lux-window", name: "Shop window light sensor", kind: "light-sensor", zone: "window" },
  { key: "strip-window", name: "Window LED strip (0–10 V bridge)", kind: "bridge-0-10v", zone: "window" },
  { key: "rocker-workshop", name: "Workshop rocker", kind: "kinetic-rocker", zone: "workshop", profile: { buttons: 2 } },
  { key: "dl-workshop-1", name: "Workshop downlight 1", kind: "mesh-luminaire", zone: "workshop" },
  { key: "dl-workshop-2", name: "Workshop downlight 2", kind: "mesh-luminaire", zone: "workshop" },
  { key: "climate-workshop", name: "Workshop climate sensor", kind: "climate-sensor", zone: "workshop" },
  { key: "fan-workshop", name: "Workshop fan relay", kind: "relay", zone: "workshop" },
  { key: "climate-case-a", name: "Textile case A climate sensor", kind: "climate-sensor", zone: "textile" },
  { key: "climate-case-b", name: "Textile case B climate sensor", kind: "climate-sensor", zone: "textile" },
  { key: "driver-textile", name: "Textile display driver", kind: "cc-driver", zone: "textile" },
  { key: "sensor-path", name: "Front path motion sensor", kind: "solar-motion-light", zone: "path" },
  { key: "light-path-1", name: "Path light 1", kind: "mesh-luminaire", zone: "path" },
  { key: "light-path-2", name: "Path light 2", kind: "mesh-luminaire", zone: "path" },
  { key: "contact-back", name: "Back door contact", kind: "solar-contact", zone: "back" },
  { key: "fire-input", name: "Fire-alarm input module", kind: "fire-alarm-input", zone: "escape" },
  { key: "dl-escape-1", name: "Stair downlight", kind: "mesh-luminaire", zone: "escape" },
  { key: "dl-escape-2", name: "Exit passage downlight", kind: "mesh-luminaire", zone: "escape" },
  { key: "rocker-flat", name: "Flat rocker", kind: "kinetic-rocker", zone: "flat", elements: 2, profile: { buttons: 4 } },
  { key: "dl-flat-1", name: "Flat living-room light", kind: "mesh-luminaire", zone: "flat" },
  { key: "dl-flat-2", name: "Flat kitchen light", kind: "mesh-luminaire", zone: "flat" },
  { key: "panel-flat", name: "Flat notice panel", kind: "notice-panel", zone: "flat" },
];

function buildDevices(): NewDevice[] {
  let next = 0x0001;
  return deviceSeeds.map((d) => {
    const elementCount = d.elements ?? 1;
    const device: NewDevice = {
      id: `${DEMO_SITE_ID}-dev-${d.key}`,
      siteId: DEMO_SITE_ID,
      zoneId: d.zone ? `${DEMO_SITE_ID}-zone-${d.zone}` : null,
      name: d.name,
      kind: d.kind,
      unicastAddress: next,
      elementCount,
      profile: d.profile ?? {},
    };
    next += elementCount;
    return device;
  });
}

export const demoDevices: NewDevice[] = buildDevices();
