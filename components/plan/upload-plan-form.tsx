"use client";

import { useId, useState } from "react";
import { uploadForm } from "./use-floors";

/** New floor with a plan, or (with `floorId`) a replacement plan for a floor. */
export function UploadPlanForm({ siteId, floorId, onDone }: { siteId: string; floorId?: string; onDone: () => Promise<unknown> }) {
  const nameId = useId();
  const fileId = useId();
  const [error, setError] = useState<string | null>(null);
  const [isBusy, setBusy] = useState(false);
  return (
    <form
      className="flex flex-wrap items-end gap-3"
      onSubmit={async (e) => {
        e.preventDefault();
        const form = new FormData(e.currentTarget);
        setBusy(true);
        setError(null);
        try {
          await uploadForm(floorId ? `/api/sites/${siteId}/floors/${floorId}/plan` : `/api/sites/${siteId}/floors`, floorId ? "PUT" : "POST", form);
          (e.target as HTMLFormElement).reset();
          await onDone();
        } catch (err) {
          setError(err instanceof Error ? err.message : String(err));
        } finally {
          setBusy(false);
        }
      }}
    >
      {floorId ? null : (
        <div className="flex flex-col">
          <label htmlFor={nameId} className="text-sm font-semibold">Floor name</label>
          <input id={nameId} name="name" required maxLength={100} className="w-44 rounded-md border border-line bg-paper px-2 py-1" />
        </div>
      )}
      <div className="flex flex-col">
        <label htmlFor={fileId} className="text-sm font-semibold">{floorId ? "Replace plan image" : "Plan image"}</label>
        <input id={fileId} name="plan" type="file" accept="image/png,image/jpeg,image/webp" required={Boolean(floorId)} aria-describedby={`${fileId}-hint`} className="text-sm" />
        <span id={`${fileId}-hint`} className="text-xs text-slate">PNG, JPEG or WebP, up to 8 MiB.</span>
      </div>
      <button type="submit" disabled={isBusy} className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog disabled:opacity-60">
        {isBusy ? "Uploading…" : floorId ? "Replace" : "Add floor"}
      </button>
      {error ? (
        <p role="alert" className="w-full text-sm font-semibold text-clay">
          {error}
        </p>
      ) : null}
    </form>
  );
}
