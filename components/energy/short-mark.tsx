"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useMemo } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import type { EnergySource, ShortDeviceDto, ShortDevicesDto } from "@/lib/validation/energy";
import { formatMargin } from "./format";

export const shortDevicesKey = (siteId: string, source: EnergySource) => ["sites", siteId, "energy", "short", source] as const;

/** Devices that run short of energy under the active rules or the draft (and what the draft newly makes Short), by device id. */
export function useShortDevices(siteId: string, source: EnergySource, enabled = true) {
  const query = useQuery({
    queryKey: shortDevicesKey(siteId, source),
    queryFn: () => fetchJson<ShortDevicesDto>(`/api/sites/${encodeURIComponent(siteId)}/energy/short?source=${source}`),
    enabled,
  });
  const byDevice = useMemo(() => new Map((query.data?.short ?? []).map((d) => [d.deviceId, d])), [query.data]);
  return { ...query, byDevice };
}

export const RULES_WORD: Record<EnergySource, string> = { active: "the active rules", draft: "the draft" };

export function energyDeviceHref(siteId: string, deviceId: string, source: EnergySource) {
  return `/sites/${siteId}/energy/${deviceId}?source=${source}`;
}

/**
 * The mark on a trigger (Canvas) or a device (Test bench) whose device runs short
 * of energy: a lightning glyph in a pill with the word, never colour alone, linking
 * to the device's budget. `detail` names the demand, e.g. "10 s reports".
 */
export function ShortMark({ siteId, device, source, detail, className = "" }: { siteId: string; device: ShortDeviceDto; source: EnergySource; detail?: string; className?: string }) {
  const label = `Energy budget: ${device.name} runs short of energy under ${RULES_WORD[source]} (margin ${formatMargin(device.margin)}${detail ? `, ${detail}` : ""}). Open its energy budget.`;
  return (
    <Link
      href={energyDeviceHref(siteId, device.deviceId, source)}
      aria-label={label}
      title={label}
      data-testid="short-mark"
      className={`inline-flex max-w-full items-center gap-1 truncate rounded-full border-2 border-clay bg-paper px-1.5 text-[11px] font-bold leading-4 text-clay hover:bg-clay hover:text-paper focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-ink ${className}`}
    >
      <span aria-hidden="true">⚡</span>
      <span>Short{detail ? `: ${detail}` : ""}</span>
    </Link>
  );
}

/** What the trigger asks of its device that the budget counts: its report interval when it sets one. */
export function demandWords(params: unknown): string | undefined {
  const seconds = (params as { reportSeconds?: unknown } | null)?.reportSeconds;
  return typeof seconds === "number" ? `${seconds.toLocaleString("en-GB")} s reports` : undefined;
}
