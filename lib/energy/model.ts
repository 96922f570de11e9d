import { capacitanceFarads, usableStorageEnergyJ } from "@/lib/catalogue/profiles";
import { ENERGY_CONSTANTS as C, SECONDS_PER_DAY } from "./constants";
import { cellPowerUw, currentPowerUw, irradianceUwPerCm2, messageEnergy } from "./physics";
import { steadyWeek } from "./simulate";
import type { DeviceEnergyInput, DeviceEnergyResult, Explanation, KineticDeviceInput, MessageSource, SolarDeviceInput, Verdict, WhatIf } from "./types";

/**
 * The Energy budget of one battery-free device: pure and synchronous, so the
 * server computes it for the table and the browser recomputes it for the
 * what-if controls with the same code. Every number in the result has an
 * explanation with its formula and inputs.
 */
export function evaluateDevice(input: DeviceEnergyInput, whatIf: WhatIf = {}): DeviceEnergyResult {
  const result = input.power === "solar" ? evaluateSolar(applySolarWhatIf(input, whatIf)) : evaluateKinetic(applyKineticWhatIf(input, whatIf));
  const ruleSources = input.messages.filter((m) => m.cause === "rule");
  if (result.verdict === "covered" || ruleSources.length === 0) return result;
  // What would the verdict be if the rules asked for nothing beyond the device's own settings?
  const relaxed = { ...input, messages: withoutRuleDemands(input) } as DeviceEnergyInput;
  const without = relaxed.power === "solar" ? evaluateSolar(applySolarWhatIf(relaxed, { ...whatIf, reportingIntervalS: undefined })) : evaluateKinetic(applyKineticWhatIf(relaxed, whatIf));
  if (rank(without.verdict) >= rank(result.verdict)) return result;
  return { ...result, ruleImpact: { ruleNodeIds: [...new Set(ruleSources.flatMap((m) => m.ruleNodeIds))], verdictWithout: without.verdict } };
}

const rank = (v: Verdict) => ({ covered: 0, tight: 1, short: 2 })[v];

export function verdictOf(margin: number, hasBrownout: boolean): Verdict {
  if (margin < 0 || hasBrownout) return "short";
  return margin < C.tightMargin.value ? "tight" : "covered";
}

function withoutRuleDemands(input: DeviceEnergyInput): MessageSource[] {
  return input.messages.flatMap((m): MessageSource[] => {
    if (m.cause !== "rule") return [m];
    if (input.power === "solar" && m.intervalS !== undefined) {
      const own = input.energy.activity.reportingIntervalS;
      return own ? [{ ...m, cause: "profile", ruleNodeIds: [], intervalS: own, count: SECONDS_PER_DAY / own }] : [];
    }
    // A kinetic message only a rule needs (e.g. the release for a long press).
    return [];
  });
}

function applySolarWhatIf(input: SolarDeviceInput, w: WhatIf): SolarDeviceInput {
  const energy = {
    ...input.energy,
    harvester: w.cellAreaCm2 !== undefined ? { ...input.energy.harvester, cellAreaCm2: w.cellAreaCm2 } : input.energy.harvester,
    radio: w.repeats !== undefined ? { ...input.energy.radio, repeats: w.repeats } : input.energy.radio,
  };
  const messages = w.reportingIntervalS === undefined ? input.messages : withInterval(input.messages, w.reportingIntervalS);
  const light = w.luxAtFull !== undefined ? { ...input.light, luxAtFull: w.luxAtFull } : input.light;
  return { ...input, energy, messages, light };
}

function withInterval(messages: MessageSource[], intervalS: number): MessageSource[] {
  const periodic = messages.find((m) => m.intervalS !== undefined);
  const next: MessageSource = {
    id: "periodic",
    label: "Periodic reports (what-if)",
    cause: periodic?.cause ?? "profile",
    ruleNodeIds: periodic?.ruleNodeIds ?? [],
    count: SECONDS_PER_DAY / intervalS,
    withSensing: true,
    intervalS,
    formula: "86 400 s ÷ reporting interval",
    inputs: [{ label: "Reporting interval (what-if)", value: intervalS, unit: "s" }],
  };
  return periodic ? messages.map((m) => (m === periodic ? next : m)) : [...messages, next];
}

function applyKineticWhatIf(input: KineticDeviceInput, w: WhatIf): KineticDeviceInput {
  if (w.repeats === undefined) return input;
  return { ...input, energy: { ...input.energy, radio: { ...input.energy.radio, repeats: w.repeats } } };
}

const round = (x: number, digits = 3) => Number(x.toPrecision(digits));

function radioExplanation(input: DeviceEnergyInput, msg: ReturnType<typeof messageEnergy>): Explanation {
  const r = input.energy.radio;
  return {
    id: "message-energy",
    label: "Energy per message",
    value: msg.totalUj,
    unit: "µJ",
    formula: "V × I_tx × (t_air + t_ramp) × channels × (repeats + 1) + E_wake",
    inputs: [
      { label: "Supply", value: r.supplyV, unit: "V" },
      { label: "TX current", value: r.txCurrentMa, unit: "mA" },
      { label: `Airtime, LE ${r.phy}, ${C.advPayloadOctets.value}-octet payload`, value: msg.airtimeUs, unit: "µs", source: `8·(10 + L) µs on 1M, 4·(11 + L) µs on 2M (Bluetooth Core Spec Vol 6 Part B §2.1); ${C.advPayloadOctets.source}` },
      { label: "Radio start-up per channel", value: C.rampUs.value, unit: "µs", source: C.rampUs.source },
      { label: "Advertising channels", value: r.channels },
      { label: "Transmissions (repeats + 1)", value: msg.transmissions },
      { label: "Wake-up per message", value: C.wakeUj.value, unit: "µJ", source: C.wakeUj.source },
    ],
  };
}

function storageExplanation(input: DeviceEnergyInput): { usableJ: number; explanation: Explanation } {
  const st = input.energy.storage;
  const farads = capacitanceFarads(st.capacitance);
  const usableJ = usableStorageEnergyJ(farads, st.vMax, st.vMin);
  return {
    usableJ,
    explanation: {
      id: "storage",
      label: "Usable stored energy",
      value: usableJ,
      unit: "J",
      formula: "½ × C × (V₁² − V₂²)",
      inputs: [
        { label: "Capacitance", value: st.capacitance.value, unit: st.capacitance.unit === "uF" ? "µF" : "F" },
        { label: "Full (V₁)", value: st.vMax, unit: "V" },
        { label: "Lowest working (V₂)", value: st.vMin, unit: "V", source: "physics handbook" },
      ],
    },
  };
}

function evaluateKinetic(input: KineticDeviceInput): DeviceEnergyResult {
  const { harvester } = input.energy;
  const msg = messageEnergy(input.energy.radio);
  const storage = storageExplanation(input);
  const harvestedUj = harvester.energyPerActuationUj * (harvester.conversionEfficiencyPct / 100);
  // The buffer capacitor can only hand on what it holds.
  const availableUj = Math.min(harvestedUj, storage.usableJ * 1e6);
  const needed = input.messages.reduce((n, m) => n + m.count, 0);
  const affordable = Math.floor(availableUj / msg.totalUj);
  const neededUj = needed * msg.totalUj;
  const margin = neededUj > 0 ? availableUj / neededUj - 1 : Number.POSITIVE_INFINITY;
  const perDay = input.actuationsPerDay.value;
  const explanations: Explanation[] = [
    radioExplanation(input, msg),
    storage.explanation,
    {
      id: "per-actuation",
      label: "Energy one actuation delivers",
      value: availableUj,
      unit: "µJ",
      formula: "min(energy per actuation × conversion efficiency, usable stored energy)",
      inputs: [
        { label: "Energy per actuation", value: harvester.energyPerActuationUj, unit: "µJ", source: harvester.source },
        { label: "Conversion efficiency", value: harvester.conversionEfficiencyPct, unit: "%" },
        { label: "Usable stored energy", value: round(storage.usableJ * 1e6), unit: "µJ" },
      ],
    },
    {
      id: "affordable",
      label: "Messages one actuation pays for",
      value: affordable,
      unit: "messages",
      formula: "⌊energy one actuation delivers ÷ energy per message⌋",
      inputs: [
        { label: "Energy one actuation delivers", value: round(availableUj), unit: "µJ" },
        { label: "Energy per message", value: round(msg.totalUj), unit: "µJ" },
      ],
    },
    {
      id: "needed",
      label: "Messages the rules send per actuation",
      value: needed,
      unit: "messages",
      formula: "sum of the messages below",
      inputs: input.messages.map((m) => ({ label: m.label, value: m.count, unit: "messages", source: m.cause === "rule" ? `rule ${m.ruleNodeIds.join(", ")}` : m.formula })),
    },
    marginExplanation(margin, "energy one actuation delivers ÷ (messages per actuation × energy per message) − 1", [
      { label: "Energy one actuation delivers", value: round(availableUj), unit: "µJ" },
      { label: "Energy the messages need", value: round(neededUj), unit: "µJ" },
    ]),
    {
      id: "per-day",
      label: "Energy harvested and spent per day",
      value: (perDay * availableUj) / 1e6,
      unit: "J/day",
      formula: "actuations per day × energy per actuation (spent: × messages per actuation × energy per message)",
      inputs: [
        { label: "Actuations per day", value: perDay, source: input.actuationsPerDay.source },
        { label: "Spent per day", value: round((perDay * neededUj) / 1e6), unit: "J/day" },
      ],
    },
  ];
  return {
    deviceId: input.deviceId,
    verdict: verdictOf(margin, false),
    margin,
    harvestPerDayJ: (perDay * availableUj) / 1e6,
    spendPerDayJ: (perDay * neededUj) / 1e6,
    messagesPerDay: perDay * needed,
    messageEnergyUj: msg.totalUj,
    usableStorageJ: storage.usableJ,
    darkHours: null,
    leastLux: null,
    maxMessagesPerDay: null,
    shortestIntervalS: null,
    kinetic: { affordablePerActuation: affordable, neededPerActuation: needed, energyPerActuationUj: availableUj },
    week: null,
    ruleImpact: null,
    explanations,
  };
}

function marginExplanation(margin: number, formula: string, inputs: Explanation["inputs"]): Explanation {
  return {
    id: "margin",
    label: "Margin",
    value: margin * 100,
    unit: "%",
    formula,
    inputs,
    note: `Short below 0 % (or if it browns out), Tight below ${C.tightMargin.value * 100} % (${C.tightMargin.source}), Covered above.`,
  };
}

// A plain loop: Array.from with a map function is several times slower on long series.
function toJoules(uj: Float64Array): number[] {
  const out = new Array<number>(uj.length);
  for (let i = 0; i < uj.length; i++) out[i] = uj[i] / 1e6;
  return out;
}

/** Hourly harvest of a solar device, µJ per hour. */
export function hourlyHarvestUj(input: SolarDeviceInput): Float64Array {
  const { harvester } = input.energy;
  const { light } = input;
  const dayFactor = harvester.exposure === "near-window" ? harvester.daylightFactorPct / 100 : 0;
  const out = new Float64Array(light.zoneLevelPct.length);
  for (let h = 0; h < out.length; h++) {
    const irr = irradianceUwPerCm2((light.zoneLevelPct[h] / 100) * light.luxAtFull, C.ledLer.value) + irradianceUwPerCm2(light.outdoorLux[h] * dayFactor, C.daylightLer.value);
    out[h] = cellPowerUw(harvester.cellAreaCm2, harvester.efficiencyPct, irr) * 3600;
  }
  return out;
}

function countLit(input: SolarDeviceInput): number {
  const { harvester } = input.energy;
  const dayFactor = harvester.exposure === "near-window" ? harvester.daylightFactorPct / 100 : 0;
  const { zoneLevelPct, outdoorLux, luxAtFull } = input.light;
  let n = 0;
  for (let h = 0; h < zoneLevelPct.length; h++) if ((zoneLevelPct[h] / 100) * luxAtFull + outdoorLux[h] * dayFactor >= 1) n++;
  return n;
}

/** Illuminance at the device each hour (artificial + daylight through the window), lx. */
export function hourlyLux(input: SolarDeviceInput): number[] {
  const { harvester } = input.energy;
  const dayFactor = harvester.exposure === "near-window" ? harvester.daylightFactorPct / 100 : 0;
  return input.light.zoneLevelPct.map((pct, h) => (pct / 100) * input.light.luxAtFull + input.light.outdoorLux[h] * dayFactor);
}

function evaluateSolar(input: SolarDeviceInput): DeviceEnergyResult {
  const { harvester, activity, radio, storage: st } = input.energy;
  const msg = messageEnergy(radio);
  const storage = storageExplanation(input);
  const harvest = hourlyHarvestUj(input);
  const days = harvest.length / 24;
  let harvestUj = 0;
  for (const x of harvest) harvestUj += x;
  const harvestPerDayUj = harvestUj / days;

  const sleepUw = currentPowerUw(activity.sleepCurrentUa, radio.supplyV);
  // Leakage at full voltage: the worst case, and where a solar store spends most of its time.
  const leakUw = currentPowerUw(st.leakageUa, st.vMax);
  const fixedPerDayUj = (sleepUw + leakUw) * SECONDS_PER_DAY;
  const messagesPerDay = input.messages.reduce((n, m) => n + m.count, 0);
  const sensingPerDayUj = input.messages.reduce((n, m) => n + (m.withSensing ? m.count * activity.sensingEnergyUj : 0), 0);
  const messagesPerDayUj = messagesPerDay * msg.totalUj;
  const spendPerDayUj = fixedPerDayUj + sensingPerDayUj + messagesPerDayUj;

  const week = steadyWeek(harvest, spendPerDayUj / 24, storage.usableJ * 1e6);
  const margin = spendPerDayUj > 0 ? harvestPerDayUj / spendPerDayUj - 1 : Number.POSITIVE_INFINITY;
  const verdict = verdictOf(margin, week.brownoutHours.length > 0);

  const litHours = countLit(input) / days;
  const hoursForLeast = litHours > 0 ? litHours : 8;
  const uwPerLux = cellPowerUw(harvester.cellAreaCm2, harvester.efficiencyPct, irradianceUwPerCm2(1, C.ledLer.value));
  const leastLux = spendPerDayUj / (hoursForLeast * 3600 * uwPerLux);
  const darkHours = (storage.usableJ * 1e6) / (spendPerDayUj / 24);

  // Periodic reports are what a rule or a setting can change: how many could the harvest carry?
  const periodic = input.messages.filter((m) => m.intervalS !== undefined);
  const otherUj = spendPerDayUj - periodic.reduce((n, m) => n + m.count * (msg.totalUj + activity.sensingEnergyUj), 0);
  const perReportUj = msg.totalUj + activity.sensingEnergyUj;
  const spare = harvestPerDayUj - otherUj;
  const maxMessagesPerDay = spare > 0 ? spare / perReportUj : null;

  const spendInputs: Explanation["inputs"] = [
    { label: "Sleep", value: round((sleepUw * SECONDS_PER_DAY) / 1e6), unit: "J/day", source: `${activity.sleepCurrentUa} µA × ${radio.supplyV} V × 86 400 s` },
    { label: "Capacitor leakage", value: round((leakUw * SECONDS_PER_DAY) / 1e6), unit: "J/day", source: `${st.leakageUa} µA × ${st.vMax} V × 86 400 s (at full voltage)` },
    { label: "Readings", value: round(sensingPerDayUj / 1e6), unit: "J/day", source: `${activity.sensingEnergyUj} µJ per reading` },
    { label: "Messages", value: round(messagesPerDayUj / 1e6), unit: "J/day", source: `${round(messagesPerDay)} messages × ${round(msg.totalUj)} µJ` },
  ];
  const explanations: Explanation[] = [
    {
      id: "harvest",
      label: "Energy harvested per day",
      value: harvestPerDayUj / 1e6,
      unit: "J/day",
      formula: "Σ hours (cell area × efficiency × (artificial lx ÷ LED efficacy + daylight lx ÷ daylight efficacy) × 100 µW/cm² per W/m² × 3600 s) ÷ days",
      inputs: [
        { label: "Cell area", value: harvester.cellAreaCm2, unit: "cm²" },
        { label: "Cell efficiency", value: harvester.efficiencyPct, unit: "%", source: harvester.source },
        { label: "Illuminance at the device with its zone at 100 %", value: input.light.luxAtFull, unit: "lx", source: C.luxAtFull.source },
        { label: "Zone levels", value: input.light.zoneLevelSource },
        { label: "LED light efficacy", value: C.ledLer.value, unit: "lm/W", source: C.ledLer.source },
        ...(harvester.exposure === "near-window"
          ? [
              { label: "Daylight factor", value: harvester.daylightFactorPct, unit: "%" },
              { label: "Outdoor daylight", value: "overcast sky from the sun's altitude each hour", source: C.overcastB.source },
              { label: "Daylight efficacy", value: C.daylightLer.value, unit: "lm/W", source: C.daylightLer.source },
            ]
          : [{ label: "Daylight", value: "none (interior)" }]),
        { label: "Week", value: input.light.weekLabel },
      ],
    },
    radioExplanation(input, msg),
    {
      id: "messages",
      label: "Messages per day",
      value: messagesPerDay,
      unit: "messages/day",
      formula: "sum of the message streams below",
      inputs: input.messages.map((m) => ({ label: m.label, value: round(m.count), unit: "/day", source: `${m.formula}${m.ruleNodeIds.length ? ` — rule ${m.ruleNodeIds.join(", ")}` : ""}` })),
    },
    { id: "spend", label: "Energy spent per day", value: spendPerDayUj / 1e6, unit: "J/day", formula: "sleep + leakage + readings + messages", inputs: spendInputs },
    storage.explanation,
    marginExplanation(margin, "harvest per day ÷ spend per day − 1", [
      { label: "Harvest", value: round(harvestPerDayUj / 1e6), unit: "J/day" },
      { label: "Spend", value: round(spendPerDayUj / 1e6), unit: "J/day" },
      { label: "Brown-out hours in the week", value: week.brownoutHours.length, unit: "h" },
    ]),
    {
      id: "dark-hours",
      label: "Hours in darkness from full",
      value: darkHours,
      unit: "h",
      formula: "usable stored energy ÷ spend per hour",
      inputs: [
        { label: "Usable stored energy", value: round(storage.usableJ), unit: "J" },
        { label: "Spend per hour", value: round(spendPerDayUj / 24 / 1e6), unit: "J/h" },
      ],
    },
    {
      id: "least-lux",
      label: "Least illuminance needed",
      value: leastLux,
      unit: "lx",
      formula: "spend per day ÷ (hours lit × 3600 s × cell area × efficiency × 100 ÷ LED efficacy)",
      inputs: [
        { label: "Hours lit a day", value: round(hoursForLeast), unit: "h", source: litHours > 0 ? "hours with ≥ 1 lx in the week, per day" : "none lit now: 8 h assumed" },
        { label: "Spend", value: round(spendPerDayUj / 1e6), unit: "J/day" },
        { label: "Cell power per lux", value: round(uwPerLux), unit: "µW/lx" },
      ],
    },
    {
      id: "max-rate",
      label: "Most reports a day it can afford",
      value: maxMessagesPerDay ?? 0,
      unit: "reports/day",
      formula: "(harvest − everything but periodic reports) ÷ (energy per message + energy per reading)",
      inputs: [
        { label: "Harvest", value: round(harvestPerDayUj / 1e6), unit: "J/day" },
        { label: "Everything else", value: round(otherUj / 1e6), unit: "J/day" },
        { label: "Per report", value: round(perReportUj), unit: "µJ" },
      ],
      note: maxMessagesPerDay === null ? "Sleep, leakage and the other messages already use more than the harvest." : `A report every ${round(SECONDS_PER_DAY / maxMessagesPerDay)} s at the most, with no margin.`,
    },
  ];
  return {
    deviceId: input.deviceId,
    verdict,
    margin,
    harvestPerDayJ: harvestPerDayUj / 1e6,
    spendPerDayJ: spendPerDayUj / 1e6,
    messagesPerDay,
    messageEnergyUj: msg.totalUj,
    usableStorageJ: storage.usableJ,
    darkHours,
    leastLux: { lux: leastLux, hoursPerDay: hoursForLeast },
    maxMessagesPerDay,
    shortestIntervalS: maxMessagesPerDay ? SECONDS_PER_DAY / maxMessagesPerDay : null,
    kinetic: null,
    week: { storedJ: toJoules(week.storedUj), brownoutHours: week.brownoutHours },
    ruleImpact: null,
    explanations,
  };
}
