import { describe, expect, it } from "vitest";
import { daylightByHour } from "@/lib/energy/daylight";
import { cellPowerUw, irradianceUwPerCm2, messageEnergy, overcastSkyLux } from "@/lib/energy/physics";
import { evaluateDevice } from "@/lib/energy/model";
import { kineticInput } from "@/tests/support/energy-fixtures";

const HOUR = 3_600_000;

describe("Bluetooth LE airtime and message energy", () => {
  const radio = { supplyV: 3, txCurrentMa: 5, phy: "1M" as const, repeats: 0, channels: 1 };

  it("LE 1M: 37-octet payload → 376 µs, 6 octets → 128 µs; LE 2M: 37 → 192 µs", () => {
    // Bluetooth Core Spec Vol 6 Part B §2.1: 8·(10 + L) µs on 1M, 4·(11 + L) µs on 2M (computed).
    expect(messageEnergy(radio).airtimeUs).toBe(376);
    expect(messageEnergy(radio, { payloadOctets: 6 }).airtimeUs).toBe(128);
    expect(messageEnergy({ ...radio, phy: "2M" }).airtimeUs).toBe(192);
  });

  it("one legacy advertising event on channels 37/38/39 is 1128 µs on air; at 3 V, 5 mA that is 16.92 µJ", () => {
    // Bluetooth Core Spec Vol 6 Part B §2.1 (376 µs) × 3 channels = 1128 µs (computed); references model E = V·I·t.
    const e = messageEnergy({ ...radio, channels: 3 }, { rampUs: 0, wakeUj: 0 });
    expect(e.packetUj / (3 * 5) * 1000).toBeCloseTo(1128, 9);
    expect(e.totalUj).toBeCloseTo(16.92, 9);
  });

  it("repeats multiply the transmissions (Network Transmit count = repeats + 1), the wake-up is paid once", () => {
    // Mesh Profile 1.0.1 §4.2.19 (from memory): transmissions − 1 in bits 0–2.
    const once = messageEnergy({ ...radio, channels: 3 }, { rampUs: 0, wakeUj: 5 });
    const thrice = messageEnergy({ ...radio, channels: 3, repeats: 2 }, { rampUs: 0, wakeUj: 5 });
    expect(thrice.transmissions).toBe(3);
    expect(thrice.totalUj - 5).toBeCloseTo(3 * (once.totalUj - 5), 9);
  });
});

describe("illuminance to irradiance and cell power", () => {
  it("683 lm/W turns 683 lx into 1 W/m² = 100 µW/cm²", () => {
    // SI definition of the candela: Km = 683 lm/W; 1 lx = 1 lm/m².
    expect(irradianceUwPerCm2(683, 683)).toBeCloseTo(100, 9);
  });

  it("500 lx of white LED light is ≈ 140–180 µW/cm²", () => {
    // references.md, Photometry: LER 280–350 lm/W (Ohno, Opt. Eng. 44, 2005; from memory) → 1.4–1.8 W/m².
    expect(irradianceUwPerCm2(500, 350)).toBeCloseTo(142.86, 2);
    expect(irradianceUwPerCm2(500, 280)).toBeCloseTo(178.57, 2);
    // The model's own LED efficacy sits inside that range:
    expect(irradianceUwPerCm2(500, 315)).toBeGreaterThan(140);
    expect(irradianceUwPerCm2(500, 315)).toBeLessThan(180);
  });

  it("cell power = area × efficiency × irradiance (hand-worked: 5 cm² × 5 % × 100 µW/cm² = 25 µW)", () => {
    // Common practice, no source: the definition of conversion efficiency.
    expect(cellPowerUw(5, 5, 100)).toBeCloseTo(25, 12);
  });

  it("an AlGaAs cell at 250 lx lands in the published order of magnitude", () => {
    // Teran et al., IEEE Trans. Electron Devices 2015: ≈ 10 µW/cm² at 250 lx, 21 % efficient.
    // The spectrum of their lamp is not known here, so only the order of magnitude is checked (flag "?").
    const uwPerCm2 = cellPowerUw(1, 21, irradianceUwPerCm2(250, 315));
    expect(uwPerCm2).toBeGreaterThan(5);
    expect(uwPerCm2).toBeLessThan(40);
  });

  it("overcast sky: 300 lx on the horizon side of sunrise, 21 300 lx with the sun overhead, none at night", () => {
    // Krochmann overcast-sky formula 300 + 21 000·sin(altitude) lx (from memory).
    expect(overcastSkyLux(Math.PI / 2)).toBeCloseTo(21_300, 6);
    expect(overcastSkyLux(1e-9)).toBeCloseTo(300, 3);
    expect(overcastSkyLux(-0.1)).toBe(0);
  });
});

describe("sun times drive the daylight hours", () => {
  const litMinutes = (dayStartUtc: number) => daylightByHour(Array.from({ length: 24 }, (_, h) => dayStartUtc + h * HOUR), 51.4769, -0.0005).reduce((n, h) => n + h.litFraction * 60, 0);

  it("Greenwich, 2024-06-20: day length 16:38:09 (±2 min)", () => {
    // NOAA solar calculator (references.md, Sun times): sunrise 03:42:38 UTC, sunset 20:20:47 UTC.
    expect(Math.abs(litMinutes(Date.UTC(2024, 5, 20)) - (16 * 60 + 38 + 9 / 60))).toBeLessThan(2);
  });

  it("Greenwich, 2024-12-21: day length 7:49:58 (±2 min)", () => {
    // NOAA solar calculator (references.md, Sun times): 08:03:20 / 15:53:18 UTC.
    expect(Math.abs(litMinutes(Date.UTC(2024, 11, 21)) - (7 * 60 + 49 + 58 / 60))).toBeLessThan(2);
  });

  it("no daylight in the hour before sunrise, some in the hour that holds it", () => {
    const hours = daylightByHour([Date.UTC(2024, 5, 20, 2), Date.UTC(2024, 5, 20, 3), Date.UTC(2024, 5, 20, 12)], 51.4769, -0.0005);
    expect(hours[0].outdoorLux).toBe(0);
    // Sunrise 03:42:38 → about 17 of the 60 minutes are lit.
    expect(hours[1].litFraction).toBeCloseTo(17.4 / 60, 1);
    // Midsummer noon at 51.5° N: altitude ≈ 62° → ≈ 300 + 21 000 × 0.88 lx.
    expect(hours[2].outdoorLux).toBeGreaterThan(18_000);
  });
});

describe("capacitor energy in the budget", () => {
  it.each([
    [{ value: 100, unit: "uF" as const }, 3.3, 1.8, 382.5e-6],
    [{ value: 47, unit: "uF" as const }, 3, 2, 117.5e-6],
    [{ value: 0.47, unit: "F" as const }, 3.6, 2.2, 1.9082],
    [{ value: 1, unit: "F" as const }, 5, 2, 10.5],
  ])("½·C·(V₁² − V₂²): %o from %f V to %f V = %f J", (capacitance, vMax, vMin, joules) => {
    // Physics handbook, E = ½·C·(V₁² − V₂²) (references.md, Energy).
    const input = kineticInput();
    input.energy.storage = { capacitance, vMax, vMin, leakageUa: 0 };
    expect(evaluateDevice(input).usableStorageJ).toBeCloseTo(joules, 9);
  });
});
