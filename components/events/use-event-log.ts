"use client";

import { useInfiniteQuery, useQuery, useQueryClient } from "@tanstack/react-query";
import { useMemo } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import type { EventRow } from "@/lib/validation/events";

type Page = { events: EventRow[]; nextCursor: string | null; lastSeq: number | null };
type Tail = { rows: EventRow[]; lastSeq: number };

/**
 * The filtered log as keyset pages (newest first), plus a live tail polled
 * while `isLive`: events stored since the first page was read. Each poll asks
 * only for what came after the last one and adds it to what the tail holds.
 */
export function useEventLog(siteId: string, query: string, isLive: boolean) {
  const client = useQueryClient();
  const base = `/api/sites/${encodeURIComponent(siteId)}/events`;
  const pages = useInfiniteQuery({
    queryKey: ["sites", siteId, "events", query],
    queryFn: ({ pageParam }) => fetchJson<Page>(`${base}?limit=200${query ? `&${query}` : ""}${pageParam ? `&before=${pageParam}` : ""}`),
    initialPageParam: "",
    getNextPageParam: (last) => last.nextCursor ?? undefined,
  });
  const startSeq = pages.data?.pages[0]?.lastSeq ?? null;
  const tailKey = ["sites", siteId, "events-tail", query, startSeq];
  const tail = useQuery({
    queryKey: tailKey,
    queryFn: async (): Promise<Tail> => {
      const prev = client.getQueryData<Tail>(tailKey) ?? { rows: [], lastSeq: startSeq ?? 0 };
      const got = await fetchJson<{ events: EventRow[]; lastSeq: number }>(`${base}?afterSeq=${prev.lastSeq}&limit=500${query ? `&${query}` : ""}`);
      return { rows: [...[...got.events].reverse(), ...prev.rows], lastSeq: got.lastSeq };
    },
    enabled: isLive && startSeq !== null,
    refetchInterval: 3000,
    staleTime: 0,
  });

  const rows = useMemo(() => {
    const loaded = pages.data?.pages.flatMap((p) => p.events) ?? [];
    const live = tail.data?.rows ?? [];
    // The tail is in arrival order; keep the table in time order, newest first.
    return live.length ? [...live, ...loaded].sort((a, b) => b.at - a.at || b.seq - a.seq) : loaded;
  }, [pages.data, tail.data]);

  return { pages, rows, liveCount: tail.data?.rows.length ?? 0 };
}
