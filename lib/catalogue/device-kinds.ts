/**
 * The device catalogue: every kind of device a site can hold, what powers it,
 * what it can report (triggers) and what it accepts (actions). The rule engine,
 * the Canvas and the Energy budget all read this one table.
 */
export const DEVICE_KINDS = [
  "kinetic-rocker",
  "kinetic-call-button",
  "kinetic-door-handle",
  "solar-motion-light",
  "solar-contact",
  "light-sensor",
  "climate-sensor",
  "fire-alarm-input",
  "mesh-luminaire",
  "cc-driver",
  "bridge-0-10v",
  "dali-driver",
  "relay",
  "notice-panel",
] as const;

export type DeviceKind = (typeof DEVICE_KINDS)[number];

/** kinetic: a press or handle turn generates the energy; solar: indoor PV into a capacitor; mains: wired supply. */
export type PowerSource = "kinetic" | "solar" | "mains";

export type DeviceRole = "control" | "sensor" | "output" | "safety";

export type DeviceKindInfo = {
  label: string;
  role: DeviceRole;
  power: PowerSource;
  /** What the device reports to the mesh. */
  reports: readonly string[];
  /** What the device accepts from the mesh. */
  accepts: readonly string[];
};

export const DEVICE_KIND_INFO: Record<DeviceKind, DeviceKindInfo> = {
  "kinetic-rocker": { label: "Kinetic rocker switch", role: "control", power: "kinetic", reports: ["press", "release", "long-press"], accepts: [] },
  "kinetic-call-button": { label: "Kinetic call button", role: "control", power: "kinetic", reports: ["press"], accepts: [] },
  "kinetic-door-handle": { label: "Kinetic door-handle switch", role: "control", power: "kinetic", reports: ["turn"], accepts: [] },
  "solar-motion-light": { label: "Solar motion + light-level sensor", role: "sensor", power: "solar", reports: ["motion", "light-level"], accepts: [] },
  "solar-contact": { label: "Solar door/window contact", role: "sensor", power: "solar", reports: ["contact"], accepts: [] },
  "light-sensor": { label: "Light-level sensor", role: "sensor", power: "solar", reports: ["light-level"], accepts: [] },
  "climate-sensor": { label: "Temperature + RH sensor", role: "sensor", power: "solar", reports: ["temperature", "humidity"], accepts: [] },
  "fire-alarm-input": { label: "Fire-alarm input module (wired)", role: "safety", power: "mains", reports: ["fire-alarm"], accepts: [] },
  "mesh-luminaire": { label: "Mesh luminaire", role: "output", power: "mains", reports: [], accepts: ["level", "scene"] },
  "cc-driver": { label: "Intelligent constant-current driver", role: "output", power: "mains", reports: [], accepts: ["level", "scene"] },
  "bridge-0-10v": { label: "0–10 V bridge", role: "output", power: "mains", reports: [], accepts: ["level", "scene"] },
  "dali-driver": { label: "DALI-curve driver", role: "output", power: "mains", reports: [], accepts: ["level", "scene"] },
  relay: { label: "Relay (fan or other load)", role: "output", power: "mains", reports: [], accepts: ["relay"] },
  "notice-panel": { label: "Notice panel", role: "output", power: "mains", reports: [], accepts: ["notice"] },
};

export function isBatteryFree(kind: DeviceKind): boolean {
  const { power } = DEVICE_KIND_INFO[kind];
  return power === "kinetic" || power === "solar";
}

export function isLuminaire(kind: DeviceKind): boolean {
  return DEVICE_KIND_INFO[kind].accepts.includes("level");
}
