"use client";

import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/api/fetch-json";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import type { MembersResponse } from "@/lib/validation/members";
import { InviteForm } from "./invite-form";
import { InvitesTable } from "./invites-table";
import { MembersTable } from "./members-table";

export function membersKey(siteId: string) {
  return ["sites", siteId, "members"] as const;
}

export function MembersPanel({ siteId }: { siteId: string }) {
  const query = useQuery({ queryKey: membersKey(siteId), queryFn: () => fetchJson<MembersResponse>(`/api/sites/${encodeURIComponent(siteId)}/members`) });
  if (query.isPending) return <LoadingPanel label="Loading members…" />;
  if (query.isError) return <ErrorPanel title="The members could not be loaded." detail={query.error.message} onRetry={() => void query.refetch()} />;
  const data = query.data;
  return (
    <div className="space-y-10">
      <section aria-labelledby="members-title">
        <h1 id="members-title" className="text-2xl font-extrabold">
          Members
        </h1>
        <p className="mt-1 text-slate">Integrators manage members, devices and gateway keys; facilities managers edit scenes and rules; occupants receive notices and recall the scenes allowed in their zones.</p>
        <MembersTable siteId={siteId} data={data} />
      </section>
      <section aria-labelledby="invites-title">
        <h2 id="invites-title" className="text-xl font-bold">
          Pending invitations
        </h2>
        <InvitesTable siteId={siteId} invites={data.invites} />
      </section>
      <section aria-labelledby="invite-title" className="max-w-xl">
        <h2 id="invite-title" className="text-xl font-bold">
          Invite someone
        </h2>
        <p className="mt-1 text-sm text-slate">They get an e-mail with a link that works once, for seven days.</p>
        <div className="mt-4 rounded-2xl border border-line bg-paper p-5">
          <InviteForm siteId={siteId} zones={data.zones} />
        </div>
      </section>
    </div>
  );
}
