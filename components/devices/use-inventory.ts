"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/components/api/fetch-json";
import type { DeviceDto, ZoneDto } from "@/lib/validation/devices";

export const inventoryKey = (siteId: string) => ["sites", siteId, "inventory"] as const;

export function useDevices(siteId: string) {
  return useQuery({ queryKey: [...inventoryKey(siteId), "devices"], queryFn: () => fetchJson<{ devices: DeviceDto[] }>(`/api/sites/${siteId}/devices`).then((r) => r.devices) });
}

export function useZones(siteId: string) {
  return useQuery({ queryKey: [...inventoryKey(siteId), "zones"], queryFn: () => fetchJson<{ zones: ZoneDto[] }>(`/api/sites/${siteId}/zones`).then((r) => r.zones) });
}

/** After any inventory change, everything that shows devices or zones reloads. */
export function useInvalidateInventory(siteId: string) {
  const client = useQueryClient();
  return () => Promise.all([client.invalidateQueries({ queryKey: inventoryKey(siteId) }), client.invalidateQueries({ queryKey: ["sites", siteId, "overview"] })]);
}

export async function sendJson<T = unknown>(url: string, method: "POST" | "PATCH" | "PUT" | "DELETE", body?: unknown): Promise<T> {
  return fetchJson<T>(url, { method, headers: body === undefined ? undefined : { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });
}
