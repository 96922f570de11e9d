"use client";

import { useEffect, useRef } from "react";

type Actions = {
  isReadOnly: boolean;
  undo: () => void;
  redo: () => void;
  deleteSelected: () => void;
  copy: () => void;
  paste: () => void;
  duplicate: () => void;
  selectAll: () => void;
  clearSelection: () => void;
  tidy: () => void;
  fit: () => void;
  zoomIn: () => void;
  zoomOut: () => void;
  toggleMinimap: () => void;
  help: () => void;
};

function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el) return false;
  return el.isContentEditable || ["INPUT", "TEXTAREA", "SELECT"].includes(el.tagName);
}

/** The Canvas keyboard shortcuts (listed in help-dialog.tsx); they stay quiet while someone types in a field or a dialog is open. */
export function useCanvasKeys(actions: Actions) {
  const ref = useRef(actions);
  useEffect(() => {
    ref.current = actions;
  });
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (isTyping(e.target) || document.querySelector("dialog[open]")) return;
      const a = ref.current;
      const mod = e.ctrlKey || e.metaKey;
      const key = e.key.toLowerCase();
      const run = (fn: () => void) => {
        e.preventDefault();
        fn();
      };
      if (mod && key === "z" && !e.shiftKey && !a.isReadOnly) return run(a.undo);
      if (mod && ((key === "z" && e.shiftKey) || key === "y") && !a.isReadOnly) return run(a.redo);
      if (mod && key === "c") return run(a.copy);
      if (mod && key === "v" && !a.isReadOnly) return run(a.paste);
      if (mod && key === "d" && !a.isReadOnly) return run(a.duplicate);
      if (mod && key === "a") return run(a.selectAll);
      if (mod || e.altKey) return;
      if ((e.key === "Delete" || e.key === "Backspace") && !a.isReadOnly) return run(a.deleteSelected);
      if (e.key === "Escape") return run(a.clearSelection);
      if (e.key === "?") return run(a.help);
      if (key === "l" && !a.isReadOnly) return run(a.tidy);
      if (key === "f") return run(a.fit);
      if (key === "m") return run(a.toggleMinimap);
      if (e.key === "+" || e.key === "=") return run(a.zoomIn);
      if (e.key === "-") return run(a.zoomOut);
    };
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, []);
}
