"use client";

import { useEffect, useRef } from "react";

/** A modal on the native <dialog>: focus is trapped and Escape closes it, as the browser does. */
export function Dialog({ open, title, onClose, children, wide, isDismissable = true }: { open: boolean; title: string; onClose: () => void; children: React.ReactNode; wide?: boolean; isDismissable?: boolean }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      aria-labelledby="dialog-title"
      onClose={onClose}
      onCancel={(e) => {
        if (!isDismissable) e.preventDefault();
      }}
      className={`m-auto w-[calc(100vw-2rem)] ${wide ? "max-w-2xl" : "max-w-lg"} rounded-xl border border-line bg-paper p-0 text-ink shadow-xl backdrop:bg-ink/40`}
    >
      {open ? (
        <div className="max-h-[80vh] overflow-y-auto p-5">
          <h2 id="dialog-title" className="mb-3 text-xl font-extrabold">
            {title}
          </h2>
          {children}
        </div>
      ) : null}
    </dialog>
  );
}
