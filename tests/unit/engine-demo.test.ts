import { describe, expect, it } from "vitest";
import { demoDevices, demoSite, demoZones } from "@/db/seed/demo-site";
import { createEngine, createReplayEngine } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import type { DeviceEvent } from "@/lib/bus/types";
import { compileGraph } from "@/lib/rules/compile";
import { demoRuleGraph, demoScenes } from "@/lib/rules/demo-graph";

const d = (key: string) => `larch-lane-dev-${key}`;
const site = toSiteInput({ site: demoSite, devices: demoDevices, zones: demoZones, scenes: demoScenes });
const rules = compileGraph(demoRuleGraph);
const MIN = 60_000;
/** Local time at the demo site (WET; +1 in summer) on Thursday 2024-06-20. */
const local = (hh: number, mm = 0) => Date.UTC(2024, 5, 20, hh - 1, mm);
const group = (key: string) => demoZones.find((z) => z.id === `larch-lane-zone-${key}`)!.groupAddress;

/** The engine starts overnight, shut: the 09:00 schedule opens the shop. */
function demo() {
  const engine = createReplayEngine({ ...site, site: { ...site.site, initialMode: "closed" }, rules });
  // Start the virtual clock at midnight so the day's schedules lie ahead of it.
  engine.advanceTo(local(0));
  let n = 0;
  const send = (at: number, device: string, kind: string, value: DeviceEvent["value"]) => engine.ingest({ id: `e${n++}`, siteId: "larch-lane", at, device: d(device), kind, value });
  return { engine, send };
}

describe("demo scenario: Larch Lane Studio", () => {
  it("every device and zone the rules name is in the seed", () => {
    const ids = new Set([...demoDevices.map((x) => x.id), ...demoZones.map((x) => x.id)]);
    const named = JSON.stringify(demoRuleGraph).match(/larch-lane-(dev|zone)-[a-z0-9-]+/g)!;
    for (const id of named) expect(ids.has(id), id).toBe(true);
  });

  it("opens at 09:00 on trading days and closes at 17:30 with the shop scenes", () => {
    const { engine } = demo();
    engine.advanceTo(local(8));
    const day = engine.advanceTo(local(18));
    expect(day.changes.filter((c) => c.kind === "mode").map((c) => [c.at, c.kind === "mode" && c.to])).toEqual([
      [local(9), "open"],
      [local(17, 30), "closed"],
    ]);
    // One group Scene Recall per zone: scene 1 (2 s fade, 0x14) at 09:00, scene 2 (5 s, 0x32) at 17:30 (Mesh Model 1.0.1 §3.1.3).
    expect(day.commands.map((c) => [c.destination, c.bytes])).toEqual([
      [group("shop"), "82 43 01 00 00 14 00"],
      [group("window"), "82 43 01 00 01 14 00"],
      [group("textile"), "82 43 01 00 02 14 00"],
      [group("shop"), "82 43 02 00 03 32 00"],
      [group("window"), "82 43 02 00 04 32 00"],
      [group("textile"), "82 43 02 00 05 32 00"],
    ]);
    // Friday and Saturday open and close; on Sunday the trading-days gate keeps it shut.
    const DAY = 24 * 60 * MIN;
    const modes = (until: number) => engine.advanceTo(until).changes.filter((c) => c.kind === "mode").length;
    expect([modes(local(18) + DAY), modes(local(18) + 2 * DAY), modes(local(18) + 3 * DAY)]).toEqual([2, 2, 0]);
  });

  it("a visitor on the path after closing lights the path (when dark) and tells the flat", () => {
    const { engine, send } = demo();
    engine.advanceTo(local(18));
    send(local(22), "sensor-path", "light-level", 4);
    const visit = send(local(22, 5), "sensor-path", "motion", true);
    expect(visit.notices.map((n) => [n.recipient, n.text])).toEqual([["role:occupant", "Someone is on the front path (22:05)."]]);
    // 100 % → Actual 0xFFFF; 1 s fade → 0x0A (Mesh Model 1.0.1 §3.1.3); TIDs 0–5 went to the shop scenes.
    expect(visit.commands.map((c) => [c.addressing, c.destination, c.bytes])).toEqual([["group", group("path"), "82 4D FF FF 06 0A 00"]]);
    // Three minutes without motion: the path fades off over 10 s (0x4A).
    const later = engine.advanceTo(local(22, 10));
    expect(later.commands.map((c) => [c.at, c.bytes])).toEqual([[local(22, 8), "82 4D 00 00 07 4A 00"]]);
  });

  it("a visitor during opening hours sends nothing", () => {
    const { send } = demo();
    const visit = send(local(11), "sensor-path", "motion", true);
    expect(visit.notices).toEqual([]);
    expect(visit.trace.find((t) => t.trigger.type === "motion-detected")!.rules.map((r) => [r.ruleId, r.passed])).toEqual([
      ["t-path-motion>g-path-after-hours", false],
      ["t-path-motion>g-path-after-hours>g-path-dark", false],
    ]);
  });

  it("the workshop fan runs above 28 °C or 65 %RH and stops below 26 °C", () => {
    const { engine, send } = demo();
    engine.advanceTo(local(9, 30)); // past the opening scene (TIDs 0–2)
    expect(send(local(10), "climate-workshop", "temperature", 27).commands).toEqual([]);
    // Mesh Model 1.0.1 Table 7.1: Generic OnOff Set Unacknowledged 82 03, on = 01, then the TID.
    expect(send(local(11), "climate-workshop", "temperature", 28.4).commands.map((c) => c.bytes)).toEqual(["82 03 01 03"]);
    expect(send(local(12), "climate-workshop", "temperature", 25).commands.map((c) => c.bytes)).toEqual(["82 03 00 04"]);
    expect(send(local(13), "climate-workshop", "humidity", 66).commands.map((c) => c.bytes)).toEqual(["82 03 01 05"]);
  });

  it("the fire input latches the escape scene, switches everything else off and stays until cleared", () => {
    const { engine, send } = demo();
    send(local(10), "rocker-shop-door", "press", 1); // shop open scene
    const fire = send(local(10, 5), "fire-input", "fire-alarm", true);
    // Scene 9 to the path and escape groups at once (transition 0x00), then 0 % to every other lit zone; TIDs 0–2 went to the shop scene.
    expect(fire.commands.map((c) => [c.destination, c.bytes])).toEqual([
      [group("path"), "82 43 09 00 03 00 00"],
      [group("escape"), "82 43 09 00 04 00 00"],
      [group("shop"), "82 4D 00 00 05 00 00"],
      [group("window"), "82 4D 00 00 06 00 00"],
      [group("textile"), "82 4D 00 00 07 00 00"],
    ]);
    expect(fire.notices.map((n) => n.recipient)).toEqual(["role:manager", "role:occupant"]);
    expect(send(local(10, 6), "rocker-shop-door", "press", 1).commands).toEqual([]);
    send(local(10, 20), "fire-input", "fire-alarm", false);
    expect(engine.getState().emergency.active).toBe(true);
    send(local(10, 30), "rocker-flat", "long-press", 4);
    expect(engine.getState().emergency.active).toBe(false);
    // The shop's Manual claim from 10:06 is still underneath (held for 2 h), so the shop comes back.
    expect(engine.getState().levels[d("dl-shop-1")]).toBe(80);
  });

  it("the back door left open 10 min after hours sends a notice; during the day it does not", () => {
    const { engine, send } = demo();
    send(local(12), "contact-back", "contact", "open");
    expect(engine.advanceTo(local(12, 15)).notices).toEqual([]);
    send(local(12, 16), "contact-back", "contact", "closed");
    send(local(19), "contact-back", "contact", "open");
    const notices = engine.advanceTo(local(19, 30)).notices;
    expect(notices.map((n) => [n.at, n.text])).toEqual([[local(19, 10), "The back door has been open for 10 minutes (19:10)."]]);
  });

  it("rockers recall scenes and toggle zones; the counter call button notifies the manager", () => {
    const { send } = demo();
    expect(send(local(8), "rocker-flat", "press", 2).commands.map((c) => [c.destination, c.bytes])).toEqual([[group("flat"), "82 43 03 00 00 1E 00"]]);
    expect(send(local(8, 1), "rocker-workshop", "press", 1).commands.map((c) => c.bytes)).toEqual(["82 4D FF FF 01 05 00"]);
    expect(send(local(8, 2), "call-counter", "press", null).notices.map((n) => n.text)).toEqual(["Someone is waiting at the counter (08:02)."]);
  });

  it("daylight dims the shop window while open and brings it back when the day dulls", () => {
    const { engine, send } = demo();
    engine.advanceTo(local(9, 29)); // opened at 09:00: the shop scene set TIDs 0–2
    send(local(9, 30), "rocker-shop-door", "press", 1); // scene again, the window's claim now Manual (held 2 h); nothing changes
    const held = send(local(10), "lux-window", "light-level", 900);
    expect(held.commands.map((c) => c.bytes)).toEqual([]);
    expect(held.trace[0].actions[0].outcome).toBe("Shop window to 20 %: 1 held by Manual; nothing sent.");
    // At 11:30 the hold ends and the Sensor claim underneath (20 %) shows.
    const holdEnds = engine.advanceTo(local(11, 45));
    expect(holdEnds.commands.map((c) => [c.at, c.reason, c.bytes])).toEqual([[local(11, 30), "hold-ended", "82 4D 33 33 03"]]);
    // 30 s fade → 1 s resolution × 30 = 0x5E (Mesh Model 1.0.1 §3.1.3).
    expect(send(local(12), "lux-window", "light-level", 300).commands.map((c) => c.bytes)).toEqual(["82 4D FF FF 04 5E 00"]);
    expect(send(local(12, 30), "lux-window", "light-level", 1200).commands.map((c) => c.bytes)).toEqual(["82 4D 33 33 05 5E 00"]);
    expect(engine.getState().levels[d("strip-window")]).toBe(20);
  });

  it("the live path (json-rules-engine) gives the same day as replay", async () => {
    const options = { ...site, site: { ...site.site, initialMode: "closed" }, rules };
    const live = createEngine(options);
    const replay = createReplayEngine(options);
    const day: DeviceEvent[] = [
      { id: "a", siteId: "larch-lane", at: local(9, 30), device: d("rocker-shop-door"), kind: "press", value: 1 },
      { id: "b", siteId: "larch-lane", at: local(21), device: d("sensor-path"), kind: "light-level", value: 2 },
      { id: "c", siteId: "larch-lane", at: local(21, 1), device: d("sensor-path"), kind: "motion", value: true },
      { id: "d", siteId: "larch-lane", at: local(21, 2), device: d("fire-input"), kind: "fire-alarm", value: true },
    ];
    const liveSteps = [];
    for (const e of day) liveSteps.push(await live.ingest(e));
    liveSteps.push(await live.advanceTo(local(23)));
    const replaySteps = [...day.map((e) => replay.ingest(e)), replay.advanceTo(local(23))];
    expect(JSON.stringify(liveSteps)).toBe(JSON.stringify(replaySteps));
    expect(JSON.stringify(live.getState())).toBe(JSON.stringify(replay.getState()));
  });
});
