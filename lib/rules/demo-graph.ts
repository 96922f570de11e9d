import type { SceneConfig } from "@/lib/bus/types";
import { chainEdges, parseRuleGraph, type RuleGraphInput } from "./graph";

/**
 * The invented demo site's first Rule set (Larch Lane Studio), on the seed's
 * device and zone ids, so the seed can store it and tests can run the scenario.
 * Every gate node has exactly one trigger upstream: a gate shared by two
 * triggers would join their paths and send each trigger to the other's actions.
 */
const dev = (key: string) => `larch-lane-dev-${key}`;
const zone = (key: string) => `larch-lane-zone-${key}`;

/** Scene numbers the rules recall; levels in percent. Scene 9 is the escape route. */
export const DEMO_SCENES = { shopOpen: 1, shopClosed: 2, flatEvening: 3, escape: 9 } as const;

export const demoScenes: SceneConfig[] = [
  { number: 1, name: "Shop open", fadeMs: 2000, levels: [{ zoneId: zone("shop"), level: 80 }, { zoneId: zone("window"), level: 100 }, { zoneId: zone("textile"), level: 60 }] },
  { number: 2, name: "Shop closed", fadeMs: 5000, levels: [{ zoneId: zone("shop"), level: 0 }, { zoneId: zone("window"), level: 0 }, { zoneId: zone("textile"), level: 0 }] },
  { number: 3, name: "Flat evening", fadeMs: 3000, levels: [{ zoneId: zone("flat"), level: 60 }, { deviceId: dev("dl-flat-2"), level: 30 }] },
  { number: 9, name: "Escape route", fadeMs: 0, levels: [{ zoneId: zone("escape"), level: 100 }, { zoneId: zone("path"), level: 100 }] },
];

type N = RuleGraphInput["nodes"][number];
const nodes: N[] = [];
const edges: RuleGraphInput["edges"] = [];
const node = (n: N) => nodes.push(n);
const link = (...chain: string[]) => edges.push(...chainEdges(...chain));

// Opening hours: a schedule sets the site mode; the mode recalls the shop scenes.
node({ id: "t-opening", kind: "trigger", type: "time-of-day", params: { at: { kind: "fixed", time: "09:00" } } });
node({ id: "g-trading-days", kind: "gate", type: "days-of-week", params: { days: ["mon", "tue", "wed", "thu", "fri", "sat"] } });
node({ id: "a-mode-open", kind: "action", type: "set-site-mode", params: { mode: "open" } });
node({ id: "t-closing", kind: "trigger", type: "time-of-day", params: { at: { kind: "fixed", time: "17:30" } } });
node({ id: "a-mode-closed", kind: "action", type: "set-site-mode", params: { mode: "closed" } });
node({ id: "t-now-open", kind: "trigger", type: "site-mode-changed", params: { mode: "open" } });
node({ id: "a-scene-open", kind: "action", type: "recall-scene", params: { scene: DEMO_SCENES.shopOpen } });
node({ id: "t-now-closed", kind: "trigger", type: "site-mode-changed", params: { mode: "closed" } });
node({ id: "a-scene-closed", kind: "action", type: "recall-scene", params: { scene: DEMO_SCENES.shopClosed } });
link("t-opening", "g-trading-days", "a-mode-open");
link("t-closing", "a-mode-closed");
link("t-now-open", "a-scene-open");
link("t-now-closed", "a-scene-closed");

// A visitor on the front path after closing: a notice to the flat, and the path lights if it is dark.
node({ id: "t-path-motion", kind: "trigger", type: "motion-detected", params: { device: dev("sensor-path") } });
node({ id: "g-path-after-hours", kind: "gate", type: "site-mode-is", params: { modes: ["closed"] } });
node({ id: "a-visitor-notice", kind: "action", type: "notice", params: { to: { role: "occupant" }, channels: ["push", "in-app"], text: "Someone is on the front path ({time})." } });
node({ id: "g-path-dark", kind: "gate", type: "light-level-below", params: { device: dev("sensor-path"), lux: 20 } });
node({ id: "a-path-on", kind: "action", type: "set-level", params: { target: { zone: zone("path") }, level: 100, fadeMs: 1000 } });
node({ id: "t-path-vacant", kind: "trigger", type: "vacancy", params: { device: dev("sensor-path"), minutes: 3 } });
node({ id: "a-path-off", kind: "action", type: "set-level", params: { target: { zone: zone("path") }, level: 0, fadeMs: 10_000 } });
link("t-path-motion", "g-path-after-hours", "a-visitor-notice");
link("g-path-after-hours", "g-path-dark", "a-path-on");
link("t-path-vacant", "a-path-off");

// Workshop climate: the fan relay runs above 28 °C or 65 %RH and stops once it has cooled below 26 °C.
node({ id: "t-workshop-hot", kind: "trigger", type: "temperature-above", params: { device: dev("climate-workshop"), celsius: 28, hysteresis: 1 } });
node({ id: "t-workshop-damp", kind: "trigger", type: "humidity-above", params: { device: dev("climate-workshop"), percent: 65, hysteresis: 3 } });
node({ id: "a-fan-on", kind: "action", type: "relay-on", params: { device: dev("fan-workshop") } });
node({ id: "t-workshop-cool", kind: "trigger", type: "temperature-below", params: { device: dev("climate-workshop"), celsius: 26, hysteresis: 1 } });
node({ id: "a-fan-off", kind: "action", type: "relay-off", params: { device: dev("fan-workshop") } });
link("t-workshop-hot", "a-fan-on");
link("t-workshop-damp", "a-fan-on");
link("t-workshop-cool", "a-fan-off");

// Fire-alarm input: escape scene, everything else off, latched until someone clears it.
node({ id: "t-fire", kind: "trigger", type: "fire-alarm-active", params: { device: dev("fire-input") } });
node({ id: "a-latch", kind: "action", type: "latch-emergency", params: { scene: DEMO_SCENES.escape, othersOff: true } });
node({ id: "a-fire-notice-manager", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["push", "in-app", "email"], text: "Fire-alarm input active at {time}: escape lighting latched on." } });
node({ id: "a-fire-notice-flat", kind: "action", type: "notice", params: { to: { role: "occupant" }, channels: ["push"], text: "Fire-alarm input active at {time}: leave by the stairs." } });
node({ id: "t-fire-cleared", kind: "trigger", type: "fire-alarm-cleared", params: { device: dev("fire-input") } });
node({ id: "a-fire-cleared-notice", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app", "email"], text: "Fire-alarm input cleared at {time}. Escape lighting stays on until someone clears the emergency." } });
node({ id: "t-flat-hold-4", kind: "trigger", type: "rocker-long-press", params: { device: dev("rocker-flat"), button: 4 } });
node({ id: "a-clear", kind: "action", type: "clear-emergency", params: {} });
link("t-fire", "a-latch");
link("t-fire", "a-fire-notice-manager");
link("t-fire", "a-fire-notice-flat");
link("t-fire-cleared", "a-fire-cleared-notice");
link("t-flat-hold-4", "a-clear");

// Back door left open for 10 minutes after hours.
node({ id: "t-back-open", kind: "trigger", type: "contact-left-open", params: { device: dev("contact-back"), minutes: 10 } });
node({ id: "g-back-after-hours", kind: "gate", type: "site-mode-is", params: { modes: ["closed"] } });
node({ id: "a-back-notice", kind: "action", type: "notice", params: { to: { role: "occupant" }, channels: ["push", "in-app"], text: "The back door has been open for 10 minutes ({time})." } });
link("t-back-open", "g-back-after-hours", "a-back-notice");

// Rockers and the counter call button.
node({ id: "t-shop-b1", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-shop-door"), button: 1 } });
node({ id: "t-shop-b2", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-shop-door"), button: 2 } });
node({ id: "a-shop-scene-open", kind: "action", type: "recall-scene", params: { scene: DEMO_SCENES.shopOpen } });
node({ id: "a-shop-scene-closed", kind: "action", type: "recall-scene", params: { scene: DEMO_SCENES.shopClosed } });
node({ id: "t-workshop-b1", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-workshop"), button: 1 } });
node({ id: "a-workshop-toggle", kind: "action", type: "toggle-zone", params: { zone: zone("workshop"), level: 100, fadeMs: 500 } });
node({ id: "t-workshop-b2", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-workshop"), button: 2 } });
node({ id: "a-fan-boost", kind: "action", type: "relay-on-for", params: { device: dev("fan-workshop"), minutes: 30 } });
node({ id: "t-flat-b1", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-flat"), button: 1 } });
node({ id: "a-flat-toggle", kind: "action", type: "toggle-zone", params: { zone: zone("flat"), level: 80, fadeMs: 1000 } });
node({ id: "t-flat-b2", kind: "trigger", type: "rocker-press", params: { device: dev("rocker-flat"), button: 2 } });
node({ id: "a-flat-evening", kind: "action", type: "recall-scene", params: { scene: DEMO_SCENES.flatEvening } });
node({ id: "t-counter-call", kind: "trigger", type: "call-button-press", params: { device: dev("call-counter") } });
node({ id: "a-counter-notice", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["push", "in-app"], text: "Someone is waiting at the counter ({time})." } });
link("t-shop-b1", "a-shop-scene-open");
link("t-shop-b2", "a-shop-scene-closed");
link("t-workshop-b1", "a-workshop-toggle");
link("t-workshop-b2", "a-fan-boost");
link("t-flat-b1", "a-flat-toggle");
link("t-flat-b2", "a-flat-evening");
link("t-counter-call", "a-counter-notice");

// Care: watch the humidity in textile case A. The rule asks the solar sensor for a
// reading every 10 s, which its cell in the dim case cannot pay for: the Energy
// budget shows the device Short because of this rule (300 s or more is Covered).
node({ id: "t-case-a-damp", kind: "trigger", type: "humidity-above", params: { device: dev("climate-case-a"), percent: 60, hysteresis: 3, reportSeconds: 10 } });
node({ id: "a-case-a-notice", kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["push", "in-app"], text: "Textile case A is above 60 %RH ({time}): check the case.", kind: "care" } });
link("t-case-a-damp", "a-case-a-notice");

// Daylight dimming at the shop window while open.
node({ id: "t-window-bright", kind: "trigger", type: "light-level-above", params: { device: dev("lux-window"), lux: 800, hysteresisLux: 100 } });
node({ id: "g-window-open-bright", kind: "gate", type: "site-mode-is", params: { modes: ["open"] } });
node({ id: "a-window-dim", kind: "action", type: "set-level", params: { target: { zone: zone("window") }, level: 20, fadeMs: 30_000 } });
node({ id: "t-window-dull", kind: "trigger", type: "light-level-below", params: { device: dev("lux-window"), lux: 400, hysteresisLux: 100 } });
node({ id: "g-window-open-dull", kind: "gate", type: "site-mode-is", params: { modes: ["open"] } });
node({ id: "a-window-full", kind: "action", type: "set-level", params: { target: { zone: zone("window") }, level: 100, fadeMs: 30_000 } });
link("t-window-bright", "g-window-open-bright", "a-window-dim");
link("t-window-dull", "g-window-open-dull", "a-window-full");

export const demoRuleGraph = parseRuleGraph({ nodes, edges });
