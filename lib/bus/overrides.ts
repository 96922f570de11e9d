import { OVERRIDE_LEVELS, type OverrideLevel } from "@/lib/rules/trigger-key";
import type { OverrideStack } from "./types";

/**
 * Each luminaire keeps one claim per override level. The highest claim present
 * sets the level; a claim below it is kept, so when the higher one ends the
 * luminaire falls back to it. With no claim left the level stays where it is:
 * ending a hold means "others may take over", not "go dark".
 */
export function topLevel(stack: OverrideStack | undefined): OverrideLevel | null {
  if (!stack) return null;
  for (const level of OVERRIDE_LEVELS) if (stack[level]) return level;
  return null;
}

export function effectiveLevel(stack: OverrideStack | undefined, current: number): number {
  const top = topLevel(stack);
  return top && stack ? stack[top]!.level : current;
}

/** The level a luminaire would show if its emergency claim were gone (what a manual hold should keep). */
export function levelBelowEmergency(stack: OverrideStack | undefined, current: number): number {
  if (!stack?.emergency) return effectiveLevel(stack, current);
  const rest: OverrideStack = { ...stack };
  delete rest.emergency;
  return effectiveLevel(rest, current);
}
