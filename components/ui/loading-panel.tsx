export function LoadingPanel({ label }: { label: string }) {
  return (
    <div role="status" aria-live="polite" className="mx-auto flex max-w-6xl items-center gap-3 px-4 py-10 text-slate">
      <span aria-hidden="true" className="h-4 w-4 animate-spin rounded-full border-2 border-slate border-t-transparent" />
      {label}
    </div>
  );
}
