"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import { ROLE_LABEL } from "@/lib/auth/roles";
import type { MembersResponse } from "@/lib/validation/members";

const dateTime = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });

export function InvitesTable({ siteId, invites }: { siteId: string; invites: MembersResponse["invites"] }) {
  const queryClient = useQueryClient();
  const [message, setMessage] = useState<{ kind: "error" | "ok"; text: string } | null>(null);
  const act = useMutation({
    mutationFn: (v: { id: string; action: "resend" | "revoke" }) =>
      fetchJson(v.action === "resend" ? `/api/sites/${siteId}/invites/${v.id}/resend` : `/api/sites/${siteId}/invites/${v.id}`, { method: v.action === "resend" ? "POST" : "DELETE" }),
    onSuccess: (_r, v) => {
      setMessage({ kind: "ok", text: v.action === "resend" ? "Invitation sent again with a new link." : "Invitation revoked." });
      void queryClient.invalidateQueries({ queryKey: ["sites", siteId, "members"] });
    },
    onError: (err) => setMessage({ kind: "error", text: err.message }),
  });

  return (
    <div className="mt-3 space-y-2">
      <p aria-live="polite" role={message?.kind === "error" ? "alert" : "status"} className={`text-sm font-semibold ${message?.kind === "error" ? "text-clay" : "text-moss"}`}>
        {message?.text}
      </p>
      {invites.length === 0 ? (
        <p className="text-sm text-slate">No invitations waiting.</p>
      ) : (
        <div className="overflow-x-auto rounded-xl border border-line bg-paper">
          <table className="w-full text-sm">
            <caption className="sr-only">Pending invitations</caption>
            <thead>
              <tr className="border-b border-line text-left text-slate">
                <th scope="col" className="px-3 py-2 font-semibold">E-mail</th>
                <th scope="col" className="px-3 py-2 font-semibold">Role</th>
                <th scope="col" className="px-3 py-2 font-semibold">Last sent</th>
                <th scope="col" className="px-3 py-2 font-semibold">Expires</th>
                <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>
              </tr>
            </thead>
            <tbody>
              {invites.map((i) => (
                <tr key={i.id} className="border-b border-line/60 last:border-0">
                  <td className="px-3 py-2 font-semibold">{i.email}</td>
                  <td className="px-3 py-2">{ROLE_LABEL[i.role]}</td>
                  <td className="px-3 py-2">{dateTime.format(new Date(i.lastSentAt))}</td>
                  <td className="px-3 py-2">{dateTime.format(new Date(i.expiresAt))}</td>
                  <td className="space-x-1 px-3 py-2 text-right">
                    <button type="button" disabled={act.isPending} onClick={() => act.mutate({ id: i.id, action: "resend" })} className="rounded-md px-2 py-1 font-semibold hover:bg-fog">
                      Resend<span className="sr-only"> to {i.email}</span>
                    </button>
                    <button type="button" disabled={act.isPending} onClick={() => act.mutate({ id: i.id, action: "revoke" })} className="rounded-md px-2 py-1 font-semibold text-clay hover:bg-clay/10">
                      Revoke<span className="sr-only"> invitation to {i.email}</span>
                    </button>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
