import type { DeviceKind } from "../../lib/catalogue/device-kinds";
import type { NewDevice, NewSite, NewZone, SceneLevel } from "../schema";

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

// Installed values for the demo's solar devices (invented, not a maker's figures), so the
// Energy budget shows what a commissioned site looks like rather than typical defaults.
const DEMO_SOURCE = "Demo values (invented for Larch Lane Studio)";
const demoStorage = { capacitance: { value: 0.47, unit: "F" }, vMax: 3.6, vMin: 2.2, leakageUa: 0.3, source: DEMO_SOURCE };
const caseCell = { type: "solar", cellAreaCm2: 5, efficiencyPct: 15, exposure: "interior", daylightFactorPct: 0, source: `${DEMO_SOURCE}; organic PV reaches 26.1 % at 1000 lx (Cui et al., Nature Energy 2019)` };
const solar = (harvester?: Record<string, unknown>) => ({ energy: { storage: demoStorage, ...(harvester ? { harvester } : {}) } });

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
  { key: "climate-workshop", name: "Workshop climate sensor", kind: "climate-sensor", zone: "workshop", profile: solar() },
  { key: "fan-workshop", name: "Workshop fan relay", kind: "relay", zone: "workshop" },
  { key: "climate-case-a", name: "Textile case A climate sensor", kind: "climate-sensor", zone: "textile", profile: solar(caseCell) },
  { key: "climate-case-b", name: "Textile case B climate sensor", kind: "climate-sensor", zone: "textile", profile: solar(caseCell) },
  { key: "driver-textile", name: "Textile display driver", kind: "cc-driver", zone: "textile" },
  { key: "sensor-path", name: "Front path motion sensor", kind: "solar-motion-light", zone: "path", profile: solar({ type: "solar", cellAreaCm2: 5, efficiencyPct: 5, exposure: "near-window", daylightFactorPct: 30, source: `${DEMO_SOURCE}: outdoors under the porch roof, 30 % of the open sky` }) },
  { key: "light-path-1", name: "Path light 1", kind: "mesh-luminaire", zone: "path" },
  { key: "light-path-2", name: "Path light 2", kind: "mesh-luminaire", zone: "path" },
  { key: "contact-back", name: "Back door contact", kind: "solar-contact", zone: "back", profile: solar({ type: "solar", cellAreaCm2: 5, efficiencyPct: 5, exposure: "near-window", daylightFactorPct: 2, source: `${DEMO_SOURCE}: on the glazed back door` }) },
  { key: "fire-input", name: "Fire-alarm input module", kind: "fire-alarm-input", zone: "escape" },
  { key: "dl-escape-1", name: "Stair downlight", kind: "mesh-luminaire", zone: "escape" },
  { key: "dl-escape-2", name: "Exit passage downlight", kind: "mesh-luminaire", zone: "escape" },
  { key: "rocker-flat", name: "Flat rocker", kind: "kinetic-rocker", zone: "flat", elements: 2, profile: { buttons: 4 } },
  { key: "dl-flat-1", name: "Flat living-room light", kind: "mesh-luminaire", zone: "flat" },
  { key: "dl-flat-2", name: "Flat kitchen light", kind: "mesh-luminaire", zone: "flat" },
  { key: "panel-flat", name: "Flat notice panel", kind: "notice-panel", zone: "flat" },
];

// Hoisted so buildDevices can use the table defined further down.
function demoPositionOf(key: string) {
  return demoPositions[key];
}

function buildDevices(): NewDevice[] {
  let next = 0x0001;
  return deviceSeeds.map((d) => {
    const elementCount = d.elements ?? 1;
    const pos = demoPositionOf(d.key);
    const device: NewDevice = {
      id: `${DEMO_SITE_ID}-dev-${d.key}`,
      floorId: pos ? `${DEMO_SITE_ID}-floor-${pos.floor}` : null,
      x: pos?.x ?? null,
      y: pos?.y ?? null,
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



const zone = (key: string) => `${DEMO_SITE_ID}-zone-${key}`;
const dev = (key: string) => `${DEMO_SITE_ID}-dev-${key}`;

/** Numbers match the demo Rule set (lib/rules/demo-graph.ts: 1 open, 2 closed, 3 flat evening, 9 escape). */
export type DemoScene = { id: string; siteId: string; number: number; name: string; fadeMs: number; isOccupantRecallable: boolean; levels: SceneLevel[] };

export const demoScenes: DemoScene[] = [
  {
    id: `${DEMO_SITE_ID}-scene-shop-open`,
    siteId: DEMO_SITE_ID,
    number: 1,
    name: "Shop open",
    fadeMs: 2500,
    isOccupantRecallable: false,
    levels: [{ zoneId: zone("shop"), level: 80 }, { deviceId: dev("track-shop-1"), level: 100 }, { deviceId: dev("track-shop-2"), level: 100 }, { zoneId: zone("window"), level: 70 }, { zoneId: zone("textile"), level: 40 }],
  },
  { id: `${DEMO_SITE_ID}-scene-closed`, siteId: DEMO_SITE_ID, number: 2, name: "Closed", fadeMs: 10_000, isOccupantRecallable: false, levels: [{ zoneId: zone("shop"), level: 0 }, { zoneId: zone("window"), level: 20 }, { zoneId: zone("textile"), level: 0 }, { zoneId: zone("workshop"), level: 0 }] },
  { id: `${DEMO_SITE_ID}-scene-workshop`, siteId: DEMO_SITE_ID, number: 4, name: "Workshop bright", fadeMs: 1000, isOccupantRecallable: false, levels: [{ zoneId: zone("workshop"), level: 100 }] },
  { id: `${DEMO_SITE_ID}-scene-path`, siteId: DEMO_SITE_ID, number: 5, name: "Path welcome", fadeMs: 2500, isOccupantRecallable: true, levels: [{ zoneId: zone("path"), level: 70 }] },
  { id: `${DEMO_SITE_ID}-scene-flat-evening`, siteId: DEMO_SITE_ID, number: 3, name: "Flat evening", fadeMs: 6200, isOccupantRecallable: true, levels: [{ deviceId: dev("dl-flat-1"), level: 45 }, { deviceId: dev("dl-flat-2"), level: 25 }] },
  { id: `${DEMO_SITE_ID}-scene-flat-off`, siteId: DEMO_SITE_ID, number: 6, name: "Flat off", fadeMs: 2500, isOccupantRecallable: true, levels: [{ zoneId: zone("flat"), level: 0 }] },
  {
    id: `${DEMO_SITE_ID}-scene-escape`,
    siteId: DEMO_SITE_ID,
    number: 9,
    name: "Escape route",
    fadeMs: 0,
    isOccupantRecallable: false,
    levels: [{ zoneId: zone("escape"), level: 100 }, { zoneId: zone("path"), level: 100 }, { zoneId: zone("shop"), level: 0 }, { zoneId: zone("window"), level: 0 }, { zoneId: zone("workshop"), level: 0 }, { zoneId: zone("textile"), level: 0 }, { zoneId: zone("flat"), level: 0 }],
  },
];

/** Floors with the plans drawn by scripts/make-demo-plans.ts (50 px per metre). */
export const demoFloors = [
  { id: `${DEMO_SITE_ID}-floor-ground`, siteId: DEMO_SITE_ID, name: "Ground floor", sortOrder: 0, planFile: "ground-floor.png", pixelsPerMetre: 50 },
  { id: `${DEMO_SITE_ID}-floor-upper`, siteId: DEMO_SITE_ID, name: "Upper floor (flat)", sortOrder: 1, planFile: "upper-floor.png", pixelsPerMetre: 50 },
] as const;

/** Where each device sits, in metres from the plan's top-left corner. */
export const demoPositions: Record<string, { floor: "ground" | "upper"; x: number; y: number }> = {
  "rocker-shop-door": { floor: "ground", x: 1.2, y: 4.6 },
  "call-counter": { floor: "ground", x: 8.5, y: 8.8 },
  "dl-shop-1": { floor: "ground", x: 3, y: 6 },
  "dl-shop-2": { floor: "ground", x: 5.5, y: 6 },
  "dl-shop-3": { floor: "ground", x: 8, y: 6 },
  "track-shop-1": { floor: "ground", x: 3.5, y: 8.5 },
  "track-shop-2": { floor: "ground", x: 7, y: 8.5 },
  "lux-window": { floor: "ground", x: 9.5, y: 3 },
  "strip-window": { floor: "ground", x: 5.5, y: 3.2 },
  "rocker-workshop": { floor: "ground", x: 11, y: 3.2 },
  "dl-workshop-1": { floor: "ground", x: 14, y: 6 },
  "dl-workshop-2": { floor: "ground", x: 18, y: 6 },
  "climate-workshop": { floor: "ground", x: 20.8, y: 8.5 },
  "fan-workshop": { floor: "ground", x: 20.8, y: 3.2 },
  "climate-case-a": { floor: "ground", x: 13, y: 12.5 },
  "climate-case-b": { floor: "ground", x: 18.5, y: 12.5 },
  "driver-textile": { floor: "ground", x: 16, y: 11 },
  "sensor-path": { floor: "ground", x: 2, y: 1 },
  "light-path-1": { floor: "ground", x: 7, y: 1.2 },
  "light-path-2": { floor: "ground", x: 15, y: 1.2 },
  "contact-back": { floor: "ground", x: 8.75, y: 13.8 },
  "fire-input": { floor: "ground", x: 1.2, y: 13.5 },
  "dl-escape-1": { floor: "ground", x: 2.5, y: 12 },
  "dl-escape-2": { floor: "ground", x: 7.5, y: 12 },
  "rocker-flat": { floor: "upper", x: 1.2, y: 5 },
  "dl-flat-1": { floor: "upper", x: 4, y: 3 },
  "dl-flat-2": { floor: "upper", x: 9.5, y: 3 },
  "panel-flat": { floor: "upper", x: 7, y: 1 },
};

export const demoDevices: NewDevice[] = buildDevices();
