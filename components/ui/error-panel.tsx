"use client";

export function ErrorPanel({ title, detail, onRetry }: { title: string; detail?: string; onRetry?: () => void }) {
  return (
    <div role="alert" className="mx-auto my-8 max-w-xl rounded-xl border border-clay/40 bg-paper p-6">
      <h2 className="font-bold text-clay">{title}</h2>
      {detail ? <p className="mt-1 text-sm text-slate">{detail}</p> : null}
      {onRetry ? (
        <button type="button" onClick={onRetry} className="mt-4 rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog">
          Try again
        </button>
      ) : null}
    </div>
  );
}
