import { z } from "zod";
import { DEVICE_KINDS, type DeviceKind } from "./device-kinds";
import { KIND_ACTIVITY, KINETIC_HARVESTER, KINETIC_STORAGE, OUTPUT_DEFAULTS, SOLAR_HARVESTER, SOLAR_STORAGE, TYPICAL_RADIO } from "./profile-defaults";

/**
 * A device's profile JSON (devices.profile), one zod schema per kind. Forms, the
 * CSV import and the Energy budget all read it. Every section has a default of
 * typical values marked `isTypical: true` with its source, so an empty profile
 * ({} as the demo seed stores) parses into something usable and the Energy
 * budget can say "typical values — enter yours" instead of guessing silently.
 */

const num = (min: number, max: number, { isMinExclusive = false, isInteger = false } = {}) => {
  let n = z.number({ error: (issue) => (issue.input === undefined ? "is required" : "must be a number") });
  if (isInteger) n = n.int({ error: "must be a whole number" });
  n = isMinExclusive ? n.gt(min, { error: `must be more than ${min}` }) : n.gte(min, { error: `must be at least ${min}` });
  return n.lte(max, { error: `must be at most ${max}` });
};
const positive = (max: number) => num(0, max, { isMinExclusive: true });

// Marks a section filled from typical values; a form clears it when a person edits the section.
const typical = { isTypical: z.boolean().default(false), source: z.string().max(300).optional() };

export const kineticHarvesterSchema = z.strictObject({
  type: z.literal("kinetic").default("kinetic"),
  /** Electrical energy one press or turn generates, µJ. */
  energyPerActuationUj: positive(100_000),
  /** Share of it that reaches the storage, %. */
  conversionEfficiencyPct: positive(100),
  ...typical,
});

export const solarHarvesterSchema = z.strictObject({
  type: z.literal("solar").default("solar"),
  cellAreaCm2: positive(500),
  efficiencyPct: positive(100),
  exposure: z.enum(["interior", "near-window"]),
  /** Share of outdoor daylight reaching the cell, %; used for near-window cells. */
  daylightFactorPct: num(0, 100),
  ...typical,
});

export const storageSchema = z
  .strictObject({
    capacitance: z.strictObject({ value: positive(1e9), unit: z.enum(["F", "uF"]) }),
    /** Voltage when full and the lowest voltage the electronics still run at, V. */
    vMax: positive(12),
    vMin: num(0, 12),
    leakageUa: num(0, 10_000),
    ...typical,
  })
  .refine((s) => s.vMin < s.vMax, { path: ["vMin"], error: "must be below the full voltage (vMax)" })
  .refine((s) => capacitanceFarads(s.capacitance) <= 100, { path: ["capacitance", "value"], error: "is more than 100 F — check the unit" });

export const radioSchema = z.strictObject({
  supplyV: positive(12),
  txCurrentMa: positive(200),
  phy: z.enum(["1M", "2M"]),
  /** Extra transmissions of each message (transmissions − 1), 3 bits as in the Network Transmit state. */
  repeats: num(0, 7, { isInteger: true }),
  /** Advertising channels used per transmission (37/38/39). */
  channels: num(1, 3, { isInteger: true }),
  ...typical,
});

export const activitySchema = z.strictObject({
  sleepCurrentUa: num(0, 100_000),
  sensingEnergyUj: num(0, 1_000_000),
  /** Seconds between periodic reports; null = reports only when something changes. */
  reportingIntervalS: positive(604_800).nullable(),
  /** Seconds between "still alive" messages; null = none. */
  heartbeatS: positive(604_800).nullable(),
  ...typical,
});

type EnergyKind = keyof typeof KIND_ACTIVITY;

const usage = (kind: EnergyKind) => ({
  radio: radioSchema.prefault(() => structuredClone(TYPICAL_RADIO)),
  activity: activitySchema.prefault(() => structuredClone(KIND_ACTIVITY[kind])),
});

const kineticEnergy = (kind: EnergyKind) =>
  z
    .strictObject({
      // Call buttons are assumed piezo (the one published figure); rockers and handles electrodynamic.
      harvester: kineticHarvesterSchema.prefault(() => structuredClone(kind === "kinetic-call-button" ? KINETIC_HARVESTER.piezo : KINETIC_HARVESTER.electrodynamic)),
      storage: storageSchema.prefault(() => structuredClone(KINETIC_STORAGE)),
      ...usage(kind),
    })
    .prefault({});

const solarEnergy = (kind: EnergyKind) =>
  z
    .strictObject({
      // A light sensor does its job by a window, so it is assumed to sit near one.
      harvester: solarHarvesterSchema.prefault(() => structuredClone(kind === "light-sensor" ? SOLAR_HARVESTER.nearWindow : SOLAR_HARVESTER.interior)),
      storage: storageSchema.prefault(() => structuredClone(SOLAR_STORAGE)),
      ...usage(kind),
    })
    .prefault({});

export const flickerSchema = z.strictObject({ pwmFrequencyHz: positive(10_000_000), modulationDepthPct: num(0, 100) });

/** How a level reaches the light: the mesh Lightness model, 0–10 V, the DALI curve, or only on/off. */
export const OUTPUT_INTERFACES = ["mesh-lightness", "0-10v", "dali", "relay"] as const;
export type OutputInterface = (typeof OUTPUT_INTERFACES)[number];

const dimmedOutput = <I extends Exclude<OutputInterface, "relay">>(iface: I) =>
  z.strictObject({
    interface: z.literal(iface),
    /** Lowest light output the driver gives before off, %. */
    minLevelPct: num(0, 100).refine((v) => v < 100, { error: "must be below 100" }),
    /** Measured at the driver's PWM; null = not measured. */
    flicker: flickerSchema.nullable().default(null),
    ...typical,
  });
const switchedOutput = z.strictObject({ interface: z.literal("relay") });

const output = <S extends z.ZodType>(schema: S, fallback: z.input<S>) => z.strictObject({ output: schema.prefault(() => structuredClone(fallback)) }).prefault({});

const emptyProfile = z.strictObject({}).prefault({});

export const PROFILE_SCHEMAS = {
  "kinetic-rocker": z.strictObject({ buttons: z.union([z.literal(2), z.literal(4)], { error: "must be 2 or 4" }).default(2), energy: kineticEnergy("kinetic-rocker") }).prefault({}),
  "kinetic-call-button": z.strictObject({ energy: kineticEnergy("kinetic-call-button") }).prefault({}),
  "kinetic-door-handle": z.strictObject({ energy: kineticEnergy("kinetic-door-handle") }).prefault({}),
  "solar-motion-light": z.strictObject({ energy: solarEnergy("solar-motion-light") }).prefault({}),
  "solar-contact": z.strictObject({ energy: solarEnergy("solar-contact") }).prefault({}),
  "light-sensor": z.strictObject({ energy: solarEnergy("light-sensor") }).prefault({}),
  "climate-sensor": z.strictObject({ energy: solarEnergy("climate-sensor") }).prefault({}),
  "fire-alarm-input": emptyProfile,
  "mesh-luminaire": output(z.discriminatedUnion("interface", [dimmedOutput("mesh-lightness"), switchedOutput]), OUTPUT_DEFAULTS["mesh-lightness"]),
  "cc-driver": output(z.discriminatedUnion("interface", [dimmedOutput("mesh-lightness"), switchedOutput]), OUTPUT_DEFAULTS["mesh-lightness"]),
  "bridge-0-10v": output(dimmedOutput("0-10v"), OUTPUT_DEFAULTS["0-10v"]),
  "dali-driver": output(dimmedOutput("dali"), OUTPUT_DEFAULTS.dali),
  relay: output(switchedOutput, { interface: "relay" }),
  "notice-panel": emptyProfile,
} satisfies Record<DeviceKind, z.ZodType>;

export type DeviceProfile<K extends DeviceKind = DeviceKind> = z.output<(typeof PROFILE_SCHEMAS)[K]>;
export type KineticHarvester = z.input<typeof kineticHarvesterSchema>;
export type SolarHarvester = z.input<typeof solarHarvesterSchema>;
export type Storage = z.input<typeof storageSchema>;
export type Radio = z.input<typeof radioSchema>;
export type Activity = z.input<typeof activitySchema>;
export type DimmedOutput = z.input<ReturnType<typeof dimmedOutput>>;

export type ProfileFieldError = { path: string; message: string };
export type ProfileResult<K extends DeviceKind> = { ok: true; profile: DeviceProfile<K> } | { ok: false; errors: ProfileFieldError[] };

/** The typical profile for a kind: what an empty profile parses into. */
export function defaultProfile<K extends DeviceKind>(kind: K): DeviceProfile<K> {
  return PROFILE_SCHEMAS[kind].parse({}) as DeviceProfile<K>;
}

/** Validates a profile (an object, or its JSON text) for a kind; errors carry dotted paths such as "energy.storage.vMin". */
export function parseProfile<K extends DeviceKind>(kind: K, json: unknown): ProfileResult<K> {
  if (!(DEVICE_KINDS as readonly string[]).includes(kind)) return { ok: false, errors: [{ path: "kind", message: `unknown device kind "${kind}"` }] };
  let value = json;
  if (typeof json === "string") {
    try {
      value = JSON.parse(json);
    } catch {
      return { ok: false, errors: [{ path: "", message: "is not valid JSON" }] };
    }
  }
  const result = PROFILE_SCHEMAS[kind].safeParse(value ?? {});
  if (result.success) return { ok: true, profile: result.data as DeviceProfile<K> };
  return { ok: false, errors: result.error.issues.flatMap(toFieldErrors) };
}

// One error per stray key, at the key's own path, so a form or import can point at it.
function toFieldErrors(issue: z.core.$ZodIssue): ProfileFieldError[] {
  const path = issue.path.map(String);
  if (issue.code === "unrecognized_keys") return issue.keys.map((key) => ({ path: [...path, key].join("."), message: "is not a setting of this kind of device" }));
  return [{ path: path.join("."), message: issue.message }];
}

export function capacitanceFarads(c: { value: number; unit: "F" | "uF" }): number {
  return c.unit === "F" ? c.value : c.value * 1e-6;
}

/** Energy a capacitor gives up going from v1 down to v2: ½·C·(v1² − v2²), in joules (physics handbook). */
export function usableStorageEnergyJ(capacitanceF: number, v1: number, v2: number): number {
  if (!(capacitanceF > 0) || !Number.isFinite(capacitanceF)) throw new RangeError(`capacitance must be > 0 F, got ${capacitanceF}`);
  if (!(v1 >= v2) || !(v2 >= 0) || !Number.isFinite(v1)) throw new RangeError(`need v1 ≥ v2 ≥ 0 V, got ${v1} → ${v2}`);
  return 0.5 * capacitanceF * (v1 * v1 - v2 * v2);
}

/** Radio-on time of one LE packet with `payloadOctets` of PDU payload (Bluetooth Core Spec Vol 6 Part B §2.1). */
export function leAirtimeUs(payloadOctets: number, phy: "1M" | "2M"): number {
  if (!Number.isInteger(payloadOctets) || payloadOctets < 0 || payloadOctets > 255) throw new RangeError(`payload must be 0–255 octets, got ${payloadOctets}`);
  // 1M: preamble 1 + access address 4 + header 2 + CRC 3 octets at 8 µs; 2M: 2-octet preamble at 4 µs.
  return phy === "1M" ? 8 * (10 + payloadOctets) : 4 * (11 + payloadOctets);
}
