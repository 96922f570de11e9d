"use client";

import { Dialog } from "./dialog";

/** Every keyboard shortcut of the Canvas; the same list drives nothing else, so keep it in step with canvas-keys.ts. */
export const SHORTCUTS: [string, string][] = [
  ["Ctrl+Z", "Undo"],
  ["Ctrl+Shift+Z or Ctrl+Y", "Redo"],
  ["Delete or Backspace", "Delete the selected nodes and connections"],
  ["Ctrl+C / Ctrl+V", "Copy / paste the selected nodes (with the connections between them)"],
  ["Ctrl+D", "Duplicate the selected nodes"],
  ["Ctrl+A", "Select every node"],
  ["Ctrl+click, or Shift+drag", "Select several nodes"],
  ["Arrow keys (node focused)", "Move the selected nodes"],
  ["Tab / Enter", "Move between nodes / select the focused node"],
  ["L", "Tidy up: auto-layout"],
  ["F", "Fit the whole graph in view"],
  ["+ / −", "Zoom in / out"],
  ["M", "Show or hide the minimap"],
  ["Escape", "Clear the selection"],
  ["?", "This help"],
];

export function HelpDialog({ open, onClose }: { open: boolean; onClose: () => void }) {
  return (
    <Dialog open={open} title="Canvas keys" onClose={onClose}>
      <p className="mb-3 text-sm text-slate">On a Mac use ⌘ where Ctrl is written. Keys act when the focus is not in a form field.</p>
      <table className="w-full text-sm">
        <caption className="sr-only">Keyboard shortcuts</caption>
        <thead>
          <tr className="border-b border-line text-left text-slate">
            <th scope="col" className="py-1 pr-3">Keys</th>
            <th scope="col" className="py-1">What they do</th>
          </tr>
        </thead>
        <tbody>
          {SHORTCUTS.map(([keys, what]) => (
            <tr key={keys} className="border-b border-line/60 last:border-0">
              <td className="py-1 pr-3 font-mono text-xs">{keys}</td>
              <td className="py-1">{what}</td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-3 text-sm">
        Connect nodes by dragging from the dot on a node&apos;s right edge to another node, or choose <strong>Connect to</strong> in the panel of the selected node.
      </p>
      <div className="mt-4 text-right">
        <button type="button" onClick={onClose} className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog">
          Close
        </button>
      </div>
    </Dialog>
  );
}
