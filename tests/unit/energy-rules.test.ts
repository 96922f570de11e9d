import { describe, expect, it } from "vitest";
import { demoDevices, demoScenes, demoSite, demoZones } from "@/db/seed/demo-site";
import { toSiteInput } from "@/lib/bus/site-input";
import { kineticMessages, solarMessages } from "@/lib/energy/messages";
import { budgetWeek, siteEnergyBudget } from "@/lib/energy/site";
import { zoneLightByHour } from "@/lib/energy/zone-light";
import { compileGraph } from "@/lib/rules/compile";
import { demoRuleGraph } from "@/lib/rules/demo-graph";
import { parseRuleGraph } from "@/lib/rules/graph";

const activity = { sleepCurrentUa: 1, sensingEnergyUj: 20, reportingIntervalS: 300, heartbeatS: 3600 };
const damp = (reportSeconds?: number) =>
  parseRuleGraph({
    nodes: [
      { id: "t", kind: "trigger", type: "humidity-above", params: { device: "s1", percent: 60, ...(reportSeconds ? { reportSeconds } : {}) } },
      { id: "a", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: "Damp" } },
    ],
    edges: [{ id: "e", source: "t", target: "a" }],
  });

describe("message rate from the site's rules", () => {
  it("a rule's report interval wins when it is faster than the device's own", () => {
    // Common practice, no source: 86 400 s a day ÷ interval.
    const fast = solarMessages({ deviceId: "s1", kind: "climate-sensor", activity, graph: damp(10), observed: null });
    expect(fast.map((m) => [m.id, m.cause, m.count, m.ruleNodeIds])).toEqual([
      ["periodic", "rule", 8640, ["t"]],
      ["heartbeat", "profile", 24, []],
    ]);
    const slow = solarMessages({ deviceId: "s1", kind: "climate-sensor", activity, graph: damp(600), observed: null });
    expect(slow[0]).toMatchObject({ cause: "profile", count: 288, intervalS: 300 });
  });

  it("a sensor that reports only on change sends its threshold crossings", () => {
    const m = solarMessages({ deviceId: "s1", kind: "climate-sensor", activity: { ...activity, reportingIntervalS: null, heartbeatS: null }, graph: damp(), observed: null });
    expect(m.map((x) => [x.id, x.count])).toEqual([["crossings", 2]]);
  });

  it("motion reports come from the event log when it has history, capped by the blind time", () => {
    const seen = solarMessages({ deviceId: "s1", kind: "solar-motion-light", activity, graph: null, observed: { byKind: { motion: 100 }, days: 2 } });
    expect(seen.find((x) => x.id === "motion")).toMatchObject({ cause: "observed", count: 50 });
    const flood = solarMessages({ deviceId: "s1", kind: "solar-motion-light", activity, graph: null, observed: { byKind: { motion: 100_000 }, days: 1 } });
    // 86 400 s ÷ 30 s blind time = 2880 a day at most.
    expect(flood.find((x) => x.id === "motion")?.count).toBe(2880);
  });

  it("a long press needs the release message too", () => {
    const graph = parseRuleGraph({
      nodes: [
        { id: "hold", kind: "trigger", type: "rocker-long-press", params: { device: "k1", button: 4 } },
        { id: "a", kind: "action", type: "clear-emergency", params: {} },
      ],
      edges: [{ id: "e", source: "hold", target: "a" }],
    });
    expect(kineticMessages({ deviceId: "k1", kind: "kinetic-rocker", graph }).map((m) => [m.id, m.cause])).toEqual([
      ["press", "profile"],
      ["release", "rule"],
    ]);
  });
});

describe("artificial light from the rules' schedules", () => {
  const site = toSiteInput({ site: demoSite, devices: demoDevices, zones: demoZones, scenes: demoScenes });
  const week = budgetWeek("shortest", demoSite.latitude, demoSite.timeZone, Date.UTC(2026, 0, 10));
  const light = zoneLightByHour(site, compileGraph(demoRuleGraph), week.hourStarts);

  it("the budget week is the Monday-to-Sunday week of the December solstice at a northern site", () => {
    expect(week.start).toEqual({ year: 2026, month: 12, day: 21 });
    expect(week.hourStarts).toHaveLength(168);
  });

  it("the textile room is at the 'Shop open' level from 09:00 to 17:30, Monday to Saturday", () => {
    const textile = light.get("larch-lane-zone-textile")!.levelPct;
    expect(textile[9]).toBe(40);
    // 17:00 and 17:15 open, 17:30 and 17:45 closed: half the hour.
    expect(textile[17]).toBe(20);
    expect(textile[8]).toBe(0);
    // Sunday (day 6) stays shut.
    expect(textile[6 * 24 + 12]).toBe(0);
  });

  it("the workshop, switched only by its rocker, is assumed lit by hand in working hours", () => {
    const workshop = light.get("larch-lane-zone-workshop")!;
    expect(workshop.levelPct[10]).toBe(100);
    expect(workshop.levelPct[20]).toBe(0);
    expect(workshop.source).toMatch(/switch/);
  });

  it("the demo site: textile case A is Short because of the 10 s humidity rule, case B Covered", () => {
    const budget = siteEnergyBudget({ site: demoSite, devices: demoDevices.map((d) => ({ id: d.id!, name: d.name, kind: d.kind, zoneId: d.zoneId ?? null, unicastAddress: d.unicastAddress, profile: d.profile })), zones: demoZones, scenes: demoScenes, graph: demoRuleGraph, observed: new Map(), week: "shortest", now: Date.UTC(2026, 0, 10) });
    const verdict = (key: string) => budget.devices.find((d) => d.input.deviceId === `larch-lane-dev-${key}`)!.result;
    expect(verdict("climate-case-a").verdict).toBe("short");
    expect(verdict("climate-case-a").ruleImpact?.ruleNodeIds).toEqual(["t-case-a-damp"]);
    expect(verdict("climate-case-b").verdict).toBe("covered");
  });
});
