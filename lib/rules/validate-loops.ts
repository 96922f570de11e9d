import type { RuleGraph } from "./graph";
import { compileGraph, type PathAction, type RuleJson } from "./compile";
import { ANY_MODE, triggerKey } from "./trigger-key";
import type { Problem, SiteContext } from "./validate";

type Link = { to: number; actionId: string; viaTimer: boolean };

/** The trigger keys an action sets off by itself: a timer it starts, a site mode it sets. */
function producedKeys(action: PathAction): { key: string; viaTimer: boolean }[] {
  if (action.type === "start-timer") return [{ key: triggerKey("timer-fired", action.params.name), viaTimer: true }];
  if (action.type === "set-site-mode") {
    return [triggerKey("site-mode-changed", action.params.mode), triggerKey("site-mode-changed", ANY_MODE)].map((key) => ({ key, viaTimer: false }));
  }
  return [];
}

export function validateLoopsAndConflicts(graph: RuleGraph, site: SiteContext): Problem[] {
  const rules = compileGraph(graph);
  return [...findLoops(rules), ...findConflicts(rules, site)];
}

/**
 * A loop: a path whose action sets off its own trigger again, directly or via
 * other paths. Through a timer it repeats every few minutes for ever (warning);
 * through site modes alone it would spin at once (error; the engine stops it).
 */
function findLoops(rules: RuleJson[]): Problem[] {
  const links: Link[][] = rules.map((r) =>
    r.event.params.actions.flatMap((a) =>
      producedKeys(a).flatMap(({ key, viaTimer }) =>
        rules.flatMap((target, to) => {
          // Setting the mode a mode trigger just saw changes nothing, so it cannot loop.
          if (target.event.params.triggerKey !== key || (!viaTimer && to === rules.indexOf(r))) return [];
          return [{ to, actionId: a.nodeId, viaTimer }];
        }),
      ),
    ),
  );
  const problems: Problem[] = [];
  const state = new Map<number, "open" | "done">();
  const stack: Link[] = [];
  const reported = new Set<string>();
  const visit = (i: number) => {
    state.set(i, "open");
    for (const link of links[i]) {
      if (state.get(link.to) === "open") {
        const start = stack.findIndex((l) => l.to === link.to);
        const cycle = [...stack.slice(start + 1), link];
        if (reported.has(link.actionId)) continue;
        reported.add(link.actionId);
        const timed = cycle.some((l) => l.viaTimer);
        problems.push(
          timed
            ? { nodeId: link.actionId, severity: "warning", message: "This action sets off its own trigger again (through a timer), so it repeats for ever. Add a gate or cancel the timer if that is not meant." }
            : { nodeId: link.actionId, severity: "error", message: "These paths change the site mode back and forth without end. Break the circle." },
        );
      } else if (!state.has(link.to)) {
        stack.push(link);
        visit(link.to);
        stack.pop();
      }
    }
    state.set(i, "done");
  };
  rules.forEach((_, i) => state.has(i) || visit(i));
  return problems;
}

type Effect = { ruleIndex: number; actionId: string; target: string; what: string };

/** Two paths on the same trigger telling the same luminaire, relay or mode different things. */
function findConflicts(rules: RuleJson[], site: SiteContext): Problem[] {
  const luminairesIn = (zoneId: string) => site.devices.filter((d) => d.zoneId === zoneId).map((d) => d.id);
  const effects = new Map<string, Effect[]>();
  rules.forEach((rule, ruleIndex) => {
    for (const a of rule.event.params.actions) {
      const push = (target: string, what: string) => {
        const list = effects.get(rule.event.params.triggerKey) ?? [];
        list.push({ ruleIndex, actionId: a.nodeId, target, what });
        effects.set(rule.event.params.triggerKey, list);
      };
      if (a.type === "set-level") ("zone" in a.params.target ? luminairesIn(a.params.target.zone) : [a.params.target.device]).forEach((d) => push(d, `${a.params.level} %`));
      if (a.type === "toggle-zone") luminairesIn(a.params.zone).forEach((d) => push(d, "toggle"));
      if (a.type === "recall-scene") {
        for (const l of site.scenes?.find((s) => s.number === a.params.scene)?.levels ?? []) {
          (l.zoneId ? luminairesIn(l.zoneId) : [l.deviceId!]).forEach((d) => push(d, `scene ${a.params.scene}`));
        }
      }
      if (a.type === "relay-on" || a.type === "relay-on-for") push(a.params.device, "on");
      if (a.type === "relay-off") push(a.params.device, "off");
      if (a.type === "set-site-mode") push("site mode", a.params.mode);
    }
  });
  const problems: Problem[] = [];
  const reported = new Set<string>();
  for (const list of effects.values()) {
    for (let i = 0; i < list.length; i++) {
      for (let j = i + 1; j < list.length; j++) {
        const [a, b] = [list[i], list[j]];
        if (a.target !== b.target || a.what === b.what || a.actionId === b.actionId) continue;
        if (exclusive(rules[a.ruleIndex], rules[b.ruleIndex])) continue;
        const pair = `${a.actionId}|${b.actionId}`;
        if (reported.has(pair)) continue;
        reported.add(pair);
        const name = site.devices.find((d) => d.id === a.target)?.name ?? a.target;
        problems.push({ nodeId: b.actionId, severity: "warning", message: `On the same trigger, two paths set ${name} differently (${a.what} and ${b.what}); if both pass, the later one wins.` });
      }
    }
  }
  return problems;
}

/** Gates that can never pass together: disjoint site modes, or occupied vs vacant for one zone. */
function exclusive(a: RuleJson, b: RuleJson): boolean {
  for (const x of a.conditions.all) {
    for (const y of b.conditions.all) {
      if (x.fact !== y.fact) continue;
      if (x.operator === "oneOf" && y.operator === "oneOf" && x.fact === "site-mode") {
        const ys = y.value as string[];
        if (!(x.value as string[]).some((m) => ys.includes(m))) return true;
      }
      if (x.operator === "is" && y.operator === "is" && x.value !== y.value) return true;
    }
  }
  return false;
}
