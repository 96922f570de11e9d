"use client";

import { useSyncExternalStore } from "react";

const QUERY = "(max-width: 767px)";

/** Phones and narrow windows: the Canvas is read-only there and the sentence list leads. */
export function useIsNarrow(): boolean {
  return useSyncExternalStore(
    (notify) => {
      const mq = window.matchMedia(QUERY);
      mq.addEventListener("change", notify);
      return () => mq.removeEventListener("change", notify);
    },
    () => window.matchMedia(QUERY).matches,
    () => false,
  );
}
