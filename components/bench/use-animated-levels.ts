"use client";

import { useEffect, useRef, useState } from "react";
import { animationEnd, levelAt, planTransitions, type Transition } from "@/lib/bench/animation";
import type { BenchView } from "@/lib/validation/bench";

/** The steps of the newest bench action (a long press or a walk past is two engine steps). */
function newestAction(view: BenchView) {
  const last = view.steps.at(-1);
  if (!last) return null;
  const steps = view.steps.filter((s) => s.input.actionId === last.input.actionId);
  return { key: last.seq, changes: steps.flatMap((s) => s.output.changes), commands: steps.flatMap((s) => s.output.commands) };
}

type Frame = { key: number; transitions: Transition[]; elapsed: number };

/**
 * Levels as the bench shows them: the sandbox's levels, except while the newest
 * action's fades play — each over its fade time, unicast messages one after
 * another. Nothing animates on first load, or for people who ask for less motion.
 */
export function useAnimatedLevels(view: BenchView | undefined): { levels: Record<string, number>; moving: Set<string> } {
  const seen = useRef<number | null>(null);
  const alive = useRef(true);
  const [frame, setFrame] = useState<Frame | null>(null);

  useEffect(() => {
    alive.current = true;
    return () => {
      alive.current = false;
    };
  }, []);

  useEffect(() => {
    if (!view) return;
    const newest = newestAction(view);
    const key = newest?.key ?? 0;
    const isFirst = seen.current === null;
    if (seen.current === key) return;
    seen.current = key;
    const reduced = window.matchMedia?.("(prefers-reduced-motion: reduce)").matches;
    if (isFirst || !newest || reduced) return;
    const transitions = planTransitions(newest).filter((t) => t.delayMs + t.durationMs > 0);
    if (!transitions.length) return;
    const end = animationEnd(transitions);
    const started = performance.now();
    // Each frame checks it is still the newest action's animation, so a newer step simply takes over.
    const tick = () => {
      if (!alive.current || seen.current !== key) return;
      const elapsed = Math.min(performance.now() - started, end);
      setFrame({ key, transitions, elapsed });
      if (elapsed < end) requestAnimationFrame(tick);
    };
    requestAnimationFrame(tick);
  }, [view]);

  const levels = { ...(view?.state.levels ?? {}) };
  const moving = new Set<string>();
  const current = view ? newestAction(view)?.key ?? 0 : null;
  if (frame && frame.key === current) {
    for (const t of frame.transitions) {
      const shown = levelAt(t, frame.elapsed);
      if (shown !== t.to) moving.add(t.deviceId);
      levels[t.deviceId] = shown;
    }
  }
  return { levels, moving };
}
