/**
 * Seeded synthetic rule graphs for the benchmarks: each rule is one trigger, up
 * to two gates and a set-level action, drawn from the devices and zones given.
 * `shares` are the chances of each trigger kind (they sum to 1; the last takes the rest).
 */
import { chainEdges, type RuleGraphInput } from "@/lib/rules/graph";

export type SyntheticSite = {
  rockers: string[];
  luxSensors: string[];
  climateSensors: string[];
  motionSensors: string[];
  /** Zones a "zone occupied" gate may name. */
  occupiedZones: string[];
  /** Zones the set-level actions drive. */
  actionZones: string[];
};
export type TriggerShares = { rocker: number; lux: number; temperature: number; motion: number; vacancy: number };

export function synthRuleGraph(count: number, rand: () => number, site: SyntheticSite, shares: TriggerShares): RuleGraphInput {
  const pick = <T>(xs: T[]) => xs[Math.floor(rand() * xs.length)];
  const int = (lo: number, hi: number) => lo + Math.floor(rand() * (hi - lo + 1));
  const toLux = shares.rocker + shares.lux;
  const toTemperature = toLux + shares.temperature;
  const toMotion = toTemperature + shares.motion;
  const nodes: RuleGraphInput["nodes"] = [];
  const edges: RuleGraphInput["edges"] = [];
  for (let i = 0; i < count; i++) {
    const r = rand();
    const trigger =
      r < shares.rocker ? { type: "rocker-press", params: { device: pick(site.rockers), button: int(1, 4) } }
      : r < toLux ? { type: pick(["light-level-below", "light-level-above"]), params: { device: pick(site.luxSensors), lux: int(1, 40) * 25, hysteresisLux: 20 } }
      : r < toTemperature ? { type: "temperature-above", params: { device: pick(site.climateSensors), celsius: int(20, 30), hysteresis: 0.5 } }
      : r < toMotion || shares.vacancy === 0 ? { type: "motion-detected", params: { device: pick(site.motionSensors) } }
      : { type: "vacancy", params: { device: pick(site.motionSensors), minutes: int(2, 20) } };
    nodes.push({ id: `t${i}`, kind: "trigger", ...trigger } as RuleGraphInput["nodes"][number]);
    const gates: string[] = [];
    for (let g = 0; g < int(0, 2); g++) {
      const q = rand();
      const gate =
        q < 0.4 ? { type: "site-mode-is", params: { modes: [pick(["open", "closed"])] } }
        : q < 0.7 ? { type: "light-level-below", params: { device: pick(site.luxSensors), lux: int(1, 40) * 25 } }
        : q < 0.85 ? { type: "zone-occupied", params: { zone: pick(site.occupiedZones) } }
        : q < 0.95 ? { type: "days-of-week", params: { days: ["mon", "tue", "wed", "thu", "fri"] } }
        : { type: "time-window", params: { from: { kind: "fixed", time: "07:00" }, to: { kind: "fixed", time: "19:00" } } };
      nodes.push({ id: `g${i}-${g}`, kind: "gate", ...gate } as RuleGraphInput["nodes"][number]);
      gates.push(`g${i}-${g}`);
    }
    nodes.push({ id: `a${i}`, kind: "action", type: "set-level", params: { target: { zone: pick(site.actionZones) }, level: int(0, 10) * 10, fadeMs: 1000 } });
    edges.push(...chainEdges(`t${i}`, ...gates, `a${i}`));
  }
  return { nodes, edges };
}
