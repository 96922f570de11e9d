import type { TimeOfDay } from "@/lib/sun/schedule";
import type { ActionNode, GateNode, RuleGraph, RuleNode, TriggerNode } from "./graph";
import { enumeratePaths } from "./paths";

/**
 * Canvas paths as plain sentences, for the list beside the Canvas, the change
 * summary before Activate and narrow screens where the graph itself is too small.
 * Paths that share a trigger and gate chain are one rule and one sentence, as in
 * the compiler: "When …, only …, recall “Shop open” and notify the managers".
 */
export type SiteNames = {
  devices: Record<string, string>;
  zones: Record<string, string>;
  scenes: Record<string, string>;
  people: Record<string, string>;
};

export const NO_NAMES: SiteNames = { devices: {}, zones: {}, scenes: {}, people: {} };

export type RuleSentence = {
  /** trigger id > gate ids, as the compiler names the rule. */
  id: string;
  triggerId: string;
  nodeIds: string[];
  text: string;
};

const own = (table: Record<string, string>, key: string | number) => (Object.hasOwn(table, String(key)) ? table[String(key)] : undefined);

export const deviceName = (names: SiteNames, id: string) => own(names.devices, id) ?? `device “${id}” (not on this site)`;
export const zoneName = (names: SiteNames, id: string) => own(names.zones, id) ?? `zone “${id}” (not on this site)`;
export const sceneName = (names: SiteNames, n: number) => {
  const name = own(names.scenes, n);
  return name ? `“${name}”` : `scene ${n}`;
};

export function timeWords(t: TimeOfDay): string {
  if (t.kind === "fixed") return t.time;
  const off = t.offsetMinutes ?? 0;
  if (off === 0) return t.kind;
  return `${Math.abs(off)} min ${off < 0 ? "before" : "after"} ${t.kind}`;
}

const DAY_WORDS: Record<string, string> = { mon: "Mon", tue: "Tue", wed: "Wed", thu: "Thu", fri: "Fri", sat: "Sat", sun: "Sun" };
const WEEK = ["mon", "tue", "wed", "thu", "fri", "sat", "sun"];

export function daysWords(days: readonly string[]): string {
  const set = new Set(days);
  if (WEEK.every((d) => set.has(d))) return "every day";
  if (set.size === 5 && WEEK.slice(0, 5).every((d) => set.has(d))) return "on weekdays";
  if (set.size === 2 && set.has("sat") && set.has("sun")) return "at weekends";
  return `on ${list(WEEK.filter((d) => set.has(d)).map((d) => DAY_WORDS[d]), "and")}`;
}

/** "a", "a and b", "a, b and c". */
export function list(items: string[], joiner: "and" | "or"): string {
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")} ${joiner} ${items[items.length - 1]}`;
}

const num = (n: number) => (Number.isInteger(n) ? String(n) : String(Math.round(n * 100) / 100));
const fade = (ms: number | undefined) => (ms ? ` over ${ms >= 60_000 ? `${num(ms / 60_000)} min` : `${num(ms / 1000)} s`}` : "");
const ROLE_WORDS: Record<string, string> = { integrator: "the integrators", manager: "the managers", occupant: "the occupants" };

export function triggerWords(n: TriggerNode, names: SiteNames): string {
  const p = n.params as Record<string, unknown>;
  const dev = typeof p.device === "string" ? deviceName(names, p.device) : "";
  switch (n.type) {
    case "rocker-press":
      return `button ${n.params.button} of ${dev} is pressed`;
    case "rocker-release":
      return `button ${n.params.button} of ${dev} is let go`;
    case "rocker-long-press":
      return `button ${n.params.button} of ${dev} is held`;
    case "call-button-press":
      return `${dev} is pressed`;
    case "door-handle-turn":
      return `the handle ${dev} is turned`;
    case "motion-detected":
      return `${dev} sees motion`;
    case "vacancy":
      return `${dev} sees no motion for ${n.params.minutes} min`;
    case "light-level-below":
      return `${dev} reads below ${num(n.params.lux)} lx`;
    case "light-level-above":
      return `${dev} reads above ${num(n.params.lux)} lx`;
    case "contact-opened":
      return `${dev} opens`;
    case "contact-closed":
      return `${dev} closes`;
    case "contact-left-open":
      return `${dev} is left open for ${n.params.minutes} min`;
    case "temperature-above":
      return `${dev} reads above ${num(n.params.celsius)} °C`;
    case "temperature-below":
      return `${dev} reads below ${num(n.params.celsius)} °C`;
    case "humidity-above":
      return `${dev} reads above ${num(n.params.percent)} %RH`;
    case "humidity-below":
      return `${dev} reads below ${num(n.params.percent)} %RH`;
    case "fire-alarm-active":
      return `${dev} signals a fire alarm`;
    case "fire-alarm-cleared":
      return `${dev} signals the fire alarm has cleared`;
    case "time-of-day":
      return `it is ${timeWords(n.params.at)}`;
    case "site-mode-changed":
      return n.params.mode ? `the site mode becomes ${n.params.mode}` : "the site mode changes";
    case "timer-fired":
      return `timer “${n.params.name}” runs out`;
  }
}

export function gateWords(n: GateNode, names: SiteNames): string {
  switch (n.type) {
    case "time-window":
      return `between ${timeWords(n.params.from)} and ${timeWords(n.params.to)}`;
    case "days-of-week":
      return daysWords(n.params.days);
    case "light-level-below":
      return `if ${deviceName(names, n.params.device)} reads below ${num(n.params.lux)} lx`;
    case "zone-occupied":
      return `if ${zoneName(names, n.params.zone)} is occupied`;
    case "zone-vacant":
      return `if ${zoneName(names, n.params.zone)} is vacant`;
    case "site-mode-is":
      return `when the site mode is ${list([...n.params.modes], "or")}`;
    case "emergency-not-active":
      return "if no emergency is latched";
  }
}

export function actionWords(n: ActionNode, names: SiteNames): string {
  switch (n.type) {
    case "recall-scene":
      return `recall ${sceneName(names, n.params.scene)}`;
    case "set-level": {
      const t = n.params.target;
      return `set ${"zone" in t ? zoneName(names, t.zone) : deviceName(names, t.device)} to ${num(n.params.level)} %${fade(n.params.fadeMs)}`;
    }
    case "toggle-zone":
      return `toggle ${zoneName(names, n.params.zone)} (on at ${num(n.params.level)} %)`;
    case "relay-on":
      return `switch ${deviceName(names, n.params.device)} on`;
    case "relay-off":
      return `switch ${deviceName(names, n.params.device)} off`;
    case "relay-on-for":
      return `switch ${deviceName(names, n.params.device)} on for ${n.params.minutes} min`;
    case "notice": {
      const to = n.params.to;
      const who = "role" in to ? ROLE_WORDS[to.role] : list(to.people.map((id) => own(names.people, id) ?? `someone no longer on this site`), "and");
      return `notify ${who} by ${list([...n.params.channels].map((c) => (c === "email" ? "e-mail" : c)), "and")}: “${n.params.text}”`;
    }
    case "start-timer":
      return `start timer “${n.params.name}” for ${num(n.params.minutes)} min`;
    case "cancel-timer":
      return `cancel timer “${n.params.name}”`;
    case "latch-emergency":
      return `latch the emergency scene ${sceneName(names, n.params.scene)}${n.params.othersOff ? " with everything else off" : ""}`;
    case "clear-emergency":
      return "clear the emergency";
    case "set-site-mode":
      return `set the site mode to ${n.params.mode}`;
    case "hold-zone":
      return `hold ${zoneName(names, n.params.zone)} as it is for ${n.params.minutes} min`;
  }
}

export function nodeWords(n: RuleNode, names: SiteNames): string {
  return n.kind === "trigger" ? triggerWords(n, names) : n.kind === "gate" ? gateWords(n, names) : actionWords(n, names);
}

export function sentence(trigger: TriggerNode, gates: GateNode[], actions: ActionNode[], names: SiteNames): string {
  const parts = [`When ${triggerWords(trigger, names)}`, ...gates.map((g) => `only ${gateWords(g, names)}`), list(actions.map((a) => actionWords(a, names)), "and")];
  return parts.join(", ");
}

export type RuleGroup = { id: string; trigger: TriggerNode; gates: GateNode[]; actions: ActionNode[] };

/** Paths grouped as the compiler groups them: one rule per trigger + gate chain, its actions in graph order. */
export function ruleGroups(graph: RuleGraph): RuleGroup[] {
  const rules = new Map<string, RuleGroup>();
  for (const path of enumeratePaths(graph)) {
    const id = [path.trigger.id, ...path.gates.map((g) => g.id)].join(">");
    const rule = rules.get(id) ?? { id, trigger: path.trigger, gates: path.gates, actions: [] };
    if (!rule.actions.some((a) => a.id === path.action.id)) rule.actions.push(path.action);
    rules.set(id, rule);
  }
  return [...rules.values()];
}

/** One sentence per rule (trigger + gate chain), in the compiler's path order. */
export function graphSentences(graph: RuleGraph, names: SiteNames): RuleSentence[] {
  return ruleGroups(graph).map((r) => ({
    id: r.id,
    triggerId: r.trigger.id,
    nodeIds: [r.trigger.id, ...r.gates.map((g) => g.id), ...r.actions.map((a) => a.id)],
    text: sentence(r.trigger, r.gates, r.actions, names),
  }));
}

/** What a node on the Canvas shows under its type: the device or zone, and the key parameter with its unit. */
export function nodeSubject(n: RuleNode, names: SiteNames): { subject: string; detail: string } {
  const p = n.params as Record<string, unknown>;
  const device = typeof p.device === "string" ? deviceName(names, p.device) : undefined;
  const zone = typeof p.zone === "string" ? zoneName(names, p.zone) : undefined;
  switch (n.type) {
    case "rocker-press":
    case "rocker-release":
    case "rocker-long-press":
      return { subject: device!, detail: `button ${p.button}` };
    case "vacancy":
    case "contact-left-open":
      return { subject: device!, detail: `${p.minutes} min` };
    case "light-level-below":
    case "light-level-above":
      return n.kind === "gate" ? { subject: device!, detail: `below ${num(n.params.lux)} lx` } : { subject: device!, detail: `${n.type.endsWith("above") ? "above" : "below"} ${num(p.lux as number)} lx` };
    case "temperature-above":
    case "temperature-below":
      return { subject: device!, detail: `${n.type.endsWith("above") ? "above" : "below"} ${num(p.celsius as number)} °C` };
    case "humidity-above":
    case "humidity-below":
      return { subject: device!, detail: `${n.type.endsWith("above") ? "above" : "below"} ${num(p.percent as number)} %RH` };
    case "time-of-day":
      return { subject: "Clock", detail: timeWords(n.params.at) };
    case "site-mode-changed":
      return { subject: "Site mode", detail: n.params.mode ?? "any change" };
    case "timer-fired":
    case "cancel-timer":
      return { subject: "Timer", detail: `“${p.name}”` };
    case "time-window":
      return { subject: "Clock", detail: `${timeWords(n.params.from)} – ${timeWords(n.params.to)}` };
    case "days-of-week":
      return { subject: "Calendar", detail: daysWords(n.params.days) };
    case "site-mode-is":
      return { subject: "Site mode", detail: list([...n.params.modes], "or") };
    case "emergency-not-active":
      return { subject: "Emergency", detail: "not latched" };
    case "recall-scene":
    case "latch-emergency":
      return { subject: "Scene", detail: sceneName(names, p.scene as number) };
    case "set-level": {
      const t = n.params.target;
      return { subject: "zone" in t ? zoneName(names, t.zone) : deviceName(names, t.device), detail: `${num(n.params.level)} %${fade(n.params.fadeMs)}` };
    }
    case "toggle-zone":
      return { subject: zone!, detail: `on at ${num(n.params.level)} %` };
    case "hold-zone":
      return { subject: zone!, detail: `${n.params.minutes} min` };
    case "relay-on":
      return { subject: device!, detail: "on" };
    case "relay-off":
      return { subject: device!, detail: "off" };
    case "relay-on-for":
      return { subject: device!, detail: `on for ${n.params.minutes} min` };
    case "notice": {
      const to = n.params.to;
      return { subject: "role" in to ? ROLE_WORDS[to.role].replace("the ", "") : list(to.people.map((id) => own(names.people, id) ?? "?"), "and"), detail: [...n.params.channels].join(", ") };
    }
    case "start-timer":
      return { subject: "Timer", detail: `“${n.params.name}”, ${num(n.params.minutes)} min` };
    case "clear-emergency":
      return { subject: "Emergency", detail: "clear" };
    case "set-site-mode":
      return { subject: "Site mode", detail: n.params.mode };
    default:
      return { subject: device ?? zone ?? "", detail: "" };
  }
}
