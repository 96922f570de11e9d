import type { Step, TraceEntry } from "@/lib/bus/types";

/** Device and zone names for sentences; ids stand in for names not known. */
export type Names = { device: (id: string) => string };

/**
 * What a step did, as sentences that can be compared between two rule sets:
 * the actions carried out (by action node), the state changes and the notices.
 * Commands are left out on purpose: they follow from the changes, and their
 * transaction ids count every earlier command, so one extra command early on
 * would make every later one look different.
 */
export function effectsOf(step: Step, names: Names): string[] {
  const out: string[] = [];
  for (const entry of step.trace) for (const a of entry.actions) out.push(`Action ${a.actionId ?? a.type}: ${a.outcome}`);
  for (const c of step.changes) {
    switch (c.kind) {
      case "level":
        out.push(`${names.device(c.deviceId)} ${c.from} → ${c.to} %`);
        break;
      case "relay":
        out.push(`${names.device(c.deviceId)} ${c.isOn ? "on" : "off"}`);
        break;
      case "mode":
        out.push(`Site mode ${c.from} → ${c.to}`);
        break;
      case "emergency":
        out.push(c.isActive ? `Emergency latched (scene ${c.scene})` : "Emergency cleared");
        break;
    }
  }
  for (const n of step.notices) out.push(`Notice to ${n.recipient} by ${n.channels.join(", ")}: “${n.text}”`);
  return out;
}

export function hasEffects(step: Step): boolean {
  if (step.changes.length || step.notices.length) return true;
  for (const e of step.trace) if (e.actions.length) return true;
  return false;
}

/** Rules that passed in this step, in the order they ran. */
export function firedRules(trace: TraceEntry[]): string[] {
  const out: string[] = [];
  for (const e of trace) for (const r of e.rules) if (r.passed) out.push(r.ruleId);
  return out;
}

export function countFired(trace: TraceEntry[]): number {
  let n = 0;
  for (const e of trace) for (const r of e.rules) if (r.passed) n++;
  return n;
}

/** Items in `a` and not in `b`, counting repeats (a multiset difference), in `a`'s order. */
export function onlyIn(a: string[], b: string[]): string[] {
  const left = new Map<string, number>();
  for (const x of b) left.set(x, (left.get(x) ?? 0) + 1);
  const out: string[] = [];
  for (const x of a) {
    const n = left.get(x) ?? 0;
    if (n > 0) left.set(x, n - 1);
    else out.push(x);
  }
  return out;
}
