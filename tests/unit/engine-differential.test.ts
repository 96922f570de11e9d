import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { demoDevices, demoSite, demoZones } from "@/db/seed/demo-site";
import { createEngine, createReplayEngine, type EngineOptions } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import type { DeviceEvent, Step } from "@/lib/bus/types";
import { compileGraph } from "@/lib/rules/compile";
import { demoRuleGraph, demoScenes } from "@/lib/rules/demo-graph";
import { chainEdges, parseRuleGraph, type RuleGraphInput } from "@/lib/rules/graph";

const d = (key: string) => `larch-lane-dev-${key}`;
const z = (key: string) => `larch-lane-zone-${key}`;
const site = toSiteInput({ site: demoSite, devices: demoDevices, zones: demoZones, scenes: demoScenes });
type Input = DeviceEvent | { advanceTo: number };
type Run = { steps: Step[]; state: unknown };

// ——— random Rule sets on the demo site ———
// A small space of devices and buttons, so random triggers and random reports meet often.
const rocker = fc.constantFrom(d("rocker-shop-door"), d("rocker-flat"));
const button = fc.integer({ min: 1, max: 2 });
const luxDevice = fc.constantFrom(d("lux-window"), d("sensor-path"));
const climate = fc.constant(d("climate-workshop"));
const hhmm = fc.tuple(fc.integer({ min: 0, max: 23 }), fc.constantFrom(0, 15, 30, 45)).map(([h, m]) => `${String(h).padStart(2, "0")}:${String(m).padStart(2, "0")}`);
const timeOfDay = fc.oneof(hhmm.map((time) => ({ kind: "fixed" as const, time })), fc.record({ kind: fc.constantFrom("sunrise" as const, "sunset" as const), offsetMinutes: fc.integer({ min: -120, max: 120 }) }));
const mode = fc.constantFrom("open", "closed", "away");
const timer = fc.constantFrom("x", "y");
const zoneId = fc.constantFrom(z("shop"), z("path"), z("flat"), z("workshop"), z("escape"));
const luminaire = fc.constantFrom(d("dl-shop-1"), d("light-path-1"), d("dl-flat-2"), d("dl-escape-1"));
const fade = fc.option(fc.constantFrom(0, 500, 2_500, 30_000), { nil: undefined });

const trigger = fc.oneof(
  fc.record({ type: fc.constantFrom("rocker-press", "rocker-release", "rocker-long-press"), params: fc.record({ device: rocker, button }) }),
  fc.record({ type: fc.constantFrom("call-button-press"), params: fc.constant({ device: d("call-counter") }) }),
  fc.record({ type: fc.constantFrom("motion-detected"), params: fc.constant({ device: d("sensor-path") }) }),
  fc.record({ type: fc.constantFrom("vacancy"), params: fc.record({ device: fc.constant(d("sensor-path")), minutes: fc.integer({ min: 1, max: 20 }) }) }),
  fc.record({ type: fc.constantFrom("light-level-below", "light-level-above"), params: fc.record({ device: luxDevice, lux: fc.integer({ min: 0, max: 1000 }), hysteresisLux: fc.integer({ min: 0, max: 100 }) }) }),
  fc.record({ type: fc.constantFrom("contact-opened", "contact-closed", "fire-alarm-active", "fire-alarm-cleared"), params: fc.constant({ device: "" }) }).map((t) => ({ ...t, params: { device: d(t.type.startsWith("contact") ? "contact-back" : "fire-input") } })),
  fc.record({ type: fc.constantFrom("contact-left-open"), params: fc.record({ device: fc.constant(d("contact-back")), minutes: fc.integer({ min: 1, max: 30 }) }) }),
  fc.record({ type: fc.constantFrom("temperature-above", "temperature-below"), params: fc.record({ device: climate, celsius: fc.integer({ min: 15, max: 32 }), hysteresis: fc.constantFrom(0, 0.5, 1) }) }),
  fc.record({ type: fc.constantFrom("humidity-above", "humidity-below"), params: fc.record({ device: climate, percent: fc.integer({ min: 30, max: 80 }), hysteresis: fc.constantFrom(0, 2) }) }),
  fc.record({ type: fc.constantFrom("time-of-day"), params: fc.record({ at: timeOfDay }) }),
  fc.record({ type: fc.constantFrom("site-mode-changed"), params: fc.option(mode, { nil: undefined }).map((m) => (m ? { mode: m } : {})) }),
  fc.record({ type: fc.constantFrom("timer-fired"), params: fc.record({ name: timer }) }),
);
const gate = fc.oneof(
  fc.record({ type: fc.constantFrom("time-window"), params: fc.record({ from: timeOfDay, to: timeOfDay }) }),
  fc.record({ type: fc.constantFrom("days-of-week"), params: fc.record({ days: fc.subarray(["mon", "tue", "wed", "thu", "fri", "sat", "sun"] as const, { minLength: 1 }) }) }),
  fc.record({ type: fc.constantFrom("light-level-below"), params: fc.record({ device: luxDevice, lux: fc.integer({ min: 0, max: 1000 }) }) }),
  fc.record({ type: fc.constantFrom("zone-occupied", "zone-vacant"), params: fc.record({ zone: fc.constantFrom(z("path"), z("shop")) }) }),
  fc.record({ type: fc.constantFrom("site-mode-is"), params: fc.record({ modes: fc.subarray(["open", "closed", "away"], { minLength: 1 }) }) }),
  fc.record({ type: fc.constantFrom("emergency-not-active"), params: fc.constant({}) }),
);
const action = fc.oneof(
  fc.record({ type: fc.constantFrom("recall-scene"), params: fc.record({ scene: fc.constantFrom(1, 2, 3, 9, 42) }) }),
  fc.record({ type: fc.constantFrom("set-level"), params: fc.record({ target: fc.oneof(zoneId.map((zone) => ({ zone })), luminaire.map((device) => ({ device }))), level: fc.constantFrom(0, 20, 55.5, 100), fadeMs: fade }) }),
  fc.record({ type: fc.constantFrom("toggle-zone"), params: fc.record({ zone: zoneId, level: fc.constantFrom(40, 100), fadeMs: fade }) }),
  fc.record({ type: fc.constantFrom("relay-on", "relay-off"), params: fc.constant({ device: d("fan-workshop") }) }),
  fc.record({ type: fc.constantFrom("relay-on-for"), params: fc.record({ device: fc.constant(d("fan-workshop")), minutes: fc.integer({ min: 1, max: 60 }) }) }),
  fc.record({ type: fc.constantFrom("notice"), params: fc.record({ to: fc.oneof(fc.constant({ role: "occupant" as const }), fc.constant({ people: ["p1", "p2"] })), channels: fc.constant(["push" as const]), text: fc.constant("{device} {zone} {time}") }) }),
  fc.record({ type: fc.constantFrom("start-timer"), params: fc.record({ name: timer, minutes: fc.integer({ min: 1, max: 30 }) }) }),
  fc.record({ type: fc.constantFrom("cancel-timer"), params: fc.record({ name: timer }) }),
  fc.record({ type: fc.constantFrom("latch-emergency"), params: fc.record({ scene: fc.constantFrom(9, 42), othersOff: fc.boolean() }) }),
  fc.record({ type: fc.constantFrom("clear-emergency"), params: fc.record({ fadeMs: fade }) }),
  fc.record({ type: fc.constantFrom("set-site-mode"), params: fc.record({ mode }) }),
  fc.record({ type: fc.constantFrom("hold-zone"), params: fc.record({ zone: zoneId, minutes: fc.integer({ min: 1, max: 60 }) }) }),
);

/** Up to a dozen trigger → gates → actions paths; a gate chain sometimes continues from an earlier path's gate. */
const arbGraph = fc.array(fc.record({ trigger, gates: fc.array(gate, { maxLength: 3 }), actions: fc.array(action, { minLength: 1, maxLength: 3 }), joinEarlier: fc.boolean() }), { minLength: 1, maxLength: 12 }).map((paths): RuleGraphInput => {
  const nodes: RuleGraphInput["nodes"] = [];
  const edges: RuleGraphInput["edges"] = [];
  paths.forEach((p, i) => {
    nodes.push({ id: `t${i}`, kind: "trigger", ...p.trigger } as RuleGraphInput["nodes"][number]);
    const gateIds = p.gates.map((g, j) => {
      nodes.push({ id: `g${i}-${j}`, kind: "gate", ...g } as RuleGraphInput["nodes"][number]);
      return `g${i}-${j}`;
    });
    if (p.joinEarlier && i > 0 && paths[i - 1].gates.length > 0) gateIds.unshift("g" + (i - 1) + "-0");
    p.actions.forEach((a, k) => {
      nodes.push({ id: `a${i}-${k}`, kind: "action", ...a } as RuleGraphInput["nodes"][number]);
      edges.push(...chainEdges(`t${i}`, ...gateIds, `a${i}-${k}`).filter((e) => !edges.some((x) => x.id === e.id)));
    });
  });
  return { nodes, edges };
});

// ——— random event streams ———
const report = fc.oneof(
  fc.record({ device: rocker, kind: fc.constantFrom("press", "release", "long-press"), value: button }),
  fc.record({ device: fc.constant(d("call-counter")), kind: fc.constant("press"), value: fc.constant(null) }),
  fc.record({ device: fc.constant(d("sensor-path")), kind: fc.constant("motion"), value: fc.boolean() }),
  fc.record({ device: luxDevice, kind: fc.constant("light-level"), value: fc.integer({ min: 0, max: 1500 }) }),
  fc.record({ device: climate, kind: fc.constant("temperature"), value: fc.integer({ min: 140, max: 340 }).map((t) => t / 10) }),
  fc.record({ device: climate, kind: fc.constant("humidity"), value: fc.integer({ min: 20, max: 90 }) }),
  fc.record({ device: fc.constant(d("contact-back")), kind: fc.constant("contact"), value: fc.constantFrom("open", "closed") }),
  fc.record({ device: fc.constant(d("fire-input")), kind: fc.constant("fire-alarm"), value: fc.boolean() }),
);
type TriggerLike = { type: string; params: Record<string, unknown> };
/** A report that would set off this trigger (or come near its threshold), so random streams hit the random rules. */
function reportFor(t: TriggerLike): fc.Arbitrary<{ device: string; kind: string; value: DeviceEvent["value"] }> | null {
  const p = t.params as { device: string; button: number; lux: number; celsius: number; percent: number };
  const near = (x: number, spread: number) => fc.integer({ min: Math.round((x - spread) * 10), max: Math.round((x + spread) * 10) }).map((v) => Math.max(0, v / 10));
  if (t.type.startsWith("rocker-")) return fc.record({ device: fc.constant(p.device), kind: fc.constantFrom("press", "release", t.type.slice("rocker-".length)), value: fc.constant(p.button) });
  if (t.type === "call-button-press") return fc.constant({ device: p.device, kind: "press", value: null });
  if (t.type === "motion-detected" || t.type === "vacancy") return fc.constant({ device: p.device, kind: "motion", value: true });
  if (t.type.startsWith("light-level")) return fc.record({ device: fc.constant(p.device), kind: fc.constant("light-level"), value: near(p.lux, 150) });
  if (t.type.startsWith("temperature")) return fc.record({ device: fc.constant(p.device), kind: fc.constant("temperature"), value: near(p.celsius, 3) });
  if (t.type.startsWith("humidity")) return fc.record({ device: fc.constant(p.device), kind: fc.constant("humidity"), value: near(p.percent, 8) });
  if (t.type.startsWith("contact")) return fc.record({ device: fc.constant(p.device), kind: fc.constant("contact"), value: fc.constantFrom("open", "closed") });
  if (t.type.startsWith("fire-alarm")) return fc.record({ device: fc.constant(p.device), kind: fc.constant("fire-alarm"), value: fc.boolean() });
  return null;
}

function inputsFor(graph: RuleGraphInput): fc.Arbitrary<Input[]> {
  const aimed = graph.nodes.flatMap((n) => (n.kind === "trigger" ? [reportFor(n as TriggerLike)].filter((a) => a !== null) : []));
  const anyReport = fc.oneof({ arbitrary: report, weight: 1 }, ...aimed.map((arbitrary) => ({ arbitrary, weight: 3 })));
  return fc
    .tuple(fc.integer({ min: Date.UTC(2024, 0, 1), max: Date.UTC(2024, 11, 31) }), fc.array(fc.record({ gap: fc.integer({ min: 0, max: 90 * 60_000 }), report: anyReport, isAdvance: fc.integer({ min: 0, max: 4 }).map((n) => n === 0), repeat: fc.integer({ min: 0, max: 9 }).map((n) => n === 0) }), { minLength: 10, maxLength: 60 }))
    .map(([start, items]) => {
      let at = start;
      const inputs: Input[] = [];
      items.forEach((item, i) => {
        at += item.isAdvance ? item.gap : Math.round(item.gap / 20);
        if (item.isAdvance) inputs.push({ advanceTo: at });
        else inputs.push({ id: item.repeat && i > 0 ? `ev${i - 1}` : `ev${i}`, siteId: "larch-lane", at, ...item.report });
      });
      return inputs;
    });
}

/** A random Rule set with a random stream aimed at it. */
const arbCase = arbGraph.chain((graph) => inputsFor(graph).map((inputs) => ({ graph, inputs })));

async function runLive(options: EngineOptions, inputs: Input[]): Promise<Run> {
  const engine = createEngine(options);
  const steps: Step[] = [];
  for (const input of inputs) steps.push(await ("advanceTo" in input ? engine.advanceTo(input.advanceTo) : engine.ingest(input)));
  return { steps, state: engine.getState() };
}

function runReplay(options: EngineOptions, inputs: Input[], trace = true): Run {
  const engine = createReplayEngine(options, { trace });
  const steps = inputs.map((input) => ("advanceTo" in input ? engine.advanceTo(input.advanceTo) : engine.ingest(input)));
  return { steps, state: engine.getState() };
}

const optionsFor = (graph: RuleGraphInput): EngineOptions => ({ ...site, rules: compileGraph(parseRuleGraph(graph)) });

describe("live (json-rules-engine) and replay (closures) fire identically", () => {
  it("on a recorded two-day log of the demo site, across the autumn clock change", async () => {
    const start = Date.UTC(2024, 9, 26, 6); // Saturday before the change
    const log: DeviceEvent[] = [];
    const add = (minutes: number, device: string, kind: string, value: DeviceEvent["value"]) => log.push({ id: `r${log.length}`, siteId: "larch-lane", at: start + minutes * 60_000, device: d(device), kind, value });
    [[0, "lux-window", "light-level", 120], [200, "rocker-shop-door", "press", 1], [260, "lux-window", "light-level", 950], [300, "climate-workshop", "temperature", 29.5], [310, "climate-workshop", "humidity", 70], [400, "call-counter", "press", null], [420, "lux-window", "light-level", 250], [500, "climate-workshop", "temperature", 24], [700, "contact-back", "contact", "open"], [900, "sensor-path", "light-level", 3], [905, "sensor-path", "motion", true], [906, "sensor-path", "motion", true], [1000, "fire-input", "fire-alarm", true], [1010, "rocker-shop-door", "press", 2], [1020, "fire-input", "fire-alarm", false], [1030, "rocker-flat", "press", 4], [1031.5, "rocker-flat", "release", 4], [1100, "contact-back", "contact", "closed"], [1500, "rocker-flat", "press", 1], [2000, "rocker-workshop", "press", 2]].forEach(([m, device, kind, value]) => add(m as number, device as string, kind as string, value as DeviceEvent["value"]));
    const inputs: Input[] = [...log, { advanceTo: start + 3 * 24 * 60 * 60_000 }];
    const options = { ...site, site: { ...site.site, initialMode: "closed" }, rules: compileGraph(demoRuleGraph) };
    const live = await runLive(options, inputs);
    expect(live.steps.reduce((n, s) => n + s.commands.length + s.notices.length, 0)).toBeGreaterThan(20);
    expect(JSON.stringify(live)).toBe(JSON.stringify(runReplay(options, inputs)));
  });

  it("on random Rule sets fed random event streams", async () => {
    await fc.assert(
      fc.asyncProperty(arbCase, async ({ graph, inputs }) => {
        const options = optionsFor(graph);
        expect(JSON.stringify(await runLive(options, inputs))).toBe(JSON.stringify(runReplay(options, inputs)));
      }),
      { numRuns: 100 },
    );
  });
});

describe("the replay engine without a trace (a replay's fast mode)", () => {
  const withoutTrace = (run: Run) => ({ steps: run.steps.map((s) => ({ ...s, trace: [] })), state: run.state });

  it("gives the same steps and state as with the trace, bar the trace itself, on random Rule sets and streams", () => {
    fc.assert(
      fc.property(arbCase, ({ graph, inputs }) => {
        const traced = runReplay(optionsFor(graph), inputs);
        const fast = runReplay(optionsFor(graph), inputs, false);
        expect(fast.steps.every((s) => s.trace.length === 0)).toBe(true);
        expect(JSON.stringify(fast)).toBe(JSON.stringify(withoutTrace(traced)));
        // The step's own lists agree with the trace they summarise.
        for (const s of traced.steps) {
          expect(s.fired).toEqual(s.trace.flatMap((t) => t.rules.filter((r) => r.passed).map((r) => r.ruleId)));
          expect(s.actions).toEqual(s.trace.flatMap((t) => t.actions));
          expect(s.matched).toBe(s.trace.filter((t) => t.rules.length > 0).length);
        }
      }),
      { numRuns: 100 },
    );
  });
});

describe("properties", () => {
  it("is deterministic: the same input twice gives byte-identical output and state", () => {
    fc.assert(
      fc.property(arbCase, ({ graph, inputs }) => {
        expect(JSON.stringify(runReplay(optionsFor(graph), inputs))).toBe(JSON.stringify(runReplay(optionsFor(graph), inputs)));
      }),
      { numRuns: 80 },
    );
  });

  it("explains every output: a rule whose gates all passed and which took that action, or a system reason", () => {
    fc.assert(
      fc.property(arbCase, ({ graph, inputs }) => {
        for (const step of runReplay(optionsFor(graph), inputs).steps) {
          for (const item of [...step.changes, ...step.commands, ...step.notices]) {
            const entries = step.trace.filter((t) => t.origin === item.origin);
            if (item.ruleId === null) {
              expect(item.reason).toBeDefined();
              expect(entries.some((t) => t.trigger.type === item.reason && t.actions.some((a) => a.ruleId === null))).toBe(true);
              continue;
            }
            const isExplained = entries.some(
              (t) => t.rules.some((r) => r.ruleId === item.ruleId && r.passed && r.gates.every((g) => g.passed)) && t.actions.some((a) => a.ruleId === item.ruleId && a.actionId === item.actionId),
            );
            expect(isExplained, `${item.ruleId} / ${item.actionId}`).toBe(true);
          }
        }
      }),
      { numRuns: 80 },
    );
  });
});
