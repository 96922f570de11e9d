import type { Step } from "@/lib/bus/types";

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
  for (const a of step.actions) out.push(`Action ${a.actionId ?? a.type}: ${a.outcome}`);
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

/**
 * The same items as effectsOf, in the same order, as keys that hold every field
 * a sentence is made of (ids rather than names): cheaper to make and to compare,
 * so a Compare builds sentences only for the differences it keeps.
 */
export function effectKeys(step: Step): string[] {
  const out: string[] = [];
  for (const a of step.actions) out.push("a\u0000" + (a.actionId ?? a.type) + "\u0000" + a.outcome);
  for (const c of step.changes) {
    switch (c.kind) {
      case "level":
        out.push("l\u0000" + c.deviceId + "\u0000" + c.from + "\u0000" + c.to);
        break;
      case "relay":
        out.push("r\u0000" + c.deviceId + "\u0000" + c.isOn);
        break;
      case "mode":
        out.push("m\u0000" + c.from + "\u0000" + c.to);
        break;
      case "emergency":
        out.push(c.isActive ? "e\u0000" + c.scene : "e\u0000cleared");
        break;
    }
  }
  for (const n of step.notices) out.push("n\u0000" + n.recipient + "\u0000" + n.channels.join(",") + "\u0000" + n.text);
  return out;
}

/** Indexes of the items of `a` with no partner left in `b` (a multiset difference), in `a`'s order. Steps hold a handful: no map needed. */
export function unmatched(a: string[], b: string[]): number[] {
  const used: boolean[] = new Array(b.length).fill(false);
  const out: number[] = [];
  for (let i = 0; i < a.length; i++) {
    let j = 0;
    while (j < b.length && (used[j] || b[j] !== a[i])) j++;
    if (j < b.length) used[j] = true;
    else out.push(i);
  }
  return out;
}

export function hasEffects(step: Step): boolean {
  return step.changes.length > 0 || step.notices.length > 0 || step.actions.length > 0;
}

/**
 * Whether two steps did the same, item by item and in order: what effectsOf
 * would say of both is then the same, without building a sentence. The common
 * case of a Compare (two rule sets mostly agree), so it is asked first.
 */
export function isSameOutcome(a: Step, b: Step): boolean {
  if (a.actions.length !== b.actions.length || a.changes.length !== b.changes.length || a.notices.length !== b.notices.length) return false;
  for (let i = 0; i < a.actions.length; i++) {
    const x = a.actions[i];
    const y = b.actions[i];
    if (x.actionId !== y.actionId || x.type !== y.type || x.outcome !== y.outcome) return false;
  }
  for (let i = 0; i < a.changes.length; i++) {
    const x = a.changes[i];
    const y = b.changes[i];
    if (x.kind !== y.kind) return false;
    if (x.kind === "level" && y.kind === "level" && (x.deviceId !== y.deviceId || x.from !== y.from || x.to !== y.to)) return false;
    if (x.kind === "relay" && y.kind === "relay" && (x.deviceId !== y.deviceId || x.isOn !== y.isOn)) return false;
    if (x.kind === "mode" && y.kind === "mode" && (x.from !== y.from || x.to !== y.to)) return false;
    if (x.kind === "emergency" && y.kind === "emergency" && (x.isActive !== y.isActive || x.scene !== y.scene)) return false;
  }
  for (let i = 0; i < a.notices.length; i++) {
    const x = a.notices[i];
    const y = b.notices[i];
    if (x.recipient !== y.recipient || x.text !== y.text || x.channels.join() !== y.channels.join()) return false;
  }
  return true;
}

/** Items in `a` and not in `b`, counting repeats (a multiset difference), in `a`'s order. */
export function onlyIn(a: string[], b: string[]): string[] {
  return unmatched(a, b).map((i) => a[i]);
}
