"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { fetchJson } from "@/components/api/fetch-json";
import type { LiveSummary } from "@/lib/validation/overview";

function ClearEmergency({ siteId }: { siteId: string }) {
  const client = useQueryClient();
  const clear = useMutation({
    mutationFn: () => fetchJson(`/api/sites/${siteId}/emergency/clear`, { method: "POST" }),
    onSuccess: () => client.invalidateQueries({ queryKey: ["sites", siteId, "overview"] }),
  });
  return (
    <div className="mt-2 flex flex-wrap items-center gap-3">
      <button
        type="button"
        disabled={clear.isPending}
        className="rounded-md border-2 border-clay bg-paper px-3 py-1.5 text-sm font-bold text-clay"
        onClick={() => {
          if (window.confirm("Clear the emergency only when the fire-alarm system has been reset and the building is safe. Clear it now?")) clear.mutate();
        }}
      >
        {clear.isPending ? "Clearing…" : "Clear emergency"}
      </button>
      {clear.isError ? (
        <span role="alert" className="text-sm font-semibold text-clay">
          {clear.error.message}
        </span>
      ) : null}
    </div>
  );
}

/** Site mode, emergency and when the live state last moved; the emergency note carries the usual caution. */
export function LiveStrip({ live, timeZone, siteId, canClear }: { live: LiveSummary | null; timeZone: string; siteId: string; canClear: boolean }) {
  if (!live) {
    return <p className="rounded-lg border border-line bg-paper px-4 py-3 text-sm text-slate">No events from the gateway yet: levels appear here once devices report.</p>;
  }
  const when = live.at ? new Intl.DateTimeFormat("en-GB", { dateStyle: "medium", timeStyle: "short", timeZone }).format(live.at) : "—";
  return (
    <section aria-label="Live state" className="space-y-2">
      {live.emergency.active ? (
        <div role="alert" className="rounded-lg border-2 border-clay bg-clay/10 px-4 py-3">
          <p className="font-extrabold text-clay">◆ Emergency latched{live.emergency.since ? ` since ${new Intl.DateTimeFormat("en-GB", { timeStyle: "short", timeZone }).format(live.emergency.since)}` : ""}: escape scene on, other lights off.</p>
          <p className="text-sm">It stays latched until a manager or integrator clears it. This console&apos;s emergency scene does not replace certified emergency lighting or the fire-alarm system; follow the building&apos;s fire procedures and local codes.</p>
          {canClear ? <ClearEmergency siteId={siteId} /> : null}
        </div>
      ) : null}
      <dl className="flex flex-wrap gap-x-8 gap-y-1 rounded-lg border border-line bg-paper px-4 py-3 text-sm">
        <div className="flex gap-2"><dt className="text-slate">Site mode</dt><dd className="font-bold">{live.mode}</dd></div>
        <div className="flex gap-2"><dt className="text-slate">Emergency</dt><dd className="font-bold">{live.emergency.active ? "latched" : "none"}</dd></div>
        <div className="flex gap-2"><dt className="text-slate">Last update</dt><dd className="font-bold">{when} ({timeZone})</dd></div>
      </dl>
    </section>
  );
}
