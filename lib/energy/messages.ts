import { DEVICE_KIND_INFO, type DeviceKind } from "@/lib/catalogue/device-kinds";
import type { Activity } from "@/lib/catalogue/profiles";
import type { RuleGraph } from "@/lib/rules/graph";
import { ENERGY_CONSTANTS as C, SECONDS_PER_DAY } from "./constants";
import type { MessageSource } from "./types";

/** Events a device logged per kind over `days` (gateway and imports only: the Test bench is not the device). */
export type ObservedCounts = { byKind: Record<string, number>; days: number };

const READING_TRIGGERS = new Set(["light-level-below", "light-level-above", "temperature-above", "temperature-below", "humidity-above", "humidity-below"]);
const PRESS_KINDS = new Set(["press", "turn"]);

type Node = RuleGraph["nodes"][number];

function nodesOn(graph: RuleGraph | null, deviceId: string): Node[] {
  if (!graph) return [];
  return graph.nodes.filter((n) => "device" in n.params && (n.params as { device?: string }).device === deviceId);
}

const perDay = (observed: ObservedCounts | null, kind: string) => (observed && observed.days > 0 && observed.byKind[kind] ? observed.byKind[kind] / observed.days : null);

/**
 * What a solar device sends in a day: periodic readings (at the device's own
 * interval or faster when a rule asks for it), heartbeats, threshold
 * crossings when it reports only on change, motion (capped by its blind time)
 * and contact changes — each with who asks for it.
 */
export function solarMessages({ deviceId, kind, activity, graph, observed }: { deviceId: string; kind: DeviceKind; activity: Activity; graph: RuleGraph | null; observed: ObservedCounts | null }): MessageSource[] {
  const reports = DEVICE_KIND_INFO[kind].reports;
  const nodes = nodesOn(graph, deviceId);
  const out: MessageSource[] = [];
  const readsValues = reports.some((r) => r === "light-level" || r === "temperature" || r === "humidity");
  if (readsValues) {
    const asking = nodes.flatMap((n) => {
      const s = (n.params as { reportSeconds?: number }).reportSeconds;
      return n.kind === "trigger" && READING_TRIGGERS.has(n.type) && typeof s === "number" ? [{ id: n.id, seconds: s }] : [];
    });
    const ruleMin = asking.length ? Math.min(...asking.map((a) => a.seconds)) : null;
    const own = activity.reportingIntervalS ?? null;
    const byRule = ruleMin !== null && (own === null || ruleMin < own);
    const interval = byRule ? ruleMin : own;
    if (interval !== null) {
      const ids = byRule ? asking.filter((a) => a.seconds === ruleMin).map((a) => a.id) : [];
      out.push({
        id: "periodic",
        label: byRule ? "Readings a rule asks for" : "Periodic readings (device setting)",
        cause: byRule ? "rule" : "profile",
        ruleNodeIds: ids,
        count: SECONDS_PER_DAY / interval,
        withSensing: true,
        intervalS: interval,
        formula: `86 400 s ÷ ${interval} s`,
        inputs: [{ label: byRule ? "Report every (rule)" : "Reporting interval (profile)", value: interval, unit: "s" }],
      });
    } else {
      const thresholds = nodes.filter((n) => (n.kind === "trigger" && READING_TRIGGERS.has(n.type)) || (n.kind === "gate" && n.type === "light-level-below"));
      if (thresholds.length) {
        out.push({
          id: "crossings",
          label: "Reports on change (threshold crossings)",
          cause: "rule",
          ruleNodeIds: thresholds.map((n) => n.id),
          count: thresholds.length * C.thresholdCrossingsPerDay.value,
          withSensing: true,
          formula: `${thresholds.length} threshold(s) × ${C.thresholdCrossingsPerDay.value} crossings a day`,
          inputs: [{ label: "Crossings per threshold", value: C.thresholdCrossingsPerDay.value, unit: "/day", source: C.thresholdCrossingsPerDay.source }],
        });
      }
    }
  }
  if (activity.heartbeatS) {
    out.push({ id: "heartbeat", label: "Heartbeats", cause: "profile", ruleNodeIds: [], count: SECONDS_PER_DAY / activity.heartbeatS, withSensing: false, formula: `86 400 s ÷ ${activity.heartbeatS} s`, inputs: [{ label: "Heartbeat every", value: activity.heartbeatS, unit: "s" }] });
  }
  if (reports.includes("motion")) {
    const seen = perDay(observed, "motion");
    const cap = SECONDS_PER_DAY / C.motionBlindS.value;
    const events = Math.min(seen ?? C.motionEventsPerDay.value, cap);
    out.push({
      id: "motion",
      label: "Motion reports",
      cause: seen !== null ? "observed" : "assumption",
      ruleNodeIds: nodes.filter((n) => n.type === "motion-detected" || n.type === "vacancy").map((n) => n.id),
      count: events,
      withSensing: false,
      formula: `min(motion events a day, 86 400 s ÷ ${C.motionBlindS.value} s blind time)`,
      inputs: [
        seen !== null ? { label: "Motion events a day (event log)", value: round(seen), unit: "/day" } : { label: "Motion events a day", value: C.motionEventsPerDay.value, unit: "/day", source: C.motionEventsPerDay.source },
        { label: "Blind time", value: C.motionBlindS.value, unit: "s", source: C.motionBlindS.source },
      ],
    });
  }
  if (reports.includes("contact")) {
    const seen = perDay(observed, "contact");
    out.push({
      id: "contact",
      label: "Contact changes",
      cause: seen !== null ? "observed" : "assumption",
      ruleNodeIds: nodes.filter((n) => n.type.startsWith("contact-")).map((n) => n.id),
      count: seen ?? C.contactChangesPerDay.value,
      withSensing: false,
      formula: "one message per opening or closing",
      inputs: [seen !== null ? { label: "Changes a day (event log)", value: round(seen), unit: "/day" } : { label: "Changes a day", value: C.contactChangesPerDay.value, unit: "/day", source: C.contactChangesPerDay.source }],
    });
  }
  return out;
}

/** What one actuation of a kinetic device sends: the press (or turn), and the release when a rule needs it. */
export function kineticMessages({ deviceId, kind, graph }: { deviceId: string; kind: DeviceKind; graph: RuleGraph | null }): MessageSource[] {
  const nodes = nodesOn(graph, deviceId);
  const isHandle = kind === "kinetic-door-handle";
  const out: MessageSource[] = [
    {
      id: "press",
      label: isHandle ? "Turn message" : "Press message",
      cause: "profile",
      ruleNodeIds: nodes.filter((n) => n.type === "rocker-press" || n.type === "call-button-press" || n.type === "door-handle-turn").map((n) => n.id),
      count: 1,
      withSensing: false,
      formula: "every actuation sends one",
      inputs: [],
    },
  ];
  const needRelease = nodes.filter((n) => n.type === "rocker-release" || n.type === "rocker-long-press");
  if (needRelease.length) {
    out.push({ id: "release", label: "Release message (a rule needs the release or a long press)", cause: "rule", ruleNodeIds: needRelease.map((n) => n.id), count: 1, withSensing: false, formula: "one more message on release", inputs: [] });
  }
  return out;
}

/** Actuations a day: from the event log when it has history, otherwise the assumption. */
export function actuationsPerDay(observed: ObservedCounts | null): { value: number; source: string } {
  if (observed && observed.days > 0) {
    const count = Object.entries(observed.byKind).reduce((n, [k, c]) => n + (PRESS_KINDS.has(k) ? c : 0), 0);
    if (count > 0) return { value: count / observed.days, source: `event log: ${count} over ${round(observed.days)} day(s)` };
  }
  return { value: C.actuationsPerDay.value, source: C.actuationsPerDay.source };
}

const round = (x: number) => Number(x.toPrecision(3));
