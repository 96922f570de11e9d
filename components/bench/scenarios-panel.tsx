"use client";

import { useId, useState } from "react";
import { describeAction } from "@/lib/bench/describe";
import type { ScenarioPlayResult } from "@/lib/validation/bench";
import { errorText, useBenchCall, useScenarios } from "./use-bench";

type Props = { siteId: string; nameOf: (id: string) => string; deliverNotices: boolean; recorded: number; isBusy: boolean };

/** Saved sequences of bench actions: save what you did since the reset, play one again (on whichever rules the bench runs). */
export function ScenariosPanel({ siteId, nameOf, deliverNotices, recorded, isBusy }: Props) {
  const nameId = useId();
  const scenarios = useScenarios(siteId);
  const call = useBenchCall(siteId);
  const [name, setName] = useState("");
  const [message, setMessage] = useState<{ isError: boolean; text: string } | null>(null);
  const busy = isBusy || call.isPending;

  async function run(label: string, fn: () => Promise<unknown>) {
    setMessage(null);
    try {
      const result = await fn();
      if (result && typeof result === "object" && "played" in result) {
        const r = result as ScenarioPlayResult;
        setMessage(r.stopped ? { isError: true, text: r.stopped.message } : { isError: false, text: `${label}: played all ${r.played} steps.` });
      } else setMessage({ isError: false, text: label });
    } catch (err) {
      setMessage({ isError: true, text: errorText(err) ?? "That did not work." });
    }
  }

  return (
    <section aria-labelledby={`${nameId}-title`} className="space-y-3 rounded-xl border border-line bg-paper p-4">
      <h2 id={`${nameId}-title`} className="font-bold">Scenarios</h2>
      <form
        className="flex flex-wrap items-end gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          void run(`Saved "${name.trim()}"`, async () => {
            await call.mutateAsync({ path: "/scenarios", body: { name: name.trim(), fromSession: true } });
            setName("");
          });
        }}
      >
        <div className="flex flex-col">
          <label htmlFor={nameId} className="text-xs text-slate">Save the {recorded} action{recorded === 1 ? "" : "s"} since the last reset as</label>
          <input id={nameId} value={name} maxLength={80} required onChange={(e) => setName(e.target.value)} placeholder="Scenario name" className="w-56 rounded-md border border-line bg-paper px-2 py-1 text-sm" />
        </div>
        <button type="submit" disabled={busy || recorded === 0 || !name.trim()} className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog disabled:opacity-50">
          Save scenario
        </button>
      </form>
      <p role={message?.isError ? "alert" : "status"} aria-live="polite" className={`text-sm font-semibold ${message?.isError ? "text-clay" : "text-moss"}`}>
        {message?.text}
      </p>
      {scenarios.isError ? <p role="alert" className="text-sm text-clay">{errorText(scenarios.error)}</p> : null}
      <ul className="space-y-2">
        {scenarios.data?.map((s) => (
          <li key={s.id} className="rounded-lg border border-line p-3" aria-label={`Scenario ${s.name}`}>
            <div className="flex flex-wrap items-center gap-2">
              <h3 className="mr-auto font-semibold">{s.name}</h3>
              <button type="button" disabled={busy} className="rounded-md border border-line px-2.5 py-1 text-sm font-semibold hover:border-ink disabled:opacity-50" onClick={() => void run(`Played "${s.name}"`, () => call.mutateAsync({ path: `/scenarios/${s.id}/play`, body: { deliverNotices } }))}>
                Play
              </button>
              <button
                type="button"
                disabled={busy}
                className="rounded-md border border-line px-2.5 py-1 text-sm text-clay hover:border-clay disabled:opacity-50"
                onClick={() => {
                  if (window.confirm(`Delete the scenario "${s.name}"?`)) void run(`Deleted "${s.name}"`, () => call.mutateAsync({ path: `/scenarios/${s.id}`, method: "DELETE" }));
                }}
              >
                Delete
              </button>
            </div>
            <ol className="mt-1 list-decimal pl-5 text-xs text-slate">
              {s.steps.map((step, i) => <li key={i}>{describeAction(step, nameOf)}</li>)}
            </ol>
          </li>
        ))}
      </ul>
      <p className="text-xs text-slate">Playing starts from a reset (or from the scenario&apos;s own date) and runs on the rules the bench runs now, so a scenario recorded on the active rules can be played against the draft.</p>
    </section>
  );
}
