export function SubmitButton({ isPending, children, pendingText }: { isPending: boolean; children: React.ReactNode; pendingText: string }) {
  return (
    <button
      type="submit"
      disabled={isPending}
      aria-busy={isPending || undefined}
      className="inline-flex items-center justify-center gap-2 rounded-md bg-ink px-4 py-2 font-semibold text-fog disabled:opacity-70"
    >
      {isPending ? <span aria-hidden="true" className="h-4 w-4 animate-spin rounded-full border-2 border-fog border-t-transparent" /> : null}
      {isPending ? pendingText : children}
    </button>
  );
}

export function FormError({ message }: { message?: string }) {
  if (!message) return null;
  return (
    <p role="alert" className="rounded-md border border-clay/50 bg-clay/10 px-3 py-2 text-sm font-semibold text-clay">
      {message}
    </p>
  );
}

/** Save and Cancel side by side, the same in every editor. */
export function SaveOrCancel({ isPending, label, onCancel, className = "flex gap-2" }: { isPending: boolean; label: string; onCancel: () => void; className?: string }) {
  return (
    <div className={className}>
      <SubmitButton isPending={isPending} pendingText="Saving…">
        {label}
      </SubmitButton>
      <button type="button" onClick={onCancel} className="rounded-md px-4 py-2 font-semibold text-slate hover:bg-fog">
        Cancel
      </button>
    </div>
  );
}
