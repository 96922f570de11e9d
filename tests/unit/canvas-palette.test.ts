import { describe, expect, it } from "vitest";
import { demoDevices, demoZones } from "@/db/seed/demo-site";
import { ruleNodeSchema } from "@/lib/rules/graph";
import { autoLayout } from "@/lib/rules/layout";
import { devicesFor, newNode, paletteFor, type PaletteSite } from "@/lib/rules/palette";

const demo: PaletteSite = {
  devices: demoDevices.map((d) => ({ id: d.id!, name: d.name, kind: d.kind, zoneId: d.zoneId ?? null })),
  zones: demoZones.map((z) => ({ id: z.id!, name: z.name })),
  scenes: [{ number: 1, name: "Shop open" }],
  people: [{ id: "u", name: "Manager", role: "manager" }],
};

describe("Canvas palette", () => {
  it("offers only what the site's devices can do", () => {
    const onlyRelay: PaletteSite = { devices: [{ id: "r", name: "Fan", kind: "relay", zoneId: null }], zones: [], scenes: [], people: [] };
    const types = paletteFor(onlyRelay).map((e) => `${e.kind}:${e.type}`);
    // No sensors or switches: only the clock, site-mode and timer triggers.
    expect(types.filter((t) => t.startsWith("trigger:"))).toEqual(["trigger:time-of-day", "trigger:site-mode-changed", "trigger:timer-fired"]);
    expect(types).toContain("action:relay-on");
    expect(types).not.toContain("action:recall-scene");
    expect(types).not.toContain("action:set-level");
    expect(types).not.toContain("gate:zone-occupied");
  });

  it("offers the demo site's back-door, climate and fire triggers, and picks fitting devices", () => {
    const types = paletteFor(demo).map((e) => e.type);
    expect(types).toEqual(expect.arrayContaining(["contact-left-open", "temperature-above", "fire-alarm-active", "rocker-press", "notice", "recall-scene"]));
    expect(devicesFor(demo, "trigger", "contact-left-open").map((d) => d.id)).toEqual(["larch-lane-dev-contact-back"]);
    expect(devicesFor(demo, "trigger", "rocker-press").every((d) => d.kind === "kinetic-rocker")).toBe(true);
    expect(devicesFor(demo, "action", "relay-on").map((d) => d.id)).toEqual(["larch-lane-dev-fan-workshop"]);
  });

  it("makes a valid node for every palette entry", () => {
    for (const entry of paletteFor(demo)) {
      const node = newNode(demo, entry.kind, entry.type, `n-${entry.type}`, { x: 0, y: 0 });
      expect(node, entry.type).not.toBeNull();
      expect(ruleNodeSchema.safeParse(node).success, `${entry.kind} ${entry.type}`).toBe(true);
    }
  });
});

describe("auto-layout", () => {
  it("puts triggers left of gates left of actions, without overlaps", () => {
    const nodes = ["t1", "t2", "g", "a1", "a2"].map((id) => ({ id, width: 200, height: 80 }));
    const pos = autoLayout(nodes, [
      { source: "t1", target: "g" },
      { source: "t2", target: "g" },
      { source: "g", target: "a1" },
      { source: "g", target: "a2" },
    ]);
    expect(pos.get("t1")!.x).toBeLessThan(pos.get("g")!.x);
    expect(pos.get("g")!.x).toBeLessThan(pos.get("a1")!.x);
    const boxes = [...pos.entries()];
    for (let i = 0; i < boxes.length; i++) {
      for (let j = i + 1; j < boxes.length; j++) {
        const [a, b] = [boxes[i][1], boxes[j][1]];
        const overlap = Math.abs(a.x - b.x) < 200 && Math.abs(a.y - b.y) < 80;
        expect(overlap, `${boxes[i][0]} and ${boxes[j][0]}`).toBe(false);
      }
    }
  });
});

describe("auto-layout of many small paths", () => {
  it("packs separate paths into columns, about screen-shaped, without overlaps", () => {
    const nodes = Array.from({ length: 30 }, (_, i) => [
      { id: `t${i}`, width: 212, height: 84 },
      { id: `a${i}`, width: 212, height: 84 },
    ]).flat();
    const edges = Array.from({ length: 30 }, (_, i) => ({ source: `t${i}`, target: `a${i}` }));
    const pos = autoLayout(nodes, edges);
    const xs = [...pos.values()].map((p) => p.x);
    const ys = [...pos.values()].map((p) => p.y);
    const width = Math.max(...xs) + 212;
    const height = Math.max(...ys) + 84;
    expect(width / height).toBeGreaterThan(0.8);
    expect(width / height).toBeLessThan(3);
    for (let i = 0; i < 30; i++) expect(pos.get(`t${i}`)!.x).toBeLessThan(pos.get(`a${i}`)!.x);
    const boxes = [...pos.values()];
    for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) expect(Math.abs(boxes[i].x - boxes[j].x) < 212 && Math.abs(boxes[i].y - boxes[j].y) < 84).toBe(false);
  });
});
