import { describe, expect, it } from "vitest";
import { demoDevices, demoSite, demoZones } from "@/db/seed/demo-site";
import { createReplayEngine } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import { compileGraph } from "@/lib/rules/compile";
import { demoScenes } from "@/lib/rules/demo-graph";
import { chainEdges, parseRuleGraph, type RuleGraphInput } from "@/lib/rules/graph";

const dev = (key: string) => `larch-lane-dev-${key}`;
const zone = (key: string) => `larch-lane-zone-${key}`;
const site = toSiteInput({ site: demoSite, devices: demoDevices, zones: demoZones, scenes: demoScenes });
const T0 = Date.UTC(2024, 5, 20, 7, 0);
const MIN = 60_000;
const PATH = [dev("light-path-1"), dev("light-path-2")];

/** Front path lights claimed at every level: Schedule (site mode), Sensor (motion/vacancy), Manual (flat rocker), Emergency (fire). */
const nodes: RuleGraphInput["nodes"] = [
  { id: "t-away", kind: "trigger", type: "site-mode-changed", params: { mode: "away" } },
  { id: "a-sched", kind: "action", type: "set-level", params: { target: { zone: zone("path") }, level: 20 } },
  { id: "t-motion", kind: "trigger", type: "motion-detected", params: { device: dev("sensor-path") } },
  { id: "a-sensor-on", kind: "action", type: "set-level", params: { target: { zone: zone("path") }, level: 100 } },
  { id: "t-vacant", kind: "trigger", type: "vacancy", params: { device: dev("sensor-path"), minutes: 20 } },
  { id: "a-sensor-off", kind: "action", type: "set-level", params: { target: { zone: zone("path") }, level: 0 } },
  { id: "t-b1", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-flat"), button: 1 } },
  { id: "a-manual", kind: "action", type: "set-level", params: { target: { zone: zone("path") }, level: 40 } },
  { id: "t-b2", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-flat"), button: 2 } },
  { id: "a-hold", kind: "action", type: "hold-zone", params: { zone: zone("path"), minutes: 30 } },
  { id: "t-b3", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-flat"), button: 3 } },
  { id: "a-mode", kind: "action", type: "set-site-mode", params: { mode: "away" } },
  { id: "t-b4", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-flat"), button: 4 } },
  { id: "a-one", kind: "action", type: "set-level", params: { target: { device: dev("light-path-1") }, level: 10 } },
  { id: "t-fire", kind: "trigger", type: "fire-alarm-active", params: { device: dev("fire-input") } },
  { id: "a-latch", kind: "action", type: "latch-emergency", params: { scene: 9 } },
  { id: "t-clear", kind: "trigger", type: "rocker-long-press", params: { device: dev("rocker-flat"), button: 4 } },
  { id: "a-clear", kind: "action", type: "clear-emergency", params: {} },
];
const pairs = [["t-away", "a-sched"], ["t-motion", "a-sensor-on"], ["t-vacant", "a-sensor-off"], ["t-b1", "a-manual"], ["t-b2", "a-hold"], ["t-b3", "a-mode"], ["t-b4", "a-one"], ["t-fire", "a-latch"], ["t-clear", "a-clear"]];
const rules = compileGraph(parseRuleGraph({ nodes, edges: pairs.flatMap((p) => chainEdges(...p)) }));

function rig(manualHoldMinutes = 120) {
  const engine = createReplayEngine({ ...site, site: { ...site.site, manualHoldMinutes }, rules });
  let n = 0;
  const send = (minutes: number, device: string, kind: string, value: number | boolean | string) => engine.ingest({ id: `e${n++}`, siteId: "larch-lane", at: T0 + minutes * MIN, device: dev(device), kind, value });
  const level = () => PATH.map((id) => engine.getState().levels[id] ?? 0);
  return { engine, send, level };
}

describe("override stack: Emergency > Manual > Sensor > Schedule", () => {
  it("a higher claim holds the luminaire; a lower one waits underneath", () => {
    const r = rig();
    r.send(0, "rocker-flat", "press", 3); // mode away → Schedule 20 %
    expect(r.level()).toEqual([20, 20]);
    r.send(1, "sensor-path", "motion", true); // Sensor 100 %
    expect(r.level()).toEqual([100, 100]);
    r.send(2, "rocker-flat", "press", 1); // Manual 40 %
    expect(r.level()).toEqual([40, 40]);
    const blocked = r.send(3, "sensor-path", "motion", true);
    expect(blocked.commands).toEqual([]);
    expect(blocked.trace[0].actions[0].outcome).toBe("Front path to 100 %: 2 held by Manual; nothing sent.");
    expect(r.engine.getState().overrides[PATH[0]]).toEqual({ manual: { level: 40, until: T0 + 122 * MIN }, schedule: { level: 20, until: null }, sensor: { level: 100, until: null } });
  });

  it("a manual hold ends when the zone becomes vacant, and does not relight an emptied room", () => {
    const r = rig();
    r.send(0, "rocker-flat", "press", 3); // Schedule 20 %
    r.send(1, "sensor-path", "motion", true); // Sensor 100 %
    r.send(2, "rocker-flat", "press", 1); // Manual 40 %
    // Occupancy ends 15 min after the last motion: manual and sensor claims go, the Schedule claim shows.
    // 20 % → Actual 13107 = 0x3333; TID 3 after three earlier messages.
    const vacant = r.engine.advanceTo(T0 + 17 * MIN);
    expect(vacant.trace.map((t) => t.trigger.type)).toEqual(["zone-vacant"]);
    expect(vacant.commands).toMatchObject([{ addressing: "group", reason: "zone-vacant", bytes: "82 4D 33 33 03" }]);
    expect(r.level()).toEqual([20, 20]);
  });

  it("a manual hold ends at its time when nobody leaves", () => {
    const r = rig(60);
    r.send(0, "rocker-flat", "press", 3); // Schedule 20 %
    r.send(1, "rocker-flat", "press", 1); // Manual 40 % until +61 min
    const end = r.engine.advanceTo(T0 + 90 * MIN);
    expect(end.changes.map((c) => [c.at, c.reason, c.kind === "level" ? c.to : null])).toEqual([
      [T0 + 61 * MIN, "hold-ended", 20],
      [T0 + 61 * MIN, "hold-ended", 20],
    ]);
    expect(end.commands).toHaveLength(1); // one group message for the whole zone
  });

  it("hold zone keeps the present level against sensors for N minutes", () => {
    const r = rig();
    r.send(0, "sensor-path", "motion", true); // Sensor 100 %
    r.send(1, "rocker-flat", "press", 2); // hold 30 min at 100 %
    r.send(3, "rocker-flat", "press", 1); // Manual 40 % replaces the hold's claim (until +123 min)
    expect(r.level()).toEqual([40, 40]);
    r.send(10, "sensor-path", "motion", true);
    r.send(12, "sensor-path", "motion", true);
    expect(r.level()).toEqual([40, 40]);
  });

  it("hold zone followed by sensor writes: the sensor claim shows when the hold ends", () => {
    const r = rig();
    r.send(0, "rocker-flat", "press", 3); // Schedule 20 %
    r.send(1, "rocker-flat", "press", 2); // hold at 20 % for 30 min
    r.send(5, "sensor-path", "motion", true); // Sensor 100 % is held
    expect(r.level()).toEqual([20, 20]);
    r.send(20, "sensor-path", "motion", true); // keep the zone occupied past the hold's end
    const step = r.engine.advanceTo(T0 + 32 * MIN);
    expect(step.trace.map((t) => t.trigger.type)).toEqual(["hold-ended"]);
    expect(r.level()).toEqual([100, 100]);
  });

  it("emergency latches over everything until cleared, then the claims underneath return", () => {
    const r = rig();
    r.send(0, "rocker-flat", "press", 1); // Manual 40 %
    const fire = r.send(1, "fire-input", "fire-alarm", true);
    expect(fire.changes.find((c) => c.kind === "emergency")).toMatchObject({ isActive: true, scene: 9 });
    expect(r.level()).toEqual([100, 100]); // scene 9 lights the path
    expect(r.engine.getState().levels[dev("dl-shop-1")] ?? 0).toBe(0);
    const held = r.send(2, "rocker-flat", "press", 4); // Manual 10 % on one luminaire, held by Emergency
    expect(held.commands).toEqual([]);
    r.send(3, "fire-input", "fire-alarm", false); // the input clearing does not unlatch
    expect(r.engine.getState().emergency.active).toBe(true);
    r.send(4, "rocker-flat", "press", 4);
    const clear = r.send(4 + 1.5 / 60, "rocker-flat", "release", 4); // long press clears
    expect(clear.changes.find((c) => c.kind === "emergency")).toMatchObject({ isActive: false });
    expect(r.level()).toEqual([10, 40]);
    expect(clear.commands.map((c) => c.addressing)).toEqual(["unicast", "unicast"]);
  });

  it("a luminaire held higher splits a zone message into unicast to the others", () => {
    const r = rig();
    r.send(0, "rocker-flat", "press", 4); // Manual 10 % on path light 1 only
    const step = r.send(1, "sensor-path", "motion", true); // Sensor 100 % to the zone
    expect(step.commands.map((c) => [c.addressing, c.devices])).toEqual([["unicast", [PATH[1]]]]);
    expect(r.level()).toEqual([10, 100]);
  });
});
