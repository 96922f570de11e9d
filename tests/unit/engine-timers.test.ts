import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { demoDevices, demoSite, demoZones } from "@/db/seed/demo-site";
import { createReplayEngine } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import { TimerQueue } from "@/lib/bus/timer-queue";
import type { DeviceEvent } from "@/lib/bus/types";
import { compileGraph } from "@/lib/rules/compile";
import { demoRuleGraph, demoScenes } from "@/lib/rules/demo-graph";
import { chainEdges, parseRuleGraph } from "@/lib/rules/graph";

const dev = (key: string) => `larch-lane-dev-${key}`;
const site = toSiteInput({ site: demoSite, devices: demoDevices, zones: demoZones, scenes: demoScenes });
const MIN = 60_000;

describe("timer queue", () => {
  it("pops by due time, then by the order timers were set", () => {
    const q = new TimerQueue();
    q.set("c", 30, { kind: "named", name: "c" });
    q.set("a", 10, { kind: "named", name: "a" });
    q.set("b", 10, { kind: "named", name: "b" });
    expect([q.popDue(100)?.key, q.popDue(100)?.key, q.popDue(100)?.key, q.popDue(100)]).toEqual(["a", "b", "c", null]);
  });

  it("replaces a key, cancels, and only pops what is due", () => {
    const q = new TimerQueue();
    q.set("x", 10, { kind: "named", name: "x" });
    q.set("x", 50, { kind: "named", name: "x" });
    q.set("y", 20, { kind: "named", name: "y" });
    expect(q.cancel("y")).toBe(true);
    expect(q.popDue(40)).toBeNull();
    expect(q.popDue(50)).toMatchObject({ key: "x", due: 50 });
    expect(q.size).toBe(0);
  });

  it("serialises live timers in firing order and restores to the same behaviour", () => {
    fc.assert(
      fc.property(fc.array(fc.record({ key: fc.constantFrom("a", "b", "c", "d", "e"), due: fc.integer({ min: 0, max: 100 }), cancel: fc.boolean() }), { maxLength: 200 }), (ops) => {
        const q = new TimerQueue();
        for (const op of ops) {
          if (op.cancel) q.cancel(op.key);
          else q.set(op.key, op.due, { kind: "named", name: op.key });
        }
        const saved = JSON.parse(JSON.stringify(q.toJSON()));
        const restored = new TimerQueue(saved.entries, saved.nextSeq);
        const drain = (t: TimerQueue) => [...Array(6)].map(() => t.popDue(1_000)?.key ?? null);
        const order = saved.entries.map((e: { key: string }) => e.key);
        expect(drain(q)).toEqual(drain(restored));
        expect(drain(new TimerQueue(saved.entries, saved.nextSeq)).filter(Boolean)).toEqual(order);
      }),
    );
  });
});

describe("engine timers", () => {
  const graph = parseRuleGraph({
    nodes: [
      { id: "t-press", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-shop-door"), button: 1 } },
      { id: "a-start", kind: "action", type: "start-timer", params: { name: "x", minutes: 10 } },
      { id: "t-x", kind: "trigger", type: "timer-fired", params: { name: "x" } },
      { id: "a-note", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "x at {time}" } },
    ],
    edges: [...chainEdges("t-press", "a-start"), ...chainEdges("t-x", "a-note")],
  });
  const rules = compileGraph(graph);
  const T0 = Date.UTC(2024, 5, 20, 7, 0);
  const press = (id: string, at: number): DeviceEvent => ({ id, siteId: "larch-lane", at, device: dev("rocker-shop-door"), kind: "press", value: 1 });

  it("ingest fires every timer due up to the event first, including one due at the same millisecond", () => {
    const engine = createReplayEngine({ ...site, rules });
    engine.ingest(press("a", T0));
    const step = engine.ingest(press("b", T0 + 10 * MIN));
    expect(step.trace.map((t) => t.origin)).toEqual(["timer:0", "b"]);
    expect(step.notices[0].at).toBe(T0 + 10 * MIN);
  });

  it("drops an event it has already seen", () => {
    const engine = createReplayEngine({ ...site, rules });
    engine.ingest(press("a", T0));
    const again = engine.ingest(press("a", T0 + MIN));
    expect(again.isDuplicate).toBe(true);
    expect(again.trace).toEqual([]);
    expect(engine.getState().timers.entries).toHaveLength(1);
  });

  it("a late event is handled at the engine's clock and says so", () => {
    const engine = createReplayEngine({ ...site, rules });
    engine.ingest(press("a", T0));
    engine.advanceTo(T0 + 5 * MIN);
    const late = engine.ingest({ id: "old", siteId: "larch-lane", at: T0 + MIN, device: dev("lux-window"), kind: "light-level", value: 10 });
    expect(late.at).toBe(T0 + 5 * MIN);
    expect(late.trace[0].note).toMatch(/^Arrived 240000 ms behind/);
  });

  it("a saved state resumes exactly where a running engine would be", () => {
    const demoRules = compileGraph(demoRuleGraph);
    const events: DeviceEvent[] = [
      { id: "1", siteId: "larch-lane", at: T0, device: dev("sensor-path"), kind: "motion", value: true },
      { id: "2", siteId: "larch-lane", at: T0 + 2 * MIN, device: dev("contact-back"), kind: "contact", value: "open" },
      { id: "3", siteId: "larch-lane", at: T0 + 11 * 60 * MIN, device: dev("sensor-path"), kind: "light-level", value: 4 },
      { id: "4", siteId: "larch-lane", at: T0 + 11 * 60 * MIN + 30_000, device: dev("sensor-path"), kind: "motion", value: true },
      { id: "5", siteId: "larch-lane", at: T0 + 12 * 60 * MIN, device: dev("rocker-flat"), kind: "press", value: 1 },
    ];
    const whole = createReplayEngine({ ...site, rules: demoRules });
    const wholeSteps = events.map((e) => whole.ingest(e));
    const first = createReplayEngine({ ...site, rules: demoRules });
    const firstSteps = events.slice(0, 2).map((e) => first.ingest(e));
    const saved = JSON.parse(JSON.stringify(first.getState()));
    const second = createReplayEngine({ ...site, rules: demoRules, state: saved });
    const secondSteps = events.slice(2).map((e) => second.ingest(e));
    expect(JSON.stringify([...firstSteps, ...secondSteps])).toBe(JSON.stringify(wholeSteps));
    expect(JSON.stringify(second.getState())).toBe(JSON.stringify(whole.getState()));
  });

  it("a daily 07:00 schedule follows summer time (CET: 06:00 UTC in winter, 05:00 UTC in summer)", () => {
    // Source: IANA tz database, CET changes to +2 at 01:00 UTC on the last Sunday of March.
    const clockGraph = parseRuleGraph({
      nodes: [
        { id: "t", kind: "trigger", type: "time-of-day", params: { at: { kind: "fixed", time: "07:00" } } },
        { id: "a", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "{time}" } },
      ],
      edges: chainEdges("t", "a"),
    });
    const engine = createReplayEngine({ ...site, site: { ...site.site, timeZone: "CET" }, rules: compileGraph(clockGraph) });
    engine.advanceTo(Date.UTC(2024, 2, 29, 12));
    const step = engine.advanceTo(Date.UTC(2024, 3, 1, 12));
    expect(step.notices.map((n) => [new Date(n.at).toISOString(), n.text])).toEqual([
      ["2024-03-30T06:00:00.000Z", "07:00"],
      ["2024-03-31T05:00:00.000Z", "07:00"],
      ["2024-04-01T05:00:00.000Z", "07:00"],
    ]);
  });

  it("a new rule version drops clock timers nobody waits for and adds the missing ones", () => {
    const engine = createReplayEngine({ ...site, rules: compileGraph(demoRuleGraph) });
    engine.advanceTo(T0);
    const before = engine.getState().timers.entries.map((e) => e.key);
    expect(before).toContain("schedule|time-of-day|fixed|17:30");
    const only18 = compileGraph(parseRuleGraph({ nodes: [{ id: "t", kind: "trigger", type: "time-of-day", params: { at: { kind: "fixed", time: "18:00" } } }, { id: "a", kind: "action", type: "set-site-mode", params: { mode: "closed" } }], edges: chainEdges("t", "a") }));
    const next = createReplayEngine({ ...site, rules: only18, state: engine.getState() });
    expect(next.getState().timers.entries.map((e) => e.key)).toEqual(["schedule|time-of-day|fixed|18:00"]);
  });
});
