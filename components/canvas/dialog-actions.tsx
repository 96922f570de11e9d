/** The end of a confirming dialog: what went wrong (if anything), Cancel, and the action. */
export function DialogActions({ error, onCancel, onConfirm, isDisabled, isBusy, label, busyLabel }: { error: string | null; onCancel: () => void; onConfirm: () => void; isDisabled: boolean; isBusy: boolean; label: string; busyLabel: string }) {
  return (
    <>
      {error ? (
        <p role="alert" className="mt-3 font-semibold text-clay">
          {error}
        </p>
      ) : null}
      <div className="mt-4 flex justify-end gap-2">
        <button type="button" onClick={onCancel} className="rounded-md border border-line px-3 py-1.5 text-sm font-semibold hover:bg-fog">
          Cancel
        </button>
        <button type="button" disabled={isBusy || isDisabled} onClick={onConfirm} className="rounded-md bg-moss px-3 py-1.5 text-sm font-semibold text-paper disabled:opacity-50">
          {isBusy ? busyLabel : label}
        </button>
      </div>
    </>
  );
}
