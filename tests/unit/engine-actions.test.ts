import { describe, expect, it } from "vitest";
import { demoDevices, demoSite, demoZones } from "@/db/seed/demo-site";
import { createReplayEngine } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import { compileGraph } from "@/lib/rules/compile";
import { demoScenes } from "@/lib/rules/demo-graph";
import { chainEdges, parseRuleGraph, type RuleGraphInput } from "@/lib/rules/graph";

type ActionInput = Extract<RuleGraphInput["nodes"][number], { kind: "action" }> extends infer A ? (A extends unknown ? Omit<A, "kind"> : never) : never;
const dev = (key: string) => `larch-lane-dev-${key}`;
const zone = (key: string) => `larch-lane-zone-${key}`;
const site = toSiteInput({ site: demoSite, devices: demoDevices, zones: demoZones, scenes: demoScenes });
const T0 = Date.UTC(2024, 5, 20, 7, 0);
const MIN = 60_000;
const address = (key: string) => demoDevices.find((d) => d.id === dev(key))!.unicastAddress;
const group = (key: string) => demoZones.find((z) => z.id === zone(key))!.groupAddress;

/** Each button of the shop-door rocker runs one list of actions (Manual level). */
function buttons(...perButton: ActionInput[][]) {
  const nodes: RuleGraphInput["nodes"] = [];
  const edges: RuleGraphInput["edges"] = [];
  perButton.forEach((actions, i) => {
    nodes.push({ id: `t${i + 1}`, kind: "trigger", type: "rocker-press", params: { device: dev("rocker-shop-door"), button: i + 1 } });
    for (const a of actions) {
      nodes.push({ ...a, kind: "action" });
      edges.push(...chainEdges(`t${i + 1}`, a.id));
    }
  });
  const engine = createReplayEngine({ ...site, rules: compileGraph(parseRuleGraph({ nodes, edges })) });
  let n = 0;
  const press = (button: number, minutes = n) => engine.ingest({ id: `p${n++}`, siteId: "larch-lane", at: T0 + minutes * MIN, device: dev("rocker-shop-door"), kind: "press", value: button });
  return { engine, press };
}

describe("actions", () => {
  it("recall scene: one group Scene Recall per zone the scene covers, levels from the scene", () => {
    const b = buttons([{ id: "a", type: "recall-scene", params: { scene: 3 } }]);
    const step = b.press(1);
    // Scene 3 sets the flat to 60 % but its kitchen light to 30 %: both luminaires store their own level, so one group message still serves. 3 s → 0x1E (Mesh Model 1.0.1 §3.1.3).
    expect(step.commands.map((c) => [c.addressing, c.destination, c.bytes])).toEqual([["group", group("flat"), "82 43 03 00 00 1E 00"]]);
    const state = b.engine.getState();
    expect(state.levels[dev("dl-flat-1")]).toBe(60);
    expect(state.levels[dev("dl-flat-2")]).toBe(30);
  });

  it("recall scene that the site does not have sends nothing and says so", () => {
    const step = buttons([{ id: "a", type: "recall-scene", params: { scene: 42 } }]).press(1);
    expect(step.commands).toEqual([]);
    expect(step.trace[0].actions[0].outcome).toMatch(/Scene 42 is not set up/);
  });

  it("set level: group Lightness Set for a zone, unicast for one luminaire, transition only with a fade", () => {
    const b = buttons([{ id: "a", type: "set-level", params: { target: { zone: zone("workshop") }, level: 50, fadeMs: 2_500 } }], [{ id: "b", type: "set-level", params: { target: { device: dev("dl-shop-1") }, level: 100 } }]);
    const zoneStep = b.press(1);
    // Mesh Model 1.0.1 Table 7.1: 82 4D; 50 % → Actual 32768 (0x8000) LE; 2.5 s → 0x19 (§3.1.3).
    expect(zoneStep.commands.map((c) => [c.addressing, c.destination, c.bytes, c.transition])).toEqual([["group", group("workshop"), "82 4D 00 80 00 19 00", 0x19]]);
    const oneStep = b.press(2);
    // 100 % → Actual 0xFFFF; no fade asked, so the optional transition and delay are left out (Mesh Model 1.0.1 §6.3.1.3).
    expect(oneStep.commands.map((c) => [c.addressing, c.destination, c.bytes, c.transition])).toEqual([["unicast", address("dl-shop-1"), "82 4D FF FF 01", null]]);
    expect(oneStep.changes).toMatchObject([{ kind: "level", deviceId: dev("dl-shop-1"), from: 0, to: 100, source: "manual" }]);
  });

  it("sends nothing when nothing changes", () => {
    const b = buttons([{ id: "a", type: "set-level", params: { target: { zone: zone("workshop") }, level: 50 } }]);
    expect(b.press(1).commands).toHaveLength(1);
    const again = b.press(1);
    expect(again.commands).toEqual([]);
    expect(again.trace[0].actions[0].outcome).toMatch(/already there/);
  });

  it("toggle zone: on at its level when dark, off when any luminaire is lit", () => {
    const b = buttons([{ id: "a", type: "toggle-zone", params: { zone: zone("flat"), level: 70 } }]);
    // 70 % → Actual round(0.7 × 65535), little-endian (Mesh Model 1.0.1 §6.3.1.3).
    expect(b.press(1).commands[0].bytes).toBe(`82 4D ${hexLe(Math.round(0.7 * 65535))} 00`);
    expect(b.press(1).commands[0].bytes).toBe("82 4D 00 00 01");
    expect(b.engine.getState().levels[dev("dl-flat-1")]).toBe(0);
  });

  it("relay on, off and on-for: Generic OnOff to the relay's unicast address, timed off with a reason", () => {
    const b = buttons([{ id: "on", type: "relay-on", params: { device: dev("fan-workshop") } }], [{ id: "off", type: "relay-off", params: { device: dev("fan-workshop") } }], [{ id: "for", type: "relay-on-for", params: { device: dev("fan-workshop"), minutes: 30 } }]);
    // Mesh Model 1.0.1 Table 7.1: Generic OnOff Set Unacknowledged is 82 03, then OnOff, TID (no transition given).
    const on = b.press(1, 0);
    expect(on.commands.map((c) => [c.destination, c.bytes])).toEqual([[address("fan-workshop"), "82 03 01 00"]]);
    expect(b.press(1, 1).commands).toEqual([]);
    expect(b.press(2, 2).commands[0].bytes).toBe("82 03 00 01");
    b.press(3, 10);
    const later = b.engine.advanceTo(T0 + 60 * MIN);
    expect(later.commands).toMatchObject([{ at: T0 + 40 * MIN, bytes: "82 03 00 03", ruleId: null, reason: "relay-time-up" }]);
    expect(later.changes).toMatchObject([{ kind: "relay", isOn: false, reason: "relay-time-up" }]);
  });

  it("notice: one outbox item per recipient, deduplicated by event, rule, action and recipient", () => {
    const b = buttons([{ id: "a", type: "notice", params: { to: { people: ["p-1", "p-2", "p-1"] }, channels: ["push", "email"], text: "{device} pressed in {zone} at {time} {other}" } }]);
    const step = b.press(1, 5);
    expect(step.notices).toEqual([
      { origin: "p0", ruleId: "t1", actionId: "a", at: T0 + 5 * MIN, dedupeKey: "p0/t1/a/person:p-1", recipient: "person:p-1", channels: ["push", "email"], text: "Shop door rocker pressed in Shop floor at 08:05 {other}", kind: "other", zoneId: "larch-lane-zone-shop" },
      { origin: "p0", ruleId: "t1", actionId: "a", at: T0 + 5 * MIN, dedupeKey: "p0/t1/a/person:p-2", recipient: "person:p-2", channels: ["push", "email"], text: "Shop door rocker pressed in Shop floor at 08:05 {other}", kind: "other", zoneId: "larch-lane-zone-shop" },
    ]);
  });

  it("start and cancel a named timer", () => {
    const graph = parseRuleGraph({
      nodes: [
        { id: "t1", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-shop-door"), button: 1 } },
        { id: "t2", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-shop-door"), button: 2 } },
        { id: "start", kind: "action", type: "start-timer", params: { name: "closing reminder", minutes: 5 } },
        { id: "cancel", kind: "action", type: "cancel-timer", params: { name: "closing reminder" } },
        { id: "t-fired", kind: "trigger", type: "timer-fired", params: { name: "closing reminder" } },
        { id: "note", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "reminder" } },
      ],
      edges: [...chainEdges("t1", "start"), ...chainEdges("t2", "cancel"), ...chainEdges("t-fired", "note")],
    });
    const engine = createReplayEngine({ ...site, rules: compileGraph(graph) });
    const press = (id: string, minutes: number, button: number) => engine.ingest({ id, siteId: "larch-lane", at: T0 + minutes * MIN, device: dev("rocker-shop-door"), kind: "press", value: button });
    press("a", 0, 1);
    expect(engine.getState().timers.entries.map((e) => [e.key, e.due])).toEqual([["timer|closing reminder", T0 + 5 * MIN]]);
    expect(press("b", 2, 2).trace[0].actions[0].outcome).toBe('Timer "closing reminder" cancelled.');
    expect(engine.advanceTo(T0 + 10 * MIN).notices).toEqual([]);
    press("c", 20, 1);
    expect(engine.advanceTo(T0 + 30 * MIN).notices.map((n) => n.at)).toEqual([T0 + 25 * MIN]);
  });

  it("set site mode records the change once", () => {
    const b = buttons([{ id: "a", type: "set-site-mode", params: { mode: "closed" } }]);
    expect(b.press(1).changes).toMatchObject([{ kind: "mode", from: "open", to: "closed" }]);
    expect(b.press(1).changes).toEqual([]);
    expect(b.engine.getState().mode).toBe("closed");
  });

  it("stops rules that change the site mode back and forth, and says so", () => {
    const graph = parseRuleGraph({
      nodes: [
        { id: "t", kind: "trigger", type: "call-button-press", params: { device: dev("call-counter") } },
        { id: "a", kind: "action", type: "set-site-mode", params: { mode: "away" } },
        { id: "t-any-1", kind: "trigger", type: "site-mode-changed", params: {} },
        { id: "a-open", kind: "action", type: "set-site-mode", params: { mode: "open" } },
        { id: "t-any-2", kind: "trigger", type: "site-mode-changed", params: {} },
        { id: "a-closed", kind: "action", type: "set-site-mode", params: { mode: "closed" } },
      ],
      edges: [...chainEdges("t", "a"), ...chainEdges("t-any-1", "a-open"), ...chainEdges("t-any-2", "a-closed")],
    });
    const engine = createReplayEngine({ ...site, rules: compileGraph(graph) });
    // Each change fires both "any change" rules, so the work doubles at every round: the cap must be on the total, not only the depth.
    const step = engine.ingest({ id: "x", siteId: "larch-lane", at: T0, device: dev("call-counter"), kind: "press", value: 1 });
    expect(step.trace.at(-1)!.note).toBe("Stopped: rules keep changing the site mode in a loop.");
    expect(step.changes.length).toBeLessThan(300);
  });

  it("TIDs count up per source and wrap after 255", () => {
    const b = buttons([{ id: "a", type: "toggle-zone", params: { zone: zone("workshop") } }]);
    const tids: number[] = [];
    for (let i = 0; i < 258; i++) tids.push(...b.press(1, i).commands.map((c) => c.tid));
    expect(tids.slice(0, 3)).toEqual([0, 1, 2]);
    expect(tids.slice(254, 258)).toEqual([254, 255, 0, 1]);
    expect(b.engine.getState().tids).toEqual({ "0x7FFF": 2 });
  });

  it("commands carry the gateway as source and the site's TTL", () => {
    const engine = createReplayEngine({
      ...site,
      site: { ...site.site, gatewayAddress: 0x0042, ttl: 4 },
      rules: compileGraph(parseRuleGraph({ nodes: [{ id: "t", kind: "trigger", type: "call-button-press", params: { device: dev("call-counter") } }, { id: "a", kind: "action", type: "relay-on", params: { device: dev("fan-workshop") } }], edges: chainEdges("t", "a") })),
    });
    const step = engine.ingest({ id: "x", siteId: "larch-lane", at: T0, device: dev("call-counter"), kind: "press", value: 1 });
    expect(step.commands[0]).toMatchObject({ source: 0x0042, ttl: 4, tid: 0 });
  });
});

function hexLe(v: number): string {
  return [v & 0xff, v >> 8].map((b) => b.toString(16).toUpperCase().padStart(2, "0")).join(" ");
}

describe("notice kind", () => {
  it("follows the trigger unless the action names one", async () => {
    const { noticeKindFor } = await import("@/lib/rules/notice-kind");
    expect(noticeKindFor("motion-detected")).toBe("visitor");
    expect(noticeKindFor("call-button-press")).toBe("call");
    expect(noticeKindFor("contact-left-open")).toBe("door");
    expect(noticeKindFor("fire-alarm-active")).toBe("emergency");
    expect(noticeKindFor("rocker-press")).toBe("other");
    expect(noticeKindFor("motion-detected", "care")).toBe("care");
  });
});
