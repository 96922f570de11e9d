"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useEffect, useRef, useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import type { KeyRowJson } from "@/lib/validation/keys";

const dateTime = new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short" });
const when = (iso: string | null, never: string) => (iso ? dateTime.format(new Date(iso)) : never);

type Message = { kind: "error" | "ok"; text: string };

export function KeysTable({ siteId, keys }: { siteId: string; keys: KeyRowJson[] }) {
  const queryClient = useQueryClient();
  const [message, setMessage] = useState<Message | null>(null);
  const [confirming, setConfirming] = useState<string | null>(null);
  const messageRef = useRef<HTMLParagraphElement>(null);
  const revokeButtons = useRef(new Map<string, HTMLButtonElement>());

  const revoke = useMutation({
    mutationFn: (key: KeyRowJson) => fetchJson(`/api/sites/${encodeURIComponent(siteId)}/keys/${encodeURIComponent(key.id)}`, { method: "DELETE" }),
    onSuccess: (_r, key) => {
      setConfirming(null);
      setMessage({ kind: "ok", text: `Key “${key.name}” revoked. A gateway still using it now gets 401.` });
      // The row's buttons are gone: keep the keyboard user where the news is.
      messageRef.current?.focus();
      void queryClient.invalidateQueries({ queryKey: ["sites", siteId, "keys"] });
    },
    onError: (err) => setMessage({ kind: "error", text: err.message }),
  });

  function cancel(id: string) {
    setConfirming(null);
    // Back to the button that opened the question.
    requestAnimationFrame(() => revokeButtons.current.get(id)?.focus());
  }

  const active = keys.filter((k) => !k.revokedAt).length;

  return (
    <div className="mt-6 space-y-3">
      <p className="text-sm text-slate">
        {active} active {active === 1 ? "key" : "keys"}
        {keys.length > active ? `, ${keys.length - active} revoked` : ""}.
      </p>
      <p ref={messageRef} tabIndex={-1} aria-live="polite" role={message?.kind === "error" ? "alert" : "status"} className={`text-sm font-semibold outline-none ${message?.kind === "error" ? "text-clay" : "text-moss"}`}>
        {message?.text}
      </p>
      {keys.length === 0 ? (
        <p className="rounded-xl border border-line bg-paper px-4 py-3 text-sm text-slate">No keys yet. Create one below for each gateway on this site.</p>
      ) : (
        <div className="overflow-x-auto rounded-xl border border-line bg-paper">
          <table className="w-full text-sm">
            <caption className="sr-only">Gateway keys of this site</caption>
            <thead>
              <tr className="border-b border-line text-left text-slate">
                <th scope="col" className="px-3 py-2 font-semibold">Name</th>
                <th scope="col" className="px-3 py-2 font-semibold">Key</th>
                <th scope="col" className="px-3 py-2 font-semibold">Created</th>
                <th scope="col" className="px-3 py-2 font-semibold">Last used</th>
                <th scope="col" className="px-3 py-2 font-semibold">Status</th>
                <th scope="col" className="px-3 py-2"><span className="sr-only">Actions</span></th>
              </tr>
            </thead>
            <tbody>
              {keys.map((k) => (
                <tr key={k.id} className={`border-b border-line/60 last:border-0 ${k.revokedAt ? "text-slate" : ""}`}>
                  <th scope="row" className="px-3 py-2 text-left font-semibold">{k.name}</th>
                  <td className="px-3 py-2">
                    <code className="font-mono">{k.prefix}…</code>
                  </td>
                  <td className="px-3 py-2">{when(k.createdAt, "")}</td>
                  <td className="px-3 py-2">{when(k.lastUsedAt, "Never")}</td>
                  <td className="px-3 py-2">
                    {k.revokedAt ? (
                      <span className="inline-flex items-center gap-1">
                        <svg aria-hidden="true" viewBox="0 0 16 16" className="h-3.5 w-3.5"><path d="M3 3l10 10M13 3 3 13" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" /></svg>
                        Revoked {when(k.revokedAt, "")}
                      </span>
                    ) : (
                      <span className="inline-flex items-center gap-1 font-semibold text-moss">
                        <svg aria-hidden="true" viewBox="0 0 16 16" className="h-3.5 w-3.5"><path d="M3 8.5 6.5 12 13 4" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" /></svg>
                        Active
                      </span>
                    )}
                  </td>
                  <td className="px-3 py-2 text-right">
                    {k.revokedAt ? null : confirming === k.id ? (
                      <RevokeConfirm name={k.name} isPending={revoke.isPending} onConfirm={() => revoke.mutate(k)} onCancel={() => cancel(k.id)} />
                    ) : (
                      <button
                        type="button"
                        ref={(el) => {
                          if (el) revokeButtons.current.set(k.id, el);
                          else revokeButtons.current.delete(k.id);
                        }}
                        disabled={revoke.isPending}
                        onClick={() => {
                          setMessage(null);
                          setConfirming(k.id);
                        }}
                        className="rounded-md px-2 py-1 font-semibold text-clay hover:bg-clay/10"
                      >
                        Revoke<span className="sr-only"> key {k.name}</span>
                      </button>
                    )}
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

/** The question in place of the Revoke button. Focus starts on the safe answer (WAI-ARIA APG, alert dialog pattern), Escape keeps the key. */
function RevokeConfirm({ name, isPending, onConfirm, onCancel }: { name: string; isPending: boolean; onConfirm: () => void; onCancel: () => void }) {
  const keepRef = useRef<HTMLButtonElement>(null);
  useEffect(() => {
    keepRef.current?.focus();
  }, []);
  return (
    <div
      role="group"
      aria-label={`Revoke key ${name}?`}
      className="inline-flex flex-wrap items-center justify-end gap-2"
      onKeyDown={(e) => {
        if (e.key === "Escape") {
          e.stopPropagation();
          onCancel();
        }
      }}
    >
      <span className="text-left text-sm">Revoke “{name}”? Gateways using it stop at once.</span>
      <button type="button" disabled={isPending} onClick={onConfirm} aria-busy={isPending || undefined} className="rounded-md bg-clay px-3 py-1 font-semibold text-paper disabled:opacity-70">
        {isPending ? "Revoking…" : "Revoke key"}
      </button>
      <button ref={keepRef} type="button" disabled={isPending} onClick={onCancel} className="rounded-md border border-line px-3 py-1 font-semibold hover:bg-fog">
        Keep it
      </button>
    </div>
  );
}
