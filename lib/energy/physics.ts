import { leAirtimeUs, type Radio } from "@/lib/catalogue/profiles";
import { ENERGY_CONSTANTS as C } from "./constants";

/**
 * The physics of the budget, each a one-line formula so tests can check it
 * against published values. Units are in the names: µW, µJ, lx, cm².
 */

/** Irradiance from illuminance: E/LER (1 lx = 1 lm/m²), in µW/cm² (1 W/m² = 100 µW/cm²). */
export function irradianceUwPerCm2(lux: number, lerLmPerW: number): number {
  if (!(lerLmPerW > 0)) throw new RangeError(`luminous efficacy must be > 0 lm/W, got ${lerLmPerW}`);
  return (Math.max(0, lux) / lerLmPerW) * 100;
}

/** Electrical power of a cell: area × efficiency × irradiance, µW. */
export function cellPowerUw(areaCm2: number, efficiencyPct: number, irradianceUwCm2: number): number {
  return areaCm2 * (efficiencyPct / 100) * irradianceUwCm2;
}

/** Overcast-sky horizontal illuminance for a solar altitude (radians); 0 with the sun below the horizon. */
export function overcastSkyLux(altitudeRad: number): number {
  return altitudeRad > 0 ? C.overcastA.value + C.overcastB.value * Math.sin(altitudeRad) : 0;
}

export type MessageEnergy = { airtimeUs: number; transmissions: number; packetUj: number; totalUj: number };

/**
 * One mesh message: each transmission goes out on every advertising channel;
 * each channel costs airtime plus radio start-up at TX current and supply
 * voltage; the message pays the wake-up once. E = V·I·(t_air + t_ramp)·channels·(repeats + 1) + E_wake.
 */
export function messageEnergy(radio: Pick<Radio, "supplyV" | "txCurrentMa" | "phy" | "repeats" | "channels">, opts: { rampUs?: number; wakeUj?: number; payloadOctets?: number } = {}): MessageEnergy {
  const airtimeUs = leAirtimeUs(opts.payloadOctets ?? C.advPayloadOctets.value, radio.phy);
  const rampUs = opts.rampUs ?? C.rampUs.value;
  const transmissions = radio.repeats + 1;
  // V · mA · µs = nJ; /1000 → µJ.
  const packetUj = (radio.supplyV * radio.txCurrentMa * (airtimeUs + rampUs) * radio.channels) / 1000;
  return { airtimeUs, transmissions, packetUj, totalUj: packetUj * transmissions + (opts.wakeUj ?? C.wakeUj.value) };
}

/** Continuous power of a current at a voltage: µA × V = µW. */
export function currentPowerUw(currentUa: number, volts: number): number {
  return currentUa * volts;
}
