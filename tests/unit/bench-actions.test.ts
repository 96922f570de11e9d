import { describe, expect, it } from "vitest";
import { LONG_PRESS_MS } from "@/lib/bus/derive";
import { buttonsOf, checkAction, engineInputsFor, LONG_PRESS_HOLD_MS, setDateSpan, WALK_PAST_MS } from "@/lib/bench/actions";
import { describeAction } from "@/lib/bench/describe";
import { benchActionSchema, benchRunSchema } from "@/lib/validation/bench";

const site = { timeZone: "Europe/Paris", latitude: 48.8, longitude: 2.3 };
const now = Date.UTC(2025, 0, 15, 17, 0); // 18:00 in Paris (UTC+1 in winter, IANA tz database)
let n = 0;
const ctx = { siteId: "s", now, site, newId: () => `e${++n}`, person: "Ada" };
const devices = [
  { id: "rocker", name: "Door rocker", kind: "kinetic-rocker" as const, profile: { buttons: 2 } },
  { id: "rocker4", name: "Flat rocker", kind: "kinetic-rocker" as const, profile: { buttons: 4 } },
  { id: "call", name: "Call button", kind: "kinetic-call-button" as const, profile: {} },
  { id: "pir", name: "Path sensor", kind: "solar-motion-light" as const, profile: {} },
  { id: "climate", name: "Climate", kind: "climate-sensor" as const, profile: {} },
];

describe("bench action → device events", () => {
  it("a walk past is a detection, then the sensor's no-motion report (silence) 5 s later", () => {
    const inputs = engineInputsFor({ type: "walk-past", device: "pir" }, ctx);
    expect(inputs.map((i) => ("event" in i ? [i.event.kind, i.event.value, i.event.at - now] : null))).toEqual([
      ["motion", true, 0],
      ["motion", false, WALK_PAST_MS],
    ]);
  });

  it("a long press holds the button past the engine's long-press time", () => {
    const inputs = engineInputsFor({ type: "long-press", device: "rocker4", button: 4 }, ctx);
    expect(inputs.map((i) => ("event" in i ? [i.event.kind, i.event.value, i.event.at - now] : null))).toEqual([
      ["press", 4, 0],
      ["release", 4, LONG_PRESS_HOLD_MS],
    ]);
    expect(LONG_PRESS_HOLD_MS).toBeGreaterThan(LONG_PRESS_MS);
  });

  it("every event gets its own id, so the engine never drops one as a repeat", () => {
    const ids = [...engineInputsFor({ type: "walk-past", device: "pir" }, ctx), ...engineInputsFor({ type: "walk-past", device: "pir" }, ctx)].map((i) => ("event" in i ? i.event.id : ""));
    expect(new Set(ids).size).toBe(4);
  });

  it("clearing the emergency is a console event naming the person", () => {
    expect(engineInputsFor({ type: "clear-emergency" }, ctx)).toEqual([{ event: expect.objectContaining({ device: "console", kind: "clear-emergency", value: "Ada" }) }]);
  });

  it("skip moves the clock by minutes; skip-to goes to the next wall-clock time in the site's zone", () => {
    expect(engineInputsFor({ type: "skip", minutes: 10 }, ctx)).toEqual([{ advanceTo: now + 600_000 }]);
    // 18:00 Paris now → 18:30 today (17:30 UTC); 07:00 → tomorrow 06:00 UTC.
    expect(engineInputsFor({ type: "skip-to", time: "18:30" }, ctx)).toEqual([{ advanceTo: Date.UTC(2025, 0, 15, 17, 30) }]);
    expect(engineInputsFor({ type: "skip-to", time: "07:00" }, ctx)).toEqual([{ advanceTo: Date.UTC(2025, 0, 16, 6, 0) }]);
  });

  it("set-date spans local midnight to the chosen time, across a summer-time change", () => {
    // 2025-03-30: Paris goes from UTC+1 to UTC+2 at 02:00 local (EU summer time, IANA tz database).
    expect(setDateSpan({ type: "set-date", date: "2025-03-30", time: "12:00" }, site)).toEqual({ from: Date.UTC(2025, 2, 29, 23, 0), to: Date.UTC(2025, 2, 30, 10, 0) });
  });
});

describe("checks against the site's devices and the sensor ranges", () => {
  it("buttons come from the rocker's profile (2 when unset), one for a call button", () => {
    expect(buttonsOf(devices[0])).toBe(2);
    expect(buttonsOf(devices[1])).toBe(4);
    expect(buttonsOf({ kind: "kinetic-rocker", profile: {} })).toBe(2);
    expect(buttonsOf(devices[2])).toBe(1);
  });

  it("names the field at fault", () => {
    expect(checkAction({ type: "press", device: "rocker", button: 3 }, devices)).toMatchObject({ field: "button" });
    expect(checkAction({ type: "press", device: "rocker4", button: 3 }, devices)).toBeNull();
    expect(checkAction({ type: "walk-past", device: "gone" }, devices)).toMatchObject({ field: "device" });
    expect(checkAction({ type: "walk-past", device: "climate" }, devices)).toMatchObject({ field: "type", message: expect.stringMatching(/does not report motion/) });
    expect(checkAction({ type: "long-press", device: "call", button: 1 }, devices)).toMatchObject({ field: "type", message: expect.stringMatching(/release/) });
    expect(checkAction({ type: "reading", device: "pir", measure: "light-level", value: 3 }, devices)).toBeNull();
    expect(checkAction({ type: "reading", device: "pir", measure: "temperature", value: 3 }, devices)).toMatchObject({ field: "type" });
    expect(checkAction({ type: "skip", minutes: 3 }, devices)).toBeNull();
  });

  it("refuses readings outside the sensor range (common practice for indoor sensors, no source)", () => {
    const parse = (measure: string, value: number) => benchActionSchema.safeParse({ type: "reading", device: "x", measure, value });
    expect(parse("light-level", 200_000).success).toBe(true);
    expect(parse("light-level", 200_001).success).toBe(false);
    expect(parse("temperature", -40).success).toBe(true);
    expect(parse("temperature", 85.5).success).toBe(false);
    expect(parse("humidity", 100).success).toBe(true);
    const bad = parse("humidity", -0.5);
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]).toMatchObject({ path: ["value"], message: expect.stringMatching(/0–100 %RH/) });
  });

  it("delivering notices is off unless asked", () => {
    expect(benchRunSchema.parse({ action: { type: "skip", minutes: 1 } }).deliverNotices).toBe(false);
    expect(benchRunSchema.safeParse({ action: { type: "skip", minutes: 1 }, extra: 1 }).success).toBe(false);
  });

  it("describes actions in words", () => {
    const name = (id: string) => devices.find((d) => d.id === id)?.name ?? id;
    expect(describeAction({ type: "walk-past", device: "pir" }, name)).toBe("Walk past Path sensor");
    expect(describeAction({ type: "reading", device: "climate", measure: "humidity", value: 70 }, name)).toBe("Climate reads 70 %RH");
  });
});
