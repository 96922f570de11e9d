import { describe, expect, it } from "vitest";
import { DEVICE_KINDS, isBatteryFree } from "@/lib/catalogue/device-kinds";
import { defaultProfile, parseProfile, type DeviceProfile } from "@/lib/catalogue/profiles";
import { demoDevices } from "@/db/seed/demo-site";

const errorsOf = (result: ReturnType<typeof parseProfile>) => (result.ok ? [] : result.errors);

describe("device profiles", () => {
  it.each(DEVICE_KINDS)("the default profile of %s is itself a valid profile", (kind) => {
    const profile = defaultProfile(kind);
    const reparsed = parseProfile(kind, JSON.parse(JSON.stringify(profile)));
    expect(reparsed).toEqual({ ok: true, profile });
  });

  it("battery-free kinds get an energy profile with every section marked typical and sourced", () => {
    for (const kind of DEVICE_KINDS.filter(isBatteryFree)) {
      const { energy } = defaultProfile(kind) as DeviceProfile<"solar-contact">;
      for (const section of [energy.harvester, energy.storage, energy.radio, energy.activity]) {
        expect(section.isTypical).toBe(true);
        expect(section.source?.length).toBeGreaterThan(10);
      }
    }
    expect(defaultProfile("mesh-luminaire")).not.toHaveProperty("energy");
  });

  it("uses the published piezo figure for call buttons and keeps the remembered rocker figure marked as such", () => {
    // Source: Paradiso & Feldmeier, UbiComp 2001 — ≈ 1 mJ per push at 3 V.
    const button = defaultProfile("kinetic-call-button").energy.harvester;
    expect(button.energyPerActuationUj).toBe(1000);
    expect(button.source).toContain("Paradiso & Feldmeier");
    // From memory, not verified: electrodynamic rockers ≈ 0.1–0.5 mJ per press.
    const rocker = defaultProfile("kinetic-rocker").energy.harvester;
    expect(rocker.energyPerActuationUj).toBeGreaterThanOrEqual(100);
    expect(rocker.energyPerActuationUj).toBeLessThanOrEqual(500);
    expect(rocker.source).toContain("from memory");
  });

  it("fills left-out sections from typical values but keeps what was given, unmarked", () => {
    const result = parseProfile("kinetic-rocker", { buttons: 4, energy: { harvester: { energyPerActuationUj: 250, conversionEfficiencyPct: 80 } } });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.profile.buttons).toBe(4);
    expect(result.profile.energy.harvester).toEqual({ type: "kinetic", energyPerActuationUj: 250, conversionEfficiencyPct: 80, isTypical: false });
    expect(result.profile.energy.radio.isTypical).toBe(true);
  });

  it("accepts every profile the demo seed stores", () => {
    for (const device of demoDevices) expect(parseProfile(device.kind, device.profile ?? {}).ok, device.name).toBe(true);
  });

  it("rockers have 2 or 4 buttons", () => {
    expect(errorsOf(parseProfile("kinetic-rocker", { buttons: 3 }))).toEqual([{ path: "buttons", message: "must be 2 or 4" }]);
    expect(errorsOf(parseProfile("solar-contact", { buttons: 2 }))).toEqual([{ path: "buttons", message: "is not a setting of this kind of device" }]);
  });

  it("reports nested field errors with dotted paths", () => {
    const result = parseProfile("climate-sensor", {
      energy: {
        storage: { capacitance: { value: 100, unit: "uF" }, vMax: 2, vMin: 3, leakageUa: 1 },
        radio: { supplyV: 3, txCurrentMa: 5, phy: "3M", repeats: 9, channels: 0 },
        activity: { sleepCurrentUa: 1, sensingEnergyUj: 5, reportingIntervalS: 0, heartbeatS: null },
      },
    });
    const paths = errorsOf(result).map((e) => e.path);
    expect(paths).toEqual(
      expect.arrayContaining(["energy.storage.vMin", "energy.radio.phy", "energy.radio.repeats", "energy.radio.channels", "energy.activity.reportingIntervalS"]),
    );
    expect(paths).toHaveLength(5);
  });

  it("says a missing field is required rather than 'not a number'", () => {
    const errors = errorsOf(parseProfile("solar-contact", { energy: { radio: { supplyV: 3, txCurrentMa: 5, phy: "1M", repeats: 1 } } }));
    expect(errors).toEqual([{ path: "energy.radio.channels", message: "is required" }]);
  });

  it("catches a capacitance typed in farads that was meant in microfarads", () => {
    const errors = errorsOf(parseProfile("solar-contact", { energy: { storage: { capacitance: { value: 470, unit: "F" }, vMax: 3, vMin: 2, leakageUa: 0 } } }));
    expect(errors.map((e) => e.path)).toEqual(["energy.storage.capacitance.value"]);
  });

  it("restricts the output interface by kind", () => {
    expect(parseProfile("mesh-luminaire", { output: { interface: "relay" } }).ok).toBe(true);
    expect(errorsOf(parseProfile("mesh-luminaire", { output: { interface: "dali", minLevelPct: 1 } }))[0]?.path).toBe("output.interface");
    expect(errorsOf(parseProfile("dali-driver", { output: { interface: "0-10v", minLevelPct: 1 } }))[0]?.path).toBe("output.interface");
    expect(errorsOf(parseProfile("bridge-0-10v", { output: { interface: "0-10v", minLevelPct: 100 } }))[0]?.path).toBe("output.minLevelPct");
  });

  it("takes flicker data for dimmed outputs", () => {
    const result = parseProfile("cc-driver", { output: { interface: "mesh-lightness", minLevelPct: 0.5, flicker: { pwmFrequencyHz: 20_000, modulationDepthPct: 100 } } });
    expect(result.ok && result.profile.output).toMatchObject({ flicker: { pwmFrequencyHz: 20_000 } });
    expect(errorsOf(parseProfile("cc-driver", { output: { interface: "mesh-lightness", minLevelPct: 1, flicker: { pwmFrequencyHz: 0, modulationDepthPct: 120 } } })).map((e) => e.path)).toEqual([
      "output.flicker.pwmFrequencyHz",
      "output.flicker.modulationDepthPct",
    ]);
  });

  it("accepts the profile as JSON text and refuses broken JSON", () => {
    expect(parseProfile("kinetic-rocker", '{"buttons":4}')).toMatchObject({ ok: true, profile: { buttons: 4 } });
    expect(parseProfile("kinetic-rocker", "{buttons:4")).toEqual({ ok: false, errors: [{ path: "", message: "is not valid JSON" }] });
    expect(errorsOf(parseProfile("notice-panel", { colour: "red" }))).toEqual([{ path: "colour", message: "is not a setting of this kind of device" }]);
  });
});
