"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { ApiError, fetchJson } from "@/components/api/fetch-json";
import { sendJson } from "@/components/devices/use-inventory";
import { energyDeviceHref, useShortDevices } from "@/components/energy/short-mark";
import type { ShortDeviceDto } from "@/lib/validation/energy";
import type { Problem } from "@/lib/rules/validate";
import type { ActivateDto, DiffDto } from "@/lib/validation/rules";
import { Dialog } from "./dialog";
import { DialogActions } from "./dialog-actions";

/** The change summary, rule by rule, in sentences. */
export function DiffSummary({ diff }: { diff: DiffDto }) {
  if (diff.sentences.length === 0) return <p className="text-sm">No rule changes: {diff.to.label} behaves exactly like {diff.from.label}.</p>;
  const block = (title: string, items: React.ReactNode[], mark: string) =>
    items.length ? (
      <div>
        <h3 className="mt-2 text-sm font-bold">
          {title} ({items.length})
        </h3>
        <ul className="mt-1 space-y-1.5">
          {items.map((t, i) => (
            <li key={i} className="flex gap-2 text-sm">
              <span aria-hidden="true" className="w-4 shrink-0 font-bold text-slate">
                {mark}
              </span>
              <span>{t}</span>
            </li>
          ))}
        </ul>
      </div>
    ) : null;
  return (
    <div aria-label="Changes" className="space-y-1">
      {block("Rules added", diff.added, "+")}
      {block("Rules removed", diff.removed, "−")}
      {block(
        "Rules changed",
        diff.changed.map((c, i) => (
          <span key={i}>
            <span className="text-slate">Was:</span> {c.before}
            <br />
            <span className="text-slate">Now:</span> {c.after}
          </span>
        )),
        "~",
      )}
      <p className="pt-1 text-xs text-slate">{diff.unchanged} rule{diff.unchanged === 1 ? "" : "s"} unchanged.</p>
    </div>
  );
}

/** A warning, never a block: devices the draft would newly leave short of energy. */
function NewlyShortWarning({ siteId, devices }: { siteId: string; devices: ShortDeviceDto[] }) {
  const names = devices.map((d) => d.name);
  const list = names.length === 1 ? names[0] : `${names.slice(0, -1).join(", ")} and ${names[names.length - 1]}`;
  return (
    <div role="alert" aria-label="Energy warning" className="mt-3 rounded-md border-2 border-clay p-2 text-sm">
      <p className="font-bold text-clay">
        <span aria-hidden="true">⚡ </span>After this change, {list} would run short of energy.
      </p>
      <p className="mt-1">The rules would ask {devices.length === 1 ? "it" : "them"} for more messages than {devices.length === 1 ? "it harvests" : "they harvest"}, so {devices.length === 1 ? "it" : "they"} would fall silent at times. You can still activate.</p>
      <ul className="mt-1 list-disc pl-5">
        {devices.map((d) => (
          <li key={d.deviceId}>
            <a href={energyDeviceHref(siteId, d.deviceId, "draft")} target="_blank" rel="noopener" className="font-semibold underline underline-offset-2">
              {d.name}: energy budget under the draft
            </a>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** Activate: read what changes against the active version, then confirm. */
export function ActivateDialog({
  siteId,
  open,
  revision,
  activeNumber,
  problems,
  onClose,
  onActivated,
}: {
  siteId: string;
  open: boolean;
  revision: number;
  activeNumber: number | null;
  problems: Problem[];
  onClose: () => void;
  onActivated: (v: ActivateDto) => void;
}) {
  const client = useQueryClient();
  const diff = useQuery({ queryKey: ["sites", siteId, "rules", "diff", "active", "draft", revision], queryFn: () => fetchJson<DiffDto>(`/api/sites/${siteId}/rules/diff?from=active&to=draft`), enabled: open, staleTime: 0 });
  // Asked again after the save that opened this dialog; while it is on its way the warning waits, the button does not.
  const energy = useShortDevices(siteId, "draft", open);
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const errors = problems.filter((p) => p.severity === "error");

  const confirm = async () => {
    setBusy(true);
    setError(null);
    try {
      const v = await sendJson<ActivateDto>(`/api/sites/${siteId}/rules/activate`, "POST", { revision });
      await client.invalidateQueries({ queryKey: ["sites", siteId, "rules"] });
      void client.invalidateQueries({ queryKey: ["sites", siteId, "energy"] });
      onActivated(v);
    } catch (err) {
      setError(err instanceof ApiError ? err.message : "The console could not reach the server.");
    } finally {
      setBusy(false);
    }
  };

  return (
    <Dialog open={open} title="Activate the draft" onClose={onClose} wide>
      <p className="mb-2 text-sm text-slate">
        What changes against {activeNumber ? `the active version ${activeNumber}` : "no active rules"}. Read it through; activating makes the draft the next numbered version and the site runs it at once.
      </p>
      {diff.isPending ? <p role="status">Working out the changes…</p> : null}
      {diff.isError ? <p role="alert" className="text-clay">{diff.error.message}</p> : null}
      {diff.data ? <DiffSummary diff={diff.data} /> : null}
      {energy.isFetching ? <p role="status" className="mt-2 text-sm text-slate">Checking the energy budget…</p> : null}
      {energy.isError ? <p className="mt-2 text-sm text-slate">The energy budget could not be checked ({energy.error.message}); activating does not depend on it.</p> : null}
      {!energy.isFetching && energy.data?.newlyShort.length ? <NewlyShortWarning siteId={siteId} devices={energy.data.newlyShort} /> : null}
      {errors.length ? (
        <div role="alert" className="mt-3 rounded-md border border-clay p-2 text-sm">
          <p className="font-bold text-clay">Fix {errors.length === 1 ? "this problem" : `these ${errors.length} problems`} before activating:</p>
          <ul className="list-disc pl-5">
            {errors.map((p, i) => (
              <li key={i}>{p.message}</li>
            ))}
          </ul>
        </div>
      ) : null}
      <DialogActions error={error} onCancel={onClose} onConfirm={() => void confirm()} isDisabled={errors.length > 0 || !diff.data} isBusy={busy} label="Activate these changes" busyLabel="Activating…" />
    </Dialog>
  );
}
