"use client";

import type { RuleSentence } from "@/lib/rules/sentence";
import type { Problem } from "@/lib/rules/validate";

/** Every path as a plain sentence; choosing one shows its nodes on the Canvas. */
export function SentenceList({ sentences, onShow }: { sentences: RuleSentence[]; onShow: (s: RuleSentence) => void }) {
  if (sentences.length === 0) return <p className="text-sm text-slate">No complete paths yet: connect a trigger to an action.</p>;
  return (
    <ol className="space-y-1.5" aria-label="Paths as sentences">
      {sentences.map((s) => (
        <li key={s.id}>
          <button type="button" onClick={() => onShow(s)} className="w-full rounded-md border border-line bg-paper px-2 py-1.5 text-left text-sm hover:border-ink">
            {s.text}.
          </button>
        </li>
      ))}
    </ol>
  );
}

/** The engine's validation problems; choosing one focuses its node. */
export function ProblemsList({ problems, describe, onFocus }: { problems: Problem[]; describe: (nodeId: string) => string; onFocus: (nodeId: string) => void }) {
  if (problems.length === 0) return <p className="text-sm text-moss">✓ No problems found.</p>;
  const sorted = [...problems].sort((a, b) => (a.severity === b.severity ? 0 : a.severity === "error" ? -1 : 1));
  return (
    <ul className="space-y-1.5" aria-label="Problems">
      {sorted.map((p, i) => {
        const body = (
          <>
            <span className={`mr-1 font-bold ${p.severity === "error" ? "text-clay" : ""}`}>{p.severity === "error" ? "✕ Error" : "! Warning"}</span>
            {p.message}
            {p.nodeId ? <span className="block text-xs text-slate">{describe(p.nodeId)}</span> : null}
          </>
        );
        return (
          <li key={i}>
            {p.nodeId ? (
              <button type="button" onClick={() => onFocus(p.nodeId!)} className={`w-full rounded-md border bg-paper px-2 py-1.5 text-left text-sm hover:border-ink ${p.severity === "error" ? "border-clay" : "border-harvest"}`}>
                {body}
              </button>
            ) : (
              <div className="rounded-md border border-line bg-paper px-2 py-1.5 text-sm">{body}</div>
            )}
          </li>
        );
      })}
    </ul>
  );
}
