"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { ApiError, fetchJson } from "@/components/api/fetch-json";
import { sendJson } from "@/components/devices/use-inventory";
import type { BenchScenarioDto, BenchView, ScenarioPlayResult } from "@/lib/validation/bench";

export const benchKey = (siteId: string) => ["sites", siteId, "bench"] as const;
const base = (siteId: string) => `/api/sites/${encodeURIComponent(siteId)}/bench`;

export function useBench(siteId: string, source: "active" | "draft" | undefined) {
  return useQuery({ queryKey: benchKey(siteId), queryFn: () => fetchJson<BenchView>(`${base(siteId)}${source ? `?source=${source}` : ""}`) });
}

export function useScenarios(siteId: string) {
  return useQuery({ queryKey: [...benchKey(siteId), "scenarios"], queryFn: () => fetchJson<{ scenarios: BenchScenarioDto[] }>(`${base(siteId)}/scenarios`).then((r) => r.scenarios) });
}

type Call = { path: string; method?: "POST" | "PATCH" | "PUT" | "DELETE"; body?: unknown };

/** Every bench change answers with the whole bench; it replaces the cached view so the page redraws at once. */
export function useBenchCall(siteId: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ path, method = "POST", body }: Call) => sendJson<BenchView | ScenarioPlayResult | { scenario: BenchScenarioDto } | { ok: true }>(`${base(siteId)}${path}`, method, body ?? {}),
    onSuccess: async (result) => {
      if ("session" in result) client.setQueryData(benchKey(siteId), result);
      else if ("view" in result) client.setQueryData(benchKey(siteId), result.view);
      else await client.invalidateQueries({ queryKey: [...benchKey(siteId), "scenarios"] });
    },
  });
}

/** The server's words for a failed call: the first field message when there is one. */
export function errorText(error: unknown): string | null {
  if (!error) return null;
  if (error instanceof ApiError) {
    const fields = (error.body as { fields?: Record<string, string[]> } | undefined)?.fields;
    const first = fields ? Object.values(fields)[0]?.[0] : undefined;
    return first ? `${error.message} ${first}` : error.message;
  }
  return error instanceof Error ? error.message : String(error);
}
