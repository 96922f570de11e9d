import type { DeviceEnergyInput, DeviceEnergyResult } from "./types";

/** One row of the site's budget table: the figures, not the hourly series. */
export function summarise({ input, result }: { input: DeviceEnergyInput; result: DeviceEnergyResult }) {
  return {
    deviceId: input.deviceId,
    name: input.name,
    kind: input.kind,
    power: input.power,
    zoneName: input.zoneName,
    verdict: result.verdict,
    margin: Number.isFinite(result.margin) ? result.margin : null,
    harvestPerDayJ: result.harvestPerDayJ,
    spendPerDayJ: result.spendPerDayJ,
    messagesPerDay: result.messagesPerDay,
    darkHours: result.darkHours,
    leastLux: result.leastLux,
    shortestIntervalS: result.shortestIntervalS,
    kinetic: result.kinetic,
    brownoutHours: result.week?.brownoutHours.length ?? 0,
    ruleImpact: result.ruleImpact,
    isTypical: input.typicalSections.length > 0,
    observedPerDay: input.observed?.messagesPerDay ?? null,
  };
}

export type EnergySummary = ReturnType<typeof summarise>;

/** GET /api/sites/{siteId}/energy */
export type SiteEnergyResponse = { source: "active" | "draft"; week: "shortest" | "longest"; weekLabel: string; notes: string[]; devices: EnergySummary[] };

/** GET /api/sites/{siteId}/energy/{deviceId} */
export type DeviceEnergyResponse = {
  input: DeviceEnergyInput;
  result: DeviceEnergyResult;
  weekLabel: string;
  notes: string[];
  source: "active" | "draft";
  week: "shortest" | "longest";
  timeZone: string;
};
