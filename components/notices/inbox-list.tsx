"use client";

import { useInfiniteQuery, useMutation, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import { kindLabel } from "@/lib/notices/message";
import type { InboxItemJson } from "@/lib/validation/notices";

type Page = { items: InboxItemJson[]; hasMore: boolean };

/** Kind chips: told apart by their words; the colour only repeats it. */
const KIND_TONE: Record<string, string> = { emergency: "bg-clay/15 text-clay", energy: "bg-harvest/20 text-ink", care: "bg-moss/15 text-moss" };

/** The person's notices with unread first in weight, mark read, and older history on demand. */
export function InboxList({ sites }: { sites: { id: string; name: string }[] }) {
  const queryClient = useQueryClient();
  const [show, setShow] = useState<"all" | "unread">("all");
  const [siteId, setSiteId] = useState("");
  const query = useInfiniteQuery({
    queryKey: ["notices", "inbox", show, siteId],
    initialPageParam: 0,
    queryFn: ({ pageParam }) => {
      const qs = new URLSearchParams({ show });
      if (siteId) qs.set("siteId", siteId);
      if (pageParam) qs.set("before", String(pageParam));
      return fetchJson<Page>(`/api/notices/inbox?${qs}`);
    },
    getNextPageParam: (last) => (last.hasMore ? last.items[last.items.length - 1].id : undefined),
    refetchInterval: 15_000,
  });
  const markRead = useMutation({
    mutationFn: (body: { ids: number[] } | { all: true; siteId?: string }) => fetchJson<{ changed: number }>("/api/notices/inbox/read", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ["notices"] }),
  });
  const items = query.data?.pages.flatMap((p) => p.items) ?? [];
  const hasUnread = items.some((i) => !i.readAt);

  return (
    <div className="mt-6 space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div role="group" aria-label="Show" className="flex overflow-hidden rounded-md border border-line bg-paper text-sm font-semibold">
          {(["all", "unread"] as const).map((s) => (
            <button key={s} type="button" aria-pressed={show === s} onClick={() => setShow(s)} className={`px-3 py-1.5 ${show === s ? "bg-ink text-fog" : "text-slate hover:bg-fog"}`}>
              {s === "all" ? "All" : "Unread"}
            </button>
          ))}
        </div>
        {sites.length > 1 ? (
          <label className="flex items-center gap-2 text-sm">
            Site
            <select value={siteId} onChange={(e) => setSiteId(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-1.5">
              <option value="">All sites</option>
              {sites.map((s) => (
                <option key={s.id} value={s.id}>
                  {s.name}
                </option>
              ))}
            </select>
          </label>
        ) : null}
        <button type="button" disabled={!hasUnread || markRead.isPending} onClick={() => markRead.mutate(siteId ? { all: true, siteId } : { all: true })} className="ml-auto rounded-md border border-line bg-paper px-3 py-1.5 text-sm font-semibold hover:bg-fog disabled:opacity-50">
          Mark all read
        </button>
      </div>
      {markRead.isError ? (
        <p role="alert" className="text-sm font-semibold text-clay">
          Could not mark read: {markRead.error.message}
        </p>
      ) : null}

      {query.isPending ? (
        <p role="status" className="text-slate">
          Loading notices…
        </p>
      ) : query.isError ? (
        <div role="alert" className="rounded-xl border border-clay/40 bg-paper p-4">
          <p className="font-bold text-clay">The inbox could not be loaded.</p>
          <button type="button" onClick={() => query.refetch()} className="mt-2 rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog">
            Try again
          </button>
        </div>
      ) : items.length === 0 ? (
        <p className="rounded-xl border border-line bg-paper p-6 text-slate">{show === "unread" ? "Nothing unread." : "No notices yet. When a rule sends you one, it appears here."}</p>
      ) : (
        <ol aria-label="Notices" className="divide-y divide-line overflow-hidden rounded-xl border border-line bg-paper">
          {items.map((item) => (
            <li key={item.id} className={`flex flex-wrap items-start gap-x-3 gap-y-1 px-4 py-3 ${item.readAt ? "" : "bg-harvest/5"}`}>
              <span className={`mt-0.5 rounded-full px-2 py-0.5 text-xs font-bold ${KIND_TONE[item.kind] ?? "bg-slate/15 text-slate"}`}>{kindLabel(item.kind)}</span>
              <div className="min-w-0 flex-1">
                <p className={item.readAt ? "" : "font-bold"}>
                  {item.readAt ? null : <span className="sr-only">Unread: </span>}
                  {item.text}
                  {item.count > 1 ? <span className="ml-1 text-sm font-semibold text-slate">(×{item.count})</span> : null}
                </p>
                <p className="text-xs text-slate">
                  {item.siteName} · <time dateTime={new Date(item.at).toISOString()}>{new Date(item.at).toLocaleString()}</time>
                </p>
              </div>
              <div className="flex w-full justify-end gap-2 text-sm sm:w-auto">
                {item.url ? (
                  <Link href={item.url} onClick={() => !item.readAt && markRead.mutate({ ids: [item.id] })} className="rounded-md px-2 py-1 font-semibold text-ink underline hover:bg-fog">
                    Open
                  </Link>
                ) : null}
                {item.readAt ? null : (
                  <button type="button" onClick={() => markRead.mutate({ ids: [item.id] })} aria-label={`Mark read: ${item.text}`} className="rounded-md border border-line px-2 py-1 font-semibold hover:bg-fog">
                    Mark read
                  </button>
                )}
              </div>
            </li>
          ))}
        </ol>
      )}
      {query.hasNextPage ? (
        <button type="button" onClick={() => query.fetchNextPage()} disabled={query.isFetchingNextPage} className="rounded-md border border-line bg-paper px-3 py-1.5 text-sm font-semibold hover:bg-fog disabled:opacity-50">
          {query.isFetchingNextPage ? "Loading…" : "Show older notices"}
        </button>
      ) : null}
    </div>
  );
}
