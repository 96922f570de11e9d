"use client";

import { useSyncExternalStore } from "react";

const subscribe = () => () => undefined;

/** False in the server render and the first client render, true once React has hydrated. */
export function useIsHydrated(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => true,
    () => false,
  );
}

/**
 * Keeps a server-rendered form disabled until React has hydrated it, so text
 * typed in that first moment is never silently dropped by the form library.
 * (`display: contents` leaves the form's own layout as it was.)
 */
export function HydratedFieldset({ children }: { children: React.ReactNode }) {
  const isHydrated = useIsHydrated();
  return (
    <fieldset disabled={!isHydrated} className="contents">
      {children}
    </fieldset>
  );
}
