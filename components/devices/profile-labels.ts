/** Field labels with units for the profile editor; anything not listed shows its key. */
export const PROFILE_LABELS: Record<string, string> = {
  energy: "Energy",
  harvester: "Harvester",
  storage: "Storage",
  radio: "Radio",
  activity: "Activity",
  output: "Output",
  flicker: "Flicker (measured)",
  capacitance: "Capacitance",
  energyPerActuationUj: "Energy per actuation (µJ)",
  conversionEfficiencyPct: "Conversion efficiency (%)",
  cellAreaCm2: "Solar cell area (cm²)",
  efficiencyPct: "Cell efficiency (%)",
  exposure: "Exposure",
  daylightFactorPct: "Daylight factor (%)",
  vMax: "V max (V)",
  vMin: "V min (V)",
  leakageUa: "Leakage (µA)",
  supplyV: "Supply (V)",
  txCurrentMa: "TX current (mA)",
  phy: "PHY",
  repeats: "Repeats",
  channels: "Channels",
  sleepCurrentUa: "Sleep current (µA)",
  sensingEnergyUj: "Sensing energy per reading (µJ)",
  reportingIntervalS: "Reporting interval (s)",
  heartbeatS: "Heartbeat (s)",
  minLevelPct: "Minimum level (%)",
  pwmFrequencyHz: "PWM frequency (Hz)",
  modulationDepthPct: "Modulation depth (%)",
  value: "Value",
  unit: "Unit",
  buttons: "Buttons",
};

export const PROFILE_CHOICES: Record<string, string[]> = {
  phy: ["1M", "2M"],
  exposure: ["interior", "near-window"],
  unit: ["F", "uF"],
};

/** Shown, not edited here: what kind of thing it is, and the bookkeeping of typical values. */
export const READ_ONLY_KEYS = new Set(["type", "interface", "isTypical", "source"]);
