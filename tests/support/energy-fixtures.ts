import type { KineticDeviceInput, MessageSource, SolarDeviceInput } from "@/lib/energy/types";

/** Hand-checkable inputs for the Energy budget's unit tests. */
export function kineticInput(over: Partial<KineticDeviceInput> = {}): KineticDeviceInput {
  return {
    deviceId: "k1",
    name: "Test rocker",
    kind: "kinetic-rocker",
    zoneId: null,
    zoneName: null,
    typicalSections: [],
    observed: null,
    power: "kinetic",
    energy: {
      harvester: { type: "kinetic", energyPerActuationUj: 300, conversionEfficiencyPct: 100 },
      storage: { capacitance: { value: 470, unit: "uF" }, vMax: 3.3, vMin: 1.8, leakageUa: 0 },
      radio: { supplyV: 3, txCurrentMa: 5, phy: "1M", repeats: 2, channels: 3 },
      activity: { sleepCurrentUa: 0, sensingEnergyUj: 0, reportingIntervalS: null, heartbeatS: null },
    },
    messages: [{ id: "press", label: "Press message", cause: "profile", ruleNodeIds: [], count: 1, withSensing: false, formula: "", inputs: [] }],
    actuationsPerDay: { value: 20, source: "test" },
    ...over,
  };
}

export const periodic = (intervalS: number, cause: MessageSource["cause"] = "profile", ruleNodeIds: string[] = []): MessageSource => ({
  id: "periodic",
  label: "Periodic",
  cause,
  ruleNodeIds,
  count: 86_400 / intervalS,
  withSensing: true,
  intervalS,
  formula: "",
  inputs: [],
});

/** A solar sensor under a light `levelPct(hour)` of `luxAtFull`, interior, over one week. */
export function solarInput({ levelPct = () => 100, luxAtFull = 315, messages = [periodic(300)], leakageUa = 0, sleepCurrentUa = 0 }: { levelPct?: (h: number) => number; luxAtFull?: number; messages?: MessageSource[]; leakageUa?: number; sleepCurrentUa?: number } = {}): SolarDeviceInput {
  const hours = Array.from({ length: 168 }, (_, h) => h);
  return {
    deviceId: "s1",
    name: "Test sensor",
    kind: "climate-sensor",
    zoneId: null,
    zoneName: null,
    typicalSections: [],
    observed: null,
    power: "solar",
    energy: {
      harvester: { type: "solar", cellAreaCm2: 10, efficiencyPct: 10, exposure: "interior", daylightFactorPct: 0 },
      storage: { capacitance: { value: 0.47, unit: "F" }, vMax: 3.6, vMin: 2.2, leakageUa },
      radio: { supplyV: 3, txCurrentMa: 5, phy: "1M", repeats: 2, channels: 3 },
      activity: { sleepCurrentUa, sensingEnergyUj: 20, reportingIntervalS: 300, heartbeatS: null },
    },
    messages,
    light: { hourStarts: hours.map((h) => h * 3_600_000), zoneLevelPct: hours.map(levelPct), zoneLevelSource: "test", luxAtFull, outdoorLux: hours.map(() => 0), weekLabel: "test week" },
  };
}
