"use client";

import { Dialog } from "./dialog";

/** Shown when someone else saved the draft first: nothing is lost whichever way the person chooses. */
export function ConflictDialog({ open, serverRevision, isBusy, onReload, onKeepCopy }: { open: boolean; serverRevision: number | null; isBusy: boolean; onReload: () => void; onKeepCopy: () => void }) {
  return (
    <Dialog open={open} title="Someone else changed this draft" onClose={() => undefined} isDismissable={false}>
      <p className="text-sm">
        Another person saved the draft{serverRevision ? ` (now revision ${serverRevision})` : ""} while you were editing, so your last changes were <strong>not saved</strong> over theirs.
      </p>
      <ul className="mt-3 list-disc space-y-1 pl-5 text-sm">
        <li>
          <strong>Reload their draft</strong>: see the draft as it is now; your unsaved changes are dropped.
        </li>
        <li>
          <strong>Keep mine as a copy</strong>: load their draft and add the nodes you added or changed beside it, selected, so you can compare and tidy up.
        </li>
      </ul>
      <div className="mt-4 flex flex-wrap justify-end gap-2">
        <button type="button" disabled={isBusy} onClick={onReload} className="rounded-md border border-line px-3 py-1.5 text-sm font-semibold hover:bg-fog disabled:opacity-50">
          Reload their draft
        </button>
        <button type="button" disabled={isBusy} onClick={onKeepCopy} className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog disabled:opacity-50">
          Keep mine as a copy
        </button>
      </div>
    </Dialog>
  );
}
