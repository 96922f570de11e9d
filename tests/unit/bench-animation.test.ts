import { describe, expect, it } from "vitest";
import { animationEnd, levelAt, MAX_ANIMATION_MS, MESSAGE_SPACING_MS, planTransitions } from "@/lib/bench/animation";
import type { GatewayCommand, StateChange } from "@/lib/bus/types";

const cause = { origin: "e1", ruleId: "r", actionId: "a" };
const level = (deviceId: string, from: number, to: number, at = 0): StateChange => ({ ...cause, at, kind: "level", deviceId, from, to, source: "sensor" });
const command = (devices: string[], addressing: "group" | "unicast", transition: number | null, at = 0): GatewayCommand => ({
  ...cause,
  at,
  source: 0x7fff,
  destination: addressing === "group" ? 0xc000 : 1,
  addressing,
  message: "light-lightness-set-unack",
  tid: 0,
  ttl: 7,
  transition,
  bytes: "",
  devices,
});

describe("bench transitions", () => {
  it("a group message moves the whole zone at once over its fade time", () => {
    // Transition octet 0x0A = 10 steps × 100 ms = 1 s (Mesh Model 1.0.1 §3.1.3).
    const t = planTransitions({ changes: [level("a", 0, 100), level("b", 0, 100)], commands: [command(["a", "b"], "group", 0x0a)] });
    expect(t.map((x) => [x.deviceId, x.delayMs, x.durationMs, x.addressing])).toEqual([
      ["a", 0, 1000, "group"],
      ["b", 0, 1000, "group"],
    ]);
    expect(levelAt(t[0], 500)).toBe(50);
    expect(levelAt(t[0], 1000)).toBe(100);
  });

  it("unicast messages move luminaires one after another", () => {
    const t = planTransitions({ changes: [level("a", 0, 80), level("b", 0, 80), level("c", 0, 80)], commands: [command(["a"], "unicast", 0), command(["b"], "unicast", 0), command(["c"], "unicast", 0)] });
    expect(t.map((x) => x.delayMs)).toEqual([0, MESSAGE_SPACING_MS, 2 * MESSAGE_SPACING_MS]);
    expect(t.map((x) => levelAt(x, MESSAGE_SPACING_MS))).toEqual([80, 80, 0]);
    expect(animationEnd(t)).toBe(2 * MESSAGE_SPACING_MS);
  });

  it("a light moved twice in one step runs from its first level to its last; a default transition (null) is immediate", () => {
    const t = planTransitions({ changes: [level("a", 10, 100, 0), level("a", 100, 0, 60_000)], commands: [command(["a"], "group", 0x0a, 0), command(["a"], "group", null, 60_000)] });
    expect(t).toEqual([{ deviceId: "a", from: 10, to: 0, delayMs: 0, durationMs: 0, addressing: "group" }]);
  });

  it("fades longer than the bench animates jump to their end; levels between are linear", () => {
    // 0x42 = 2 steps × 1 s resolution = 2 s; 0xC2 = 2 × 10 min = 20 min (Mesh Model 1.0.1 §3.1.3).
    const [short] = planTransitions({ changes: [level("a", 100, 0)], commands: [command(["a"], "group", 0x42)] });
    expect(levelAt(short, 500)).toBe(75);
    const [long] = planTransitions({ changes: [level("a", 0, 100)], commands: [command(["a"], "group", 0xc2)] });
    expect(20 * 60_000).toBeGreaterThan(MAX_ANIMATION_MS);
    expect(long.durationMs).toBe(0);
    expect(levelAt(long, 0)).toBe(100);
  });
});
