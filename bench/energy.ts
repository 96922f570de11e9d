/**
 * Energy budget speed: a year hour by hour (8,760 h) for 1,000 battery-free
 * devices through the real model (evaluateDevice: hourly harvest, the store
 * run until it settles, every figure and its explanation), against a baseline
 * measured in the same run: a bare loop doing only "store += harvest − spend,
 * clamp" over the same hours. Also the site-level work done once per budget
 * (daylight from sun positions, zone levels by replaying the rules' schedules
 * for the year) and the browser's what-if: one device's week recomputed.
 * Input is synthetic and seeded, so every run sees the same.
 * Run: npx tsx bench/energy.ts
 */
import os from "node:os";
import { performance } from "node:perf_hooks";
import { demoDevices, demoScenes, demoSite, demoZones } from "@/db/seed/demo-site";
import { toSiteInput } from "@/lib/bus/site-input";
import { defaultProfile } from "@/lib/catalogue/profiles";
import { daylightByHour } from "@/lib/energy/daylight";
import { evaluateDevice } from "@/lib/energy/model";
import { budgetWeek, siteEnergyBudget } from "@/lib/energy/site";
import type { MessageSource, SolarDeviceInput } from "@/lib/energy/types";
import { zoneLightByHour } from "@/lib/energy/zone-light";
import { compileGraph } from "@/lib/rules/compile";
import { demoRuleGraph } from "@/lib/rules/demo-graph";
import { localToInstant } from "@/lib/sun/local-time";
import { prng } from "../lib/random/prng";

const SEED = 20240620;
const DEVICES = Number(process.env.BENCH_DEVICES ?? 1000);
const HOURS = 8760;
const HOUR_MS = 3_600_000;
const REPEATS = 3;

const ms = (t: number) => `${t.toFixed(1)} ms`;
const us = (t: number) => `${(t * 1000).toFixed(1)} µs`;
function best<T>(run: () => T): { ms: number; out: T } {
  let bestMs = Number.POSITIVE_INFINITY;
  let out!: T;
  for (let i = 0; i < REPEATS; i++) {
    const t0 = performance.now();
    out = run();
    bestMs = Math.min(bestMs, performance.now() - t0);
  }
  return { ms: bestMs, out };
}

console.log(`node ${process.version}, ${os.cpus().length} CPUs (${os.cpus()[0]?.model ?? "?"})`);
console.log(`${DEVICES} devices × ${HOURS} hours (a year), best of ${REPEATS}\n`);

// ——— site-level work, once per budget: a year of hours at the demo site ———
const hourStarts = Array.from({ length: HOURS }, (_, h) => localToInstant({ year: 2025, month: 1, day: 6 }, 0, demoSite.timeZone) + h * HOUR_MS);
const siteInput = toSiteInput({ site: demoSite, devices: demoDevices, zones: demoZones, scenes: demoScenes });
const rules = compileGraph(demoRuleGraph);
const daylight = best(() => daylightByHour(hourStarts, demoSite.latitude, demoSite.longitude));
const zones = best(() => zoneLightByHour(siteInput, rules, hourStarts));
const outdoorLux = daylight.out.map((d) => d.outdoorLux);
const zoneRows = [...zones.out.values()].map((z) => z.levelPct);

// ——— 1,000 synthetic solar devices over the year ———
const rand = prng(SEED);
const base = defaultProfile("climate-sensor").energy;
const periodic = (s: number): MessageSource => ({ id: "periodic", label: "Periodic", cause: "profile", ruleNodeIds: [], count: 86_400 / s, withSensing: true, intervalS: s, formula: "", inputs: [] });
const inputs: SolarDeviceInput[] = Array.from({ length: DEVICES }, (_, i) => {
  const nearWindow = rand() < 0.3;
  return {
    deviceId: `d${i}`,
    name: `Device ${i}`,
    kind: "climate-sensor",
    zoneId: null,
    zoneName: null,
    typicalSections: [],
    observed: null,
    power: "solar",
    energy: {
      ...base,
      harvester: { type: "solar", cellAreaCm2: 2 + rand() * 10, efficiencyPct: 5 + rand() * 15, exposure: nearWindow ? "near-window" : "interior", daylightFactorPct: nearWindow ? 1 + rand() * 4 : 0 },
      storage: { ...base.storage, leakageUa: rand() },
    },
    messages: [periodic([10, 60, 300, 900][Math.floor(rand() * 4)]), { ...periodic(3600), id: "heartbeat", intervalS: undefined, withSensing: false }],
    light: { hourStarts, zoneLevelPct: zoneRows[i % zoneRows.length], zoneLevelSource: "bench", luxAtFull: 200 + rand() * 400, outdoorLux, weekLabel: "a year" },
  };
});

// Baseline: the bare store loop over the same hours, with harvest already known (the ceiling of any hourly model).
const harvests = inputs.map((inp, i) => Float64Array.from({ length: HOURS }, (_, h) => (inp.light.zoneLevelPct[h] * 3 + outdoorLux[h] * 0.01 + i) % 90));
const bare = best(() => {
  let sink = 0;
  for (const harvest of harvests) {
    let e = 1e6;
    for (let h = 0; h < HOURS; h++) {
      e += harvest[h] - 40;
      if (e < 0) e = 0;
      else if (e > 2e6) e = 2e6;
    }
    sink += e;
  }
  return sink;
});
const model = best(() => inputs.map((inp) => evaluateDevice(inp)));
const verdicts = model.out.reduce<Record<string, number>>((n, r) => ({ ...n, [r.verdict]: (n[r.verdict] ?? 0) + 1 }), {});

// The browser's what-if: one device's week (168 h) recomputed with a changed interval.
const week = budgetWeek("shortest", demoSite.latitude, demoSite.timeZone, Date.UTC(2025, 0, 1));
const demoBudget = siteEnergyBudget({ site: demoSite, devices: demoDevices.map((d) => ({ id: d.id!, name: d.name, kind: d.kind, zoneId: d.zoneId ?? null, unicastAddress: d.unicastAddress, profile: d.profile })), zones: demoZones, scenes: demoScenes, graph: demoRuleGraph, observed: new Map(), week: "shortest", now: Date.UTC(2025, 0, 1) });
const caseA = demoBudget.devices.find((d) => d.input.deviceId.endsWith("climate-case-a"))!.input;
const whatIfRuns = 2000;
const whatIf = best(() => {
  for (let i = 0; i < whatIfRuns; i++) evaluateDevice(caseA, { reportingIntervalS: 10 + (i % 600) });
});
const siteBudget = best(() => siteEnergyBudget({ site: demoSite, devices: demoDevices.map((d) => ({ id: d.id!, name: d.name, kind: d.kind, zoneId: d.zoneId ?? null, unicastAddress: d.unicastAddress, profile: d.profile })), zones: demoZones, scenes: demoScenes, graph: demoRuleGraph, observed: new Map(), week: "shortest", now: Date.UTC(2025, 0, 1) }));

console.log("Site-level, once per budget (a year of hours):");
console.log(`  daylight from sun positions   ${ms(daylight.ms)}  (${us(daylight.ms / HOURS)} per hour)`);
console.log(`  zone levels, rules replayed    ${ms(zones.ms)}  (${us(zones.ms / HOURS)} per hour, ${zones.out.size} zones)`);
console.log("\nPer device, a year hour by hour:");
console.log(`  baseline: bare store loop      ${ms(bare.ms)}  = ${us(bare.ms / DEVICES)} per device`);
console.log(`  evaluateDevice (full model)    ${ms(model.ms)}  = ${us(model.ms / DEVICES)} per device  (${(model.ms / bare.ms).toFixed(1)}× the baseline)`);
console.log(`  verdicts: ${JSON.stringify(verdicts)}`);
console.log("\nThe page:");
console.log(`  demo site budget, 10 devices (${week.label})  ${ms(siteBudget.ms)}`);
console.log(`  what-if, one device's week     ${us(whatIf.ms / whatIfRuns)} per recompute  (${((whatIf.ms / whatIfRuns / 16.7) * 100).toFixed(2)} % of a 60 Hz frame)`);
