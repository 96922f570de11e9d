"use client";

import type { NodeKind, NodeType, PaletteEntry } from "@/lib/rules/palette";

export const DRAG_TYPE = "application/x-joulepath-node";

const GROUPS: { kind: NodeKind; title: string; mark: string }[] = [
  { kind: "trigger", title: "Triggers", mark: ">" },
  { kind: "gate", title: "Gates (only if)", mark: "?" },
  { kind: "action", title: "Actions", mark: "▌" },
];

/** The node kinds this site's devices can use: drag one onto the Canvas, or press it (Enter) to add it in the middle. */
export function PalettePanel({ entries, onAdd }: { entries: PaletteEntry[]; onAdd: (kind: NodeKind, type: NodeType) => void }) {
  return (
    <nav aria-label="Node kinds to add" className="space-y-3">
      <p className="text-xs text-slate">Drag onto the Canvas, or select and press Enter to add in the middle.</p>
      {GROUPS.map((g) => (
        <div key={g.kind}>
          <h2 className="mb-1 text-xs font-bold uppercase tracking-wide text-slate">{g.title}</h2>
          <ul className="space-y-1">
            {entries
              .filter((e) => e.kind === g.kind)
              .map((e) => (
                <li key={e.type}>
                  <button
                    type="button"
                    draggable
                    onDragStart={(ev) => {
                      ev.dataTransfer.setData(DRAG_TYPE, JSON.stringify({ kind: e.kind, type: e.type }));
                      ev.dataTransfer.effectAllowed = "copy";
                    }}
                    onClick={() => onAdd(e.kind, e.type)}
                    title={e.hint}
                    aria-label={`Add ${g.kind}: ${e.label} (${e.hint})`}
                    className={`flex w-full cursor-grab items-center gap-2 border bg-paper px-2 py-1 text-left text-sm hover:border-ink ${
                      g.kind === "trigger" ? "rounded-r-md border-line" : g.kind === "gate" ? "rounded-md border-dashed border-slate" : "rounded-l-md border-line border-r-4 border-r-ink"
                    }`}
                  >
                    <span aria-hidden="true" className="w-3 text-center font-bold text-slate">
                      {g.mark}
                    </span>
                    <span className="truncate">{e.label}</span>
                  </button>
                </li>
              ))}
          </ul>
        </div>
      ))}
    </nav>
  );
}
