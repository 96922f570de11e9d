"use client";

import { useId, useState } from "react";
import { formatAddress } from "@/lib/mesh/address";
import type { ZoneDto } from "@/lib/validation/devices";
import { sendJson } from "./use-inventory";

/** Zones with their mesh group addresses; integrators add, rename, re-address and remove them. */
export function ZonesCard({ siteId, zones, canEdit, onChanged }: { siteId: string; zones: ZoneDto[]; canEdit: boolean; onChanged: () => Promise<unknown> }) {
  const nameId = useId();
  const addrId = useId();
  const [name, setName] = useState("");
  const [address, setAddress] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [isBusy, setBusy] = useState(false);

  async function run(action: () => Promise<unknown>) {
    setBusy(true);
    setError(null);
    try {
      await action();
      await onChanged();
      return true;
    } catch (err) {
      setError(err instanceof Error ? err.message : String(err));
      return false;
    } finally {
      setBusy(false);
    }
  }

  return (
    <section aria-labelledby="zones-heading" className="rounded-xl border border-line bg-paper p-4">
      <h2 id="zones-heading" className="text-lg font-bold">
        Zones
      </h2>
      <p className="text-xs text-slate">Each zone has a group address (0xC000–0xFEFF) so one message reaches all its luminaires at once.</p>
      {error ? (
        <p role="alert" className="mt-2 text-sm font-semibold text-clay">
          {error}
        </p>
      ) : null}
      <ul className="mt-3 divide-y divide-line">
        {zones.map((z) => (
          <li key={z.id} className="flex items-center gap-2 py-1.5 text-sm">
            <span className="flex-1 font-semibold">{z.name}</span>
            <span className="font-mono text-slate">{formatAddress(z.groupAddress)}</span>
            <span className="w-16 text-right text-slate">{z.deviceCount} dev.</span>
            {canEdit ? (
              <>
                <button
                  type="button"
                  disabled={isBusy}
                  className="rounded px-1.5 font-semibold hover:bg-fog"
                  onClick={() => {
                    const next = window.prompt(`New name for ${z.name}`, z.name);
                    if (next && next !== z.name) void run(() => sendJson(`/api/sites/${siteId}/zones/${z.id}`, "PATCH", { name: next }));
                  }}
                >
                  Rename<span className="sr-only"> {z.name}</span>
                </button>
                <button
                  type="button"
                  disabled={isBusy}
                  className="rounded px-1.5 font-semibold text-clay hover:bg-clay/10"
                  onClick={() => {
                    if (window.confirm(`Remove zone ${z.name}? Its ${z.deviceCount} devices stay on the site, in no zone.`)) void run(() => sendJson(`/api/sites/${siteId}/zones/${z.id}`, "DELETE"));
                  }}
                >
                  Remove<span className="sr-only"> {z.name}</span>
                </button>
              </>
            ) : null}
          </li>
        ))}
      </ul>
      {canEdit ? (
        <form
          className="mt-3 flex flex-wrap items-end gap-2"
          onSubmit={async (e) => {
            e.preventDefault();
            const ok = await run(() => sendJson(`/api/sites/${siteId}/zones`, "POST", { name, ...(address.trim() ? { groupAddress: address.trim() } : {}) }));
            if (ok) {
              setName("");
              setAddress("");
            }
          }}
        >
          <div className="flex flex-col">
            <label htmlFor={nameId} className="text-sm font-semibold">New zone</label>
            <input id={nameId} value={name} maxLength={100} onChange={(e) => setName(e.target.value)} className="w-40 rounded-md border border-line px-2 py-1" />
          </div>
          <div className="flex flex-col">
            <label htmlFor={addrId} className="text-sm font-semibold">Group address</label>
            <input id={addrId} value={address} placeholder="automatic" onChange={(e) => setAddress(e.target.value)} className="w-28 rounded-md border border-line px-2 py-1 font-mono" />
          </div>
          <button type="submit" disabled={isBusy || !name.trim()} className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog disabled:opacity-60">
            Add zone
          </button>
        </form>
      ) : null}
    </section>
  );
}
