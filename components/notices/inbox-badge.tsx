"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { fetchJson } from "@/components/api/fetch-json";
import { DemoPushRelay } from "./demo-push-relay";

export const UNREAD_KEY = ["notices", "unread"] as const;

/** The header's link to the inbox with the unread count; also relays demo push messages while a console page is open. */
export function InboxBadge() {
  const { data } = useQuery({ queryKey: UNREAD_KEY, queryFn: () => fetchJson<{ count: number }>("/api/notices/inbox/unread"), refetchInterval: 15_000, staleTime: 5_000 });
  const count = data?.count ?? 0;
  return (
    <>
      <DemoPushRelay />
      <Link href="/inbox" aria-label={count ? `Inbox, ${count} unread` : "Inbox"} className="relative flex items-center gap-1.5 rounded-md px-3 py-1.5 text-sm font-semibold text-slate hover:bg-fog hover:text-ink">
        <svg aria-hidden="true" viewBox="0 0 20 20" className="h-4 w-4" fill="none" stroke="currentColor" strokeWidth="1.8">
          <path d="M3 11h4l1.5 2h3L13 11h4M3 11l2-7h10l2 7v5H3z" strokeLinejoin="round" />
        </svg>
        Inbox
        {count ? (
          <span aria-hidden="true" className="min-w-5 rounded-full bg-clay px-1.5 text-center text-xs font-bold leading-5 text-paper">
            {count > 99 ? "99+" : count}
          </span>
        ) : null}
      </Link>
    </>
  );
}
