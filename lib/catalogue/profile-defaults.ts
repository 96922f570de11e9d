import type { Activity, DimmedOutput, KineticHarvester, Radio, SolarHarvester, Storage } from "./profiles";

/**
 * Typical values used when a profile leaves a section out. Each carries
 * `isTypical: true` and where the number comes from, so the Energy budget can
 * show that a verdict rests on typical values rather than the installed device.
 * Figures marked "assumption" have no published source: they are placeholders
 * in a plausible range, to be replaced with the maker's or a measured figure.
 */

export const KINETIC_HARVESTER = {
  piezo: {
    type: "kinetic",
    energyPerActuationUj: 1000,
    // The published figure is already electrical energy at 3 V, so no further loss is applied.
    conversionEfficiencyPct: 100,
    isTypical: true,
    source: "≈ 1 mJ per push at 3 V from a piezo pushbutton (Paradiso & Feldmeier, UbiComp 2001)",
  },
  electrodynamic: {
    type: "kinetic",
    energyPerActuationUj: 300,
    conversionEfficiencyPct: 100,
    isTypical: true,
    source: "Electrodynamic rockers give ≈ 0.1–0.5 mJ per press (from memory, not verified): enter your switch's figure",
  },
} as const satisfies Record<string, KineticHarvester>;

export const SOLAR_HARVESTER = {
  interior: {
    type: "solar",
    cellAreaCm2: 5,
    efficiencyPct: 5,
    exposure: "interior",
    daylightFactorPct: 0,
    isTypical: true,
    source: "Amorphous silicon ≈ 5–6 % under indoor light (Apostolou et al., 2016); cell area is an assumption",
  },
  nearWindow: {
    type: "solar",
    cellAreaCm2: 5,
    efficiencyPct: 5,
    exposure: "near-window",
    daylightFactorPct: 2,
    isTypical: true,
    source: "Amorphous silicon ≈ 5–6 % under indoor light (Apostolou et al., 2016); 2 % daylight factor is common practice, no source",
  },
} as const satisfies Record<string, SolarHarvester>;

const STORAGE_NOTE = "usable energy ½·C·(V₁² − V₂²) (physics handbook)";

/** Sized to hold one press (≈ 1.8 mJ usable), since a kinetic switch spends each press at once. */
export const KINETIC_STORAGE = {
  capacitance: { value: 470, unit: "uF" },
  vMax: 3.3,
  vMin: 1.8,
  leakageUa: 0,
  isTypical: true,
  source: `Assumption, no source: a buffer capacitor for one press; ${STORAGE_NOTE}`,
} as const satisfies Storage;

export const SOLAR_STORAGE = {
  capacitance: { value: 0.47, unit: "F" },
  vMax: 3.6,
  vMin: 2.2,
  leakageUa: 2,
  isTypical: true,
  source: `Assumption, no source: a small supercapacitor; ${STORAGE_NOTE}`,
} as const satisfies Storage;

export const TYPICAL_RADIO = {
  supplyV: 3,
  txCurrentMa: 5,
  phy: "1M",
  repeats: 2,
  channels: 3,
  isTypical: true,
  source: "Model values (3 V, 5 mA, 3 advertising channels); LE 1M airtime 8·(10 + L) µs (Bluetooth Core Spec Vol 6 Part B §2.1); repeats are an assumption",
} as const satisfies Radio;

const KINETIC_ACTIVITY = {
  sleepCurrentUa: 0,
  sensingEnergyUj: 0,
  reportingIntervalS: null,
  heartbeatS: null,
  isTypical: true,
  source: "A kinetic switch is unpowered between presses: it neither sleeps nor reports",
} as const satisfies Activity;

const SENSOR_NOTE = "Assumption, no source: replace with the maker's figures";

export const KIND_ACTIVITY = {
  "kinetic-rocker": KINETIC_ACTIVITY,
  "kinetic-call-button": KINETIC_ACTIVITY,
  "kinetic-door-handle": KINETIC_ACTIVITY,
  // A motion detector front end draws continuously, so it shows as sleep current; motion is reported as it happens.
  "solar-motion-light": { sleepCurrentUa: 3, sensingEnergyUj: 10, reportingIntervalS: 300, heartbeatS: 3600, isTypical: true, source: SENSOR_NOTE },
  "solar-contact": { sleepCurrentUa: 0.5, sensingEnergyUj: 0, reportingIntervalS: null, heartbeatS: 3600, isTypical: true, source: SENSOR_NOTE },
  "light-sensor": { sleepCurrentUa: 1, sensingEnergyUj: 5, reportingIntervalS: 60, heartbeatS: 3600, isTypical: true, source: SENSOR_NOTE },
  "climate-sensor": { sleepCurrentUa: 1, sensingEnergyUj: 20, reportingIntervalS: 300, heartbeatS: 3600, isTypical: true, source: SENSOR_NOTE },
} as const satisfies Record<string, Activity>;

export const OUTPUT_DEFAULTS = {
  "mesh-lightness": { interface: "mesh-lightness", minLevelPct: 1, flicker: null, isTypical: true, source: "Assumption, no source: enter the luminaire's minimum" },
  "0-10v": { interface: "0-10v", minLevelPct: 10, flicker: null, isTypical: true, source: "Common practice, no source: many 0–10 V drivers stop at about 10 %" },
  // Arc level 1 of the logarithmic curve; the driver's physical minimum may be higher.
  dali: { interface: "dali", minLevelPct: 0.1, flicker: null, isTypical: true, source: "Lowest level of the DALI curve (IEC 62386-102 clause M)" },
} as const satisfies { [I in DimmedOutput["interface"]]: DimmedOutput & { interface: I } };
