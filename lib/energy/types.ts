import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import type { Activity, KineticHarvester, Radio, SolarHarvester, Storage } from "@/lib/catalogue/profiles";

/** One input of a computed number, shown beside it so the number can be defended. */
export type ExplanationInput = { label: string; value: number | string; unit?: string; source?: string };

/** A computed number with its formula and inputs. */
export type Explanation = { id: string; label: string; value: number; unit: string; formula: string; inputs: ExplanationInput[]; note?: string };

export type Verdict = "covered" | "tight" | "short";

/**
 * A stream of messages a device sends. `cause` says who asks for it: a rule's
 * parameter, the device's own profile, an assumption about activity, or the
 * event log. Solar devices count per day; kinetic ones per actuation.
 */
export type MessageSource = {
  id: string;
  label: string;
  cause: "rule" | "profile" | "assumption" | "observed";
  /** Canvas node ids of the rules that make the device send this. */
  ruleNodeIds: string[];
  /** Messages per day (solar) or per actuation (kinetic). */
  count: number;
  /** Each of these messages first takes a reading (sensing energy). */
  withSensing: boolean;
  /** Periodic sources: seconds between reports, so a what-if can change it. */
  intervalS?: number;
  formula: string;
  inputs: ExplanationInput[];
};

type Energy<H> = { harvester: H; storage: Storage; radio: Radio; activity: Activity };

/** An hourly light profile at the device: artificial (zone level × lux at full) plus daylight through a window. */
export type LightProfile = {
  /** Start of each hour, epoch ms (the site's local week, Monday 00:00 first). */
  hourStarts: number[];
  /** Mean zone level in each hour, %. */
  zoneLevelPct: number[];
  /** Where the zone levels come from, in words. */
  zoneLevelSource: string;
  luxAtFull: number;
  /** Outdoor horizontal illuminance (overcast sky), mean over each hour, lx. */
  outdoorLux: number[];
  weekLabel: string;
};

export type ObservedRate = { messages: number; actuations: number; days: number; messagesPerDay: number; actuationsPerDay: number };

type Common = {
  deviceId: string;
  name: string;
  kind: DeviceKind;
  zoneId: string | null;
  zoneName: string | null;
  /** Profile sections still on typical values (with their source), so the page can say "enter yours". */
  typicalSections: { section: string; source: string }[];
  observed: ObservedRate | null;
};

export type SolarDeviceInput = Common & {
  power: "solar";
  energy: Energy<SolarHarvester>;
  messages: MessageSource[];
  light: LightProfile;
};

export type KineticDeviceInput = Common & {
  power: "kinetic";
  energy: Energy<KineticHarvester>;
  /** Messages one actuation sends (press, and release when a rule needs it). */
  messages: MessageSource[];
  actuationsPerDay: { value: number; source: string };
};

export type DeviceEnergyInput = SolarDeviceInput | KineticDeviceInput;

/** The browser's what-if controls; anything left out keeps the device's own value. */
export type WhatIf = { luxAtFull?: number; cellAreaCm2?: number; reportingIntervalS?: number; repeats?: number };

export type DeviceEnergyResult = {
  deviceId: string;
  verdict: Verdict;
  /** (harvest − spend) / spend, as a fraction. */
  margin: number;
  harvestPerDayJ: number;
  spendPerDayJ: number;
  messagesPerDay: number;
  messageEnergyUj: number;
  usableStorageJ: number;
  /** Solar: hours it runs in darkness from full; kinetic: null. */
  darkHours: number | null;
  /** Solar: least illuminance for the hours a day it is lit now. */
  leastLux: { lux: number; hoursPerDay: number } | null;
  /** Solar: most messages a day it can afford (periodic reports with their reading); null when it cannot afford even the rest. */
  maxMessagesPerDay: number | null;
  shortestIntervalS: number | null;
  /** Kinetic: messages one actuation pays for, and what the rules send per actuation. */
  kinetic: { affordablePerActuation: number; neededPerActuation: number; energyPerActuationUj: number } | null;
  /** Solar: stored energy at the end of each hour of the week (steady state), J; and the hours it browns out. */
  week: { storedJ: number[]; brownoutHours: number[] } | null;
  /** Rules that push this device over: what the verdict would be without their demands. */
  ruleImpact: { ruleNodeIds: string[]; verdictWithout: Verdict } | null;
  explanations: Explanation[];
};
