"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { ApiError, fetchJson } from "@/components/api/fetch-json";
import { sendJson } from "@/components/devices/use-inventory";
import type { DiffDto, VersionDto, VersionsDto } from "@/lib/validation/rules";
import { DiffSummary } from "./activate-dialog";
import { Dialog } from "./dialog";
import { DialogActions } from "./dialog-actions";

const when = (iso: string) => new Intl.DateTimeFormat(undefined, { dateStyle: "medium", timeStyle: "short" }).format(new Date(iso));

/** Version history with who and when; activating an earlier version rolls back to it. */
export function VersionsPanel({ siteId, canActivate }: { siteId: string; canActivate: boolean }) {
  const versions = useQuery({ queryKey: ["sites", siteId, "rules", "versions"], queryFn: () => fetchJson<VersionsDto>(`/api/sites/${siteId}/rules/versions`).then((r) => r.versions) });
  const [rollback, setRollback] = useState<VersionDto | null>(null);
  if (versions.isPending) return <p role="status">Loading versions…</p>;
  if (versions.isError) return <p role="alert" className="text-clay">{versions.error.message}</p>;
  if (versions.data.length === 0) return <p className="text-sm text-slate">No version yet: activate the draft to make version 1.</p>;
  return (
    <>
      <ol className="space-y-2" aria-label="Versions, newest first">
        {versions.data.map((v) => (
          <li key={v.id} className={`rounded-md border p-2 text-sm ${v.isActive ? "border-moss" : "border-line"}`}>
            <p className="font-bold">
              Version {v.number}
              {v.isActive ? <span className="ml-2 rounded bg-moss px-1.5 text-xs text-paper">active</span> : null}
            </p>
            <p className="text-slate">
              Made {when(v.createdAt)} by {v.createdBy ?? "the demo seed or a removed account"}
            </p>
            {v.activations.length ? (
              <ul className="mt-1 text-xs text-slate" aria-label={`Activations of version ${v.number}`}>
                {v.activations.map((a, i) => (
                  <li key={i}>
                    Activated {when(a.at)} by {a.by ?? "the demo seed or a removed account"}
                  </li>
                ))}
              </ul>
            ) : null}
            {canActivate && !v.isActive ? (
              <button type="button" onClick={() => setRollback(v)} className="mt-1 rounded-md border border-line px-2 py-0.5 text-xs font-semibold hover:bg-fog">
                Activate version {v.number} again
              </button>
            ) : null}
          </li>
        ))}
      </ol>
      <RollbackDialog siteId={siteId} version={rollback} onClose={() => setRollback(null)} />
    </>
  );
}

function RollbackDialog({ siteId, version, onClose }: { siteId: string; version: VersionDto | null; onClose: () => void }) {
  const client = useQueryClient();
  const diff = useQuery({ queryKey: ["sites", siteId, "rules", "diff", "active", version?.id], queryFn: () => fetchJson<DiffDto>(`/api/sites/${siteId}/rules/diff?from=active&to=${encodeURIComponent(version!.id)}`), enabled: !!version, staleTime: 0 });
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  return (
    <Dialog open={!!version} title={`Roll back to version ${version?.number ?? ""}`} onClose={onClose} wide>
      <p className="mb-2 text-sm text-slate">What changes against the active version if version {version?.number} runs again. The draft stays as it is.</p>
      {diff.data ? <DiffSummary diff={diff.data} /> : diff.isError ? <p role="alert">{diff.error.message}</p> : <p role="status">Working out the changes…</p>}
      <DialogActions
        error={error}
        onCancel={onClose}
        isDisabled={!diff.data}
        isBusy={busy}
        label={`Activate version ${version?.number ?? ""}`}
        busyLabel="Activating…"
        onConfirm={async () => {
          setBusy(true);
          try {
            await sendJson(`/api/sites/${siteId}/rules/versions/${encodeURIComponent(version!.id)}/activate`, "POST");
            await client.invalidateQueries({ queryKey: ["sites", siteId, "rules"] });
            onClose();
          } catch (err) {
            setError(err instanceof ApiError ? err.message : "The console could not reach the server.");
          } finally {
            setBusy(false);
          }
        }}
      />
    </Dialog>
  );
}
