import { describe, expect, it } from "vitest";
import { evaluateDevice, verdictOf } from "@/lib/energy/model";
import { simulateStore, steadyWeek } from "@/lib/energy/simulate";
import { kineticInput, periodic, solarInput } from "@/tests/support/energy-fixtures";

/*
 * Worked by hand — one message of the typical radio (3 V, 5 mA, LE 1M, 3 channels, 2 repeats):
 *   airtime 8·(10 + 37) = 376 µs (Bluetooth Core Spec Vol 6 Part B §2.1) + 80 µs start-up = 456 µs per channel
 *   one transmission: 3 V × 5 mA × 456 µs × 3 channels = 20.52 µJ
 *   3 transmissions = 61.56 µJ, + 5 µJ wake-up = 66.56 µJ per message.
 */
const MESSAGE_UJ = 66.56;

describe("kinetic switch: messages per press vs energy per press", () => {
  it("an electrodynamic rocker pays for 4 messages a press; the rules send 1 (Covered)", () => {
    // Hand-worked: 300 µJ a press (electrodynamic ≈ 0.1–0.5 mJ, from memory) × 100 % = 300 µJ;
    // the 470 µF buffer from 3.3 to 1.8 V holds ½·C·(V₁² − V₂²) = 1797.75 µJ (physics handbook), so it is not the limit;
    // ⌊300 ÷ 66.56⌋ = 4 messages; margin 300 ÷ 66.56 − 1 = 350.7 %.
    // A day of 20 presses × 1 message: harvest 20 × 300 µJ = 6 mJ, spend 20 × 66.56 µJ = 1.3312 mJ.
    const r = evaluateDevice(kineticInput());
    expect(r.messageEnergyUj).toBeCloseTo(MESSAGE_UJ, 9);
    expect(r.kinetic).toEqual({ affordablePerActuation: 4, neededPerActuation: 1, energyPerActuationUj: 300 });
    expect(r.margin).toBeCloseTo(300 / MESSAGE_UJ - 1, 9);
    expect(r.harvestPerDayJ).toBeCloseTo(6e-3, 12);
    expect(r.spendPerDayJ).toBeCloseTo(1.3312e-3, 12);
    expect(r.verdict).toBe("covered");
  });

  it("a long-press rule adds the release message: 2 per press still fits, 8 transmissions each do not", () => {
    // Repeats 5 → 6 × 20.52 + 5 = 128.12 µJ; 2 × 128.12 = 256.24 µJ → margin 17 %: Tight.
    // Hand-worked: 2 × 66.56 = 133.12 µJ ≤ 300 µJ → margin 125.4 %, Covered.
    // Repeats 7 → 8 × 20.52 + 5 = 169.16 µJ a message; 2 × 169.16 = 338.32 µJ > 300 µJ → Short, only 1 affordable.
    const release = { id: "release", label: "Release", cause: "rule" as const, ruleNodeIds: ["t-hold"], count: 1, withSensing: false, formula: "", inputs: [] };
    const input = kineticInput({ messages: [...kineticInput().messages, release] });
    expect(evaluateDevice(input).margin).toBeCloseTo(300 / 133.12 - 1, 9);
    expect(evaluateDevice(input, { repeats: 5 }).verdict).toBe("tight");
    const loud = evaluateDevice(input, { repeats: 7 });
    expect(loud.messageEnergyUj).toBeCloseTo(169.16, 9);
    expect(loud.kinetic?.affordablePerActuation).toBe(1);
    expect(loud.verdict).toBe("short");
    // Without the rule's release message the press alone (169.16 µJ; 300 ÷ 169.16 − 1 = 77 %) fits: the rule is what makes it Short.
    expect(loud.ruleImpact).toEqual({ ruleNodeIds: ["t-hold"], verdictWithout: "covered" });
  });

  it("a piezo call button (≈ 1 mJ a push) pays for 15 messages", () => {
    // Paradiso & Feldmeier, UbiComp 2001: ≈ 1 mJ at 3 V per push; ⌊1000 ÷ 66.56⌋ = 15.
    const input = kineticInput();
    input.energy.harvester = { type: "kinetic", energyPerActuationUj: 1000, conversionEfficiencyPct: 100 };
    expect(evaluateDevice(input).kinetic?.affordablePerActuation).toBe(15);
  });

  it("a buffer capacitor smaller than a press caps what the press can pay for", () => {
    // 47 µF from 3 V to 2 V holds 117.5 µJ (physics handbook) < 300 µJ → ⌊117.5 ÷ 66.56⌋ = 1.
    const input = kineticInput();
    input.energy.storage = { capacitance: { value: 47, unit: "uF" }, vMax: 3, vMin: 2, leakageUa: 0 };
    const r = evaluateDevice(input);
    expect(r.kinetic?.energyPerActuationUj).toBeCloseTo(117.5, 9);
    expect(r.kinetic?.affordablePerActuation).toBe(1);
  });
});

describe("solar sensor", () => {
  // 10 cm² × 10 % under 315 lx of LED light (315 lm/W) = 100 µW/cm² → 100 µW, 0.36 J an hour lit.
  const lit8h = (h: number) => (h % 24 >= 9 && h % 24 < 17 ? 100 : 0);

  it("harvest and spend per day, worked by hand", () => {
    // Harvest: 8 h × 3600 s × 100 µW = 2.88 J/day.
    // Spend: sleep 1 µA × 3 V × 86 400 s = 0.2592 J; 288 readings × (66.56 + 20) µJ = 0.02492928 J.
    const r = evaluateDevice(solarInput({ levelPct: lit8h, sleepCurrentUa: 1 }));
    expect(r.harvestPerDayJ).toBeCloseTo(2.88, 9);
    expect(r.spendPerDayJ).toBeCloseTo(0.2592 + 0.02492928, 9);
    expect(r.verdict).toBe("covered");
    expect(r.week?.brownoutHours).toEqual([]);
    // Hours in darkness from full: 1.9082 J ÷ (0.28412928 J ÷ 24 h) = 161.18 h.
    expect(r.darkHours).toBeCloseTo(1.9082 / (0.28412928 / 24), 6);
  });

  it("least illuminance and fastest report rate are the break-even points of the same model", () => {
    const input = solarInput({ levelPct: lit8h, sleepCurrentUa: 1 });
    const r = evaluateDevice(input);
    // Hand-worked: 0.28412928 J ÷ (8 h × 3600 s × 10 cm² × 10 % × 100/315 µW/cm² per lx) = 31.08 lx.
    expect(r.leastLux?.hoursPerDay).toBe(8);
    expect(r.leastLux?.lux).toBeCloseTo(284_129.28 / (28_800 * (100 / 315)), 6);
    expect(evaluateDevice(input, { luxAtFull: r.leastLux!.lux }).margin).toBeCloseTo(0, 9);
    expect(evaluateDevice(input, { reportingIntervalS: r.shortestIntervalS! }).margin).toBeCloseTo(0, 9);
  });

  it("a rule asking for a reading every 10 s makes a dim sensor Short, and says so", () => {
    // 20 % of 315 lx for 8 h: 0.576 J/day. 8640 readings × 86.56 µJ = 0.7479 J/day > 0.576 → Short;
    // the device's own 300 s gives 0.0249 J/day → Covered.
    const input = solarInput({ levelPct: (h) => lit8h(h) / 5, messages: [periodic(10, "rule", ["t-case"])] });
    const r = evaluateDevice(input);
    expect(r.verdict).toBe("short");
    expect(r.week!.brownoutHours.length).toBeGreaterThan(0);
    expect(r.ruleImpact).toEqual({ ruleNodeIds: ["t-case"], verdictWithout: "covered" });
    expect(evaluateDevice(input, { reportingIntervalS: 300 }).verdict).toBe("covered");
    // A bigger cell (what-if) pays for it: 5× the area, 2.88 J/day.
    expect(evaluateDevice(input, { cellAreaCm2: 50 }).verdict).toBe("covered");
  });

  it("a store too small for the night browns out even when the day's balance is positive", () => {
    // 0.01 F from 3.6 to 2.2 V = 40.6 mJ; sleep 10 µA × 3 V = 30 µW = 108 mJ an hour: empty within the first dark hour.
    const input = solarInput({ levelPct: lit8h, sleepCurrentUa: 10 });
    input.energy.storage = { capacitance: { value: 0.01, unit: "F" }, vMax: 3.6, vMin: 2.2, leakageUa: 0 };
    const r = evaluateDevice(input);
    expect(r.margin).toBeGreaterThan(0);
    expect(r.verdict).toBe("short");
    expect(r.week!.brownoutHours).toContain(17);
  });

  it("leakage is charged at full voltage", () => {
    // 2 µA × 3.6 V × 86 400 s = 0.62208 J/day on top of the readings.
    const a = evaluateDevice(solarInput({ leakageUa: 2 }));
    const b = evaluateDevice(solarInput());
    expect(a.spendPerDayJ - b.spendPerDayJ).toBeCloseTo(0.62208, 9);
  });

  it("every number carries a formula and its inputs", () => {
    const r = evaluateDevice(solarInput({ levelPct: lit8h }));
    expect(r.explanations.map((e) => e.id)).toEqual(["harvest", "message-energy", "messages", "spend", "storage", "margin", "dark-hours", "least-lux", "max-rate"]);
    const harvest = r.explanations.find((e) => e.id === "harvest")!;
    expect(harvest.value).toBeCloseTo(r.harvestPerDayJ, 12);
    expect(harvest.inputs.find((i) => i.label === "Cell area")?.value).toBe(10);
  });
});

describe("verdicts and the hourly store", () => {
  it("Short below 0 or with a brown-out, Tight below 30 %, Covered above", () => {
    // Common practice, no source: 30 % headroom.
    expect(verdictOf(-0.01, false)).toBe("short");
    expect(verdictOf(0.5, true)).toBe("short");
    expect(verdictOf(0.29, false)).toBe("tight");
    expect(verdictOf(0.3, false)).toBe("covered");
  });

  it("the store fills to its size, empties to zero and marks the brown-out hours", () => {
    const run = simulateStore([5, 5, 0, 0, 0], 2, 6, 0);
    expect(Array.from(run.storedUj)).toEqual([3, 6, 4, 2, 0]);
    expect(simulateStore([0, 0, 0], 2, 6, 3).brownoutHours).toEqual([1, 2]);
  });

  it("a week settles: with a positive balance it ends where it began", () => {
    const harvest = Array.from({ length: 168 }, (_, h) => (h % 24 >= 9 && h % 24 < 17 ? 10 : 0));
    const run = steadyWeek(harvest, 2, 100);
    expect(run.endUj).toBeCloseTo(run.storedUj[167], 12);
    expect(run.brownoutHours).toEqual([]);
    expect(run.weeks).toBeLessThan(5);
  });
});
