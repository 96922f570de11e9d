/**
 * Engine throughput: events/s for 20, 200 and 2,000 rules through
 *   - the live path (json-rules-engine, one small Engine per trigger key),
 *   - the replay path (the same engine loop with closures),
 *   - json-rules-engine used naively (every rule in one Engine, run per trigger),
 *   - hand-written closures doing only match + gates + "act" (the ceiling),
 * each with its ratio to the ceiling; then p50/p99 per-event latency of the live
 * path at 2,000 rules. Input is synthetic and seeded, so every run sees the same.
 * Run: npx tsx bench/engine.ts
 */
import os from "node:os";
import { performance } from "node:perf_hooks";
import { Engine as RulesEngine } from "json-rules-engine";
import { crosses } from "@/lib/bus/derive";
import { createEngine, createReplayEngine } from "@/lib/bus/engine";
import type { DeviceConfig, DeviceEvent, ZoneConfig } from "@/lib/bus/types";
import { compileGraph, type RuleJson } from "@/lib/rules/compile";
import { parseRuleGraph } from "@/lib/rules/graph";
import { OPERATORS, registerOperators } from "@/lib/rules/registry";
import { buildRuleIndex, type RuleIndex, type ThresholdWatch } from "@/lib/rules/rule-index";
import { prng } from "../lib/random/prng";
import { synthRuleGraph, type SyntheticSite } from "./synthetic-rules";

const SEED = 20240620;
// BENCH_SIZES=200 BENCH_ONLY=replay narrows a run (e.g. under --cpu-prof); the ceiling always runs, for the ratios.
const SIZES = process.env.BENCH_SIZES ? process.env.BENCH_SIZES.split(",").map(Number) : [20, 200, 2000];
const ONLY = process.env.BENCH_ONLY ?? "";
const EVENTS = 20_000;
// The replay path needs ~10^5 events before V8 has compiled its hot paths: warm each figure for a second.
const WARM_MS = 1000;
const MEASURE_MS = 2000;


// ——— a synthetic site: 40 rockers, 16 light sensors, 8 climate sensors, 8 motion sensors, 20 zones × 4 luminaires ———
const devices: DeviceConfig[] = [];
const zones: ZoneConfig[] = [];
let address = 1;
const add = (id: string, kind: DeviceConfig["kind"], zoneId: string | null) => devices.push({ id, kind, zoneId, unicastAddress: address++ });
for (let z = 0; z < 20; z++) {
  zones.push({ id: `z${z}`, groupAddress: 0xc000 + z });
  for (let l = 0; l < 4; l++) add(`lum-${z}-${l}`, "mesh-luminaire", `z${z}`);
}
for (let i = 0; i < 40; i++) add(`rocker-${i}`, "kinetic-rocker", `z${i % 20}`);
for (let i = 0; i < 16; i++) add(`lux-${i}`, "light-sensor", `z${i % 20}`);
for (let i = 0; i < 8; i++) add(`climate-${i}`, "climate-sensor", `z${i}`);
for (let i = 0; i < 8; i++) add(`motion-${i}`, "solar-motion-light", `z${i}`);
const site = { site: { timeZone: "WET", latitude: 51.2, longitude: -2.1 }, devices, zones, scenes: [] };

// Rocker i is in zone i % 20; gates name the first 8 zones, actions any of the 20.
const range = (n: number, name: (i: number) => string) => Array.from({ length: n }, (_, i) => name(i));
const synthSite: SyntheticSite = {
  rockers: range(40, (i) => `rocker-${i}`),
  luxSensors: range(16, (i) => `lux-${i}`),
  climateSensors: range(8, (i) => `climate-${i}`),
  motionSensors: range(8, (i) => `motion-${i}`),
  occupiedZones: range(8, (i) => `z${i}`),
  actionZones: range(20, (i) => `z${i}`),
};
const synthGraph = (count: number, rand: () => number) => synthRuleGraph(count, rand, synthSite, { rocker: 0.55, lux: 0.25, temperature: 0.1, motion: 0.1, vacancy: 0 });

function synthEvents(rand: () => number): DeviceEvent[] {
  const events: DeviceEvent[] = [];
  let at = Date.UTC(2024, 5, 20, 6);
  for (let i = 0; i < EVENTS; i++) {
    at += Math.floor(rand() * 5_000);
    const r = rand();
    const [device, kind, value] =
      r < 0.6 ? [`rocker-${Math.floor(rand() * 40)}`, "press", 1 + Math.floor(rand() * 4)]
      : r < 0.85 ? [`lux-${Math.floor(rand() * 16)}`, "light-level", Math.floor(rand() * 1100)]
      : r < 0.95 ? [`climate-${Math.floor(rand() * 8)}`, "temperature", 18 + Math.floor(rand() * 140) / 10]
      : [`motion-${Math.floor(rand() * 8)}`, "motion", true];
    events.push({ id: `b${i}`, siteId: "bench", at, device: device as string, kind: kind as string, value: value as number | boolean });
  }
  return events;
}

/**
 * Event n of an endless stream: the seeded events again and again, each lap with
 * new ids and later times, so an engine never sees a repeat or time going back.
 * The stateless baselines read the seeded events directly.
 */
function streamFor(events: DeviceEvent[]) {
  const span = events[events.length - 1].at - events[0].at + 5_000;
  return (n: number): DeviceEvent => {
    const e = events[n % events.length];
    const lap = Math.floor(n / events.length);
    if (lap === 0) return e;
    return { id: `${e.id}.${lap}`, siteId: e.siteId, at: e.at + lap * span, device: e.device, kind: e.kind, value: e.value };
  };
}

/** Derivation shared by the two baselines: the trigger keys an event amounts to (no timers needed here). */
function keysOf(e: DeviceEvent, watches: Map<string, ThresholdWatch[]>, sides: Record<string, "above" | "below">): string[] {
  if (e.kind === "press") return [`rocker-press|${e.device}|${e.value}`];
  if (e.kind === "motion") return [`motion-detected|${e.device}`];
  const measure = e.kind === "light-level" ? "lux" : "temperature";
  return (watches.get(e.device) ?? []).filter((w) => w.measure === measure && crosses(w, e.value as number, sides)).map((w) => w.key);
}

type Processor = { step(n: number): void | Promise<unknown> };
type Maker = (index: RuleIndex, rules: RuleJson[], events: DeviceEvent[]) => Processor;

function baselineState(index: RuleIndex) {
  const watches = new Map<string, ThresholdWatch[]>();
  for (const w of index.watches.thresholds) watches.set(w.device, [...(watches.get(w.device) ?? []), w]);
  return { watches, sides: {} as Record<string, "above" | "below">, lux: {} as Record<string, number>, occupied: {} as Record<string, boolean>, mode: "open", acted: 0 };
}

const makers: Record<string, Maker> = {
  "hand-written closures (ceiling)": (index, _rules, events) => {
    const s = baselineState(index);
    // Gates specialised by hand: what the best possible evaluator costs.
    const compiled = new Map(
      [...index.groups].map(([key, g]) => [key, g.rules.map((r) => ({ actions: r.params.actions.length, gates: r.json.conditions.all.map((c) => {
        const op = OPERATORS[c.operator];
        const read = c.fact === "site-mode" ? () => s.mode : c.fact.startsWith("lux:") ? ((id) => () => s.lux[id] ?? null)(c.fact.slice(4)) : c.fact.startsWith("occupied:") ? () => false : c.fact === "weekday" ? () => "thu" : () => ({ minute: 600, sunrise: 300, sunset: 1260 });
        return () => op(read(), c.value);
      }) }))]),
    );
    return { step(n) {
      const e = events[n % events.length];
      if (e.kind === "light-level") s.lux[e.device] = e.value as number;
      for (const key of keysOf(e, s.watches, s.sides)) for (const r of compiled.get(key) ?? []) if (r.gates.every((g) => g())) s.acted += r.actions;
    } };
  },
  "replay path (closures, no trace: Replay's mode)": (index, _rules, events) => {
    const engine = createReplayEngine({ ...site, rules: index }, { trace: false });
    const next = streamFor(events);
    return { step: (n) => void engine.ingest(next(n)) };
  },
  "replay path (closures, full trace)": (index, _rules, events) => {
    const engine = createReplayEngine({ ...site, rules: index });
    const next = streamFor(events);
    return { step: (n) => void engine.ingest(next(n)) };
  },
  "live path (json-rules-engine per trigger key)": (index, _rules, events) => {
    const engine = createEngine({ ...site, rules: index });
    const next = streamFor(events);
    return { step: (n) => engine.ingest(next(n)) };
  },
  "json-rules-engine naive (one Engine)": (index, rules, events) => {
    const s = baselineState(index);
    const engine = new RulesEngine([], { allowUndefinedFacts: true });
    registerOperators(engine);
    for (const r of rules) engine.addRule({ ...r, conditions: { all: [{ fact: "trigger", operator: "is", value: r.event.params.triggerKey }, ...r.conditions.all] } });
    for (const f of new Set(rules.flatMap((r) => r.conditions.all.map((c) => c.fact)))) {
      engine.addFact(f, () => (f === "site-mode" ? s.mode : f.startsWith("lux:") ? (s.lux[f.slice(4)] ?? null) : f === "weekday" ? "thu" : f.startsWith("occupied:") ? false : { minute: 600, sunrise: 300, sunset: 1260 }));
    }
    return { async step(n) {
      const e = events[n % events.length];
      if (e.kind === "light-level") s.lux[e.device] = e.value as number;
      for (const key of keysOf(e, s.watches, s.sides)) s.acted += (await engine.run({ trigger: key })).events.length;
    } };
  },
};

async function rate(make: () => Processor): Promise<number> {
  const drive = async (p: Processor, budget: number) => {
    const start = performance.now();
    let n = 0;
    // Check the clock every 16 events: a clock read would otherwise weigh on the ceiling.
    while ((n & 15) !== 0 || performance.now() - start < budget) {
      const r = p.step(n++);
      if (r) await r;
    }
    return n / ((performance.now() - start) / 1000);
  };
  await drive(make(), WARM_MS);
  return drive(make(), MEASURE_MS);
}

async function main() {
  const cpu = os.cpus();
  console.log(`Engine bench — node ${process.version}, ${cpu.length} CPU (${cpu[0]?.model.trim() ?? "unknown"}), seed ${SEED}`);
  console.log(`${EVENTS} seeded synthetic events, repeated (60 % presses, 25 % light levels, 10 % temperatures, 5 % motion);`);
  console.log(`${MEASURE_MS} ms per figure after ${WARM_MS} ms warm-up. The ceiling only matches and checks gates; both engine paths also`);
  console.log(`keep state, resolve the override stack, encode mesh commands and write the full trace.\n`);
  const events = synthEvents(prng(SEED));
  const rows: string[] = [];
  let index2000: RuleIndex | null = null;
  for (const size of SIZES) {
    const rules = compileGraph(parseRuleGraph(synthGraph(size, prng(SEED + size))));
    const index = buildRuleIndex(rules);
    if (size === 2000) index2000 = index;
    const figures: [string, number][] = [];
    for (const [name, make] of Object.entries(makers)) {
      if (ONLY && !name.includes(ONLY) && !(name.includes("ceiling") && !process.env.BENCH_PROFILE)) continue;
      figures.push([name, await rate(() => make(index, rules, events))]);
    }
    const ceiling = figures.find(([name]) => name.includes("ceiling"))?.[1] ?? NaN;
    for (const [name, r] of figures) rows.push(`${String(size).padStart(5)}  ${name.padEnd(46)} ${Math.round(r).toLocaleString("en").padStart(12)}  ${(r / ceiling).toFixed(3).padStart(7)}`);
    rows.push("");
  }
  console.log(`rules  ${"path".padEnd(46)} ${"events/s".padStart(12)}  ${"× ceil".padStart(7)}`);
  console.log(rows.join("\n"));

  if (!index2000) return;
  // A warm engine (its per-key Engines already built by the figures above), timed event by event.
  const live = createEngine({ ...site, rules: index2000! });
  const next = streamFor(events);
  for (let n = 0; n < 5_000; n++) await live.ingest(next(n));
  const samples: number[] = [];
  for (let n = 5_000; n < 15_000; n++) {
    const t = performance.now();
    await live.ingest(next(n));
    samples.push(performance.now() - t);
  }
  samples.sort((a, b) => a - b);
  const q = (p: number) => samples[Math.min(samples.length - 1, Math.floor(p * samples.length))].toFixed(3);
  console.log(`live path at 2000 rules, per-event latency (n=${samples.length}): p50 ${q(0.5)} ms, p99 ${q(0.99)} ms`);
  console.log(`peak RSS ${(process.memoryUsage().rss / 1048576).toFixed(0)} MiB`);
}

void main();
