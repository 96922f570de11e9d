"use client";

import { createContext, useContext } from "react";
import type { PaletteSite } from "@/lib/rules/palette";
import type { SiteNames } from "@/lib/rules/sentence";
import type { Problem } from "@/lib/rules/validate";
import type { ShortDeviceDto } from "@/lib/validation/energy";

/** What every node on the Canvas reads besides its own data: names to show, the problems found, and devices the draft leaves short of energy. */
export type CanvasContextValue = { siteId: string; names: SiteNames; site: PaletteSite; problemsByNode: Map<string, Problem[]>; shortByDevice: Map<string, ShortDeviceDto>; isReadOnly: boolean };

export const CanvasContext = createContext<CanvasContextValue | null>(null);

export function useCanvasContext(): CanvasContextValue {
  const value = useContext(CanvasContext);
  if (!value) throw new Error("Canvas nodes render inside the Canvas.");
  return value;
}
