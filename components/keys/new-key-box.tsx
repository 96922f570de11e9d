"use client";

import { useEffect, useId, useRef } from "react";
import { CopyButton } from "./copy-button";
import type { KeyCreatedResponse } from "@/lib/validation/keys";

/**
 * The one place the new key is ever shown. Focus moves to its heading so a
 * screen reader announces it; the key is in a read-only field that selects
 * itself, so it can also be copied by keyboard.
 */
export function NewKeyBox({ created, onDone }: { created: KeyCreatedResponse; onDone: () => void }) {
  const headingRef = useRef<HTMLHeadingElement>(null);
  const inputRef = useRef<HTMLInputElement>(null);
  const id = useId();

  useEffect(() => {
    headingRef.current?.focus();
  }, [created.row.id]);

  const select = () => {
    inputRef.current?.focus();
    inputRef.current?.select();
  };

  return (
    <section aria-labelledby={`${id}-title`} className="mt-4 max-w-3xl rounded-2xl border-2 border-harvest bg-harvest/10 p-5">
      <h2 id={`${id}-title`} ref={headingRef} tabIndex={-1} className="flex items-center gap-2 text-lg font-extrabold outline-none">
        <svg aria-hidden="true" viewBox="0 0 16 16" className="h-5 w-5 shrink-0">
          <path d="M8 1.5 15 14H1z" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinejoin="round" />
          <path d="M8 6v4M8 11.5v1" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
        Shown once — store it in the gateway now
      </h2>
      <p id={`${id}-hint`} className="mt-1 text-sm">
        This is the only time Joulepath shows the key “{created.row.name}”. Only a fingerprint of it is kept, so it cannot be shown again: if it is lost, revoke it and create another.
      </p>
      <label htmlFor={`${id}-key`} className="mt-3 block text-sm font-semibold">
        New gateway key
      </label>
      <div className="mt-1 flex flex-wrap items-start gap-2">
        <input
          id={`${id}-key`}
          ref={inputRef}
          readOnly
          value={created.key}
          onFocus={select}
          spellCheck={false}
          autoComplete="off"
          aria-describedby={`${id}-hint`}
          className="min-w-0 flex-1 rounded-md border border-line bg-paper px-3 py-2 font-mono text-sm"
        />
        <CopyButton text={created.key} label="Copy key" copiedMessage="Key copied to the clipboard." onFallback={select} />
      </div>
      <button type="button" onClick={onDone} className="mt-3 rounded-md bg-ink px-4 py-2 text-sm font-semibold text-fog">
        I have stored it — hide the key
      </button>
    </section>
  );
}
