import { describe, expect, it } from "vitest";
import { capacitanceFarads, defaultProfile, leAirtimeUs, usableStorageEnergyJ } from "@/lib/catalogue/profiles";

describe("usable storage energy", () => {
  it.each([
    [100e-6, 3.3, 1.8, 382.5e-6],
    [47e-6, 3, 2, 117.5e-6],
    [0.47, 3.6, 2.2, 1.9082],
    [1, 5, 2, 10.5],
  ])("%f F from %f V to %f V gives %f J", (c, v1, v2, joules) => {
    // Source: physics handbook, E = ½·C·(V₁² − V₂²).
    expect(usableStorageEnergyJ(c, v1, v2)).toBeCloseTo(joules, 10);
  });

  it("is ½·C·(V₁² − V₂²), not ½·C·(V₁ − V₂)²", () => {
    // 100 µF, 3.3 → 1.8 V: the wrong formula gives 112.5 µJ.
    expect(usableStorageEnergyJ(100e-6, 3.3, 1.8)).not.toBeCloseTo(112.5e-6, 8);
  });

  it("refuses a rising voltage or a non-positive capacitance", () => {
    expect(() => usableStorageEnergyJ(1, 2, 3)).toThrow(RangeError);
    expect(() => usableStorageEnergyJ(0, 3, 2)).toThrow(RangeError);
    expect(() => usableStorageEnergyJ(1, 3, -1)).toThrow(RangeError);
  });

  it("the typical kinetic buffer holds at least one piezo push", () => {
    // Source: Paradiso & Feldmeier, UbiComp 2001 — ≈ 1 mJ per push; physics handbook for ½·C·(V₁² − V₂²).
    const { storage, harvester } = defaultProfile("kinetic-call-button").energy;
    const usable = usableStorageEnergyJ(capacitanceFarads(storage.capacitance), storage.vMax, storage.vMin);
    expect(usable * 1e6).toBeGreaterThanOrEqual(harvester.energyPerActuationUj);
  });

  it("converts microfarads", () => {
    expect(capacitanceFarads({ value: 470, unit: "uF" })).toBeCloseTo(470e-6, 15);
    expect(capacitanceFarads({ value: 0.47, unit: "F" })).toBe(0.47);
  });
});

describe("LE packet airtime", () => {
  it("LE 1M: 8·(10 + L) µs", () => {
    // Source: Bluetooth Core Spec Vol 6 Part B §2.1 — L = 37 → 376 µs; L = 6 → 128 µs.
    expect(leAirtimeUs(37, "1M")).toBe(376);
    expect(leAirtimeUs(6, "1M")).toBe(128);
  });

  it("LE 2M: 4·(11 + L) µs", () => {
    // Source: Bluetooth Core Spec Vol 6 Part B §2.1 (computed) — L = 37 → 192 µs.
    expect(leAirtimeUs(37, "2M")).toBe(192);
  });

  it("one advertising event on 3 channels at 3 V, 5 mA costs ≈ 16.9 µJ", () => {
    // Source: references model, E = V·I·t·3 with t from Core Spec Vol 6 Part B §2.1 (computed).
    const radio = defaultProfile("solar-contact").energy.radio;
    const joules = radio.supplyV * (radio.txCurrentMa / 1000) * (leAirtimeUs(37, radio.phy) / 1e6) * radio.channels;
    expect(joules * 1e6).toBeCloseTo(16.92, 2);
  });
});
