"use client";

import { useEffect, useState } from "react";

type Props = {
  text: string;
  label: string;
  /** Said when copying worked; the fallback asks the person to copy the selected text. */
  copiedMessage: string;
  /** Selects the text on the page when the clipboard is not available (plain http off localhost). */
  onFallback: () => void;
  className?: string;
};

/** A copy button that says what happened in a live region, never by colour or icon alone. */
export function CopyButton({ text, label, copiedMessage, onFallback, className }: Props) {
  const [status, setStatus] = useState<string>("");

  useEffect(() => {
    if (!status) return;
    const t = window.setTimeout(() => setStatus(""), 6000);
    return () => window.clearTimeout(t);
  }, [status]);

  async function copy() {
    try {
      if (!navigator.clipboard) throw new Error("no clipboard");
      await navigator.clipboard.writeText(text);
      setStatus(copiedMessage);
    } catch {
      onFallback();
      setStatus("Copying is not allowed here: the text is selected, press Ctrl+C (⌘C on a Mac) to copy it.");
    }
  }

  return (
    <span className="inline-flex flex-col gap-1">
      <button type="button" onClick={() => void copy()} className={className ?? "rounded-md border border-line bg-paper px-3 py-2 text-sm font-semibold hover:bg-fog"}>
        {label}
      </button>
      <span role="status" aria-live="polite" className="text-sm font-semibold text-moss">
        {status}
      </span>
    </span>
  );
}
