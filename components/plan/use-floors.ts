"use client";

import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/api/fetch-json";
import { inventoryKey } from "@/components/devices/use-inventory";
import type { FloorDto } from "@/lib/validation/floors";
import type { SceneDto } from "@/lib/validation/scenes";

export function useFloors(siteId: string) {
  return useQuery({ queryKey: [...inventoryKey(siteId), "floors"], queryFn: () => fetchJson<{ floors: FloorDto[] }>(`/api/sites/${siteId}/floors`).then((r) => r.floors) });
}

export function useScenes(siteId: string) {
  return useQuery({ queryKey: [...inventoryKey(siteId), "scenes"], queryFn: () => fetchJson<{ scenes: SceneDto[] }>(`/api/sites/${siteId}/scenes`).then((r) => r.scenes) });
}

/** Multipart upload with the server's message on failure. */
export async function uploadForm(url: string, method: "POST" | "PUT", form: FormData): Promise<void> {
  const res = await fetch(url, { method, body: form });
  if (!res.ok) {
    const body = (await res.json().catch(() => null)) as { message?: string; fields?: Record<string, string[]> } | null;
    throw new Error(body?.fields ? Object.values(body.fields)[0][0] : (body?.message ?? `Upload failed (${res.status})`));
  }
}
