"use client";

import { useId, useState } from "react";
import { ApiError, fetchJson } from "@/components/api/fetch-json";
import { HydratedFieldset } from "@/components/forms/hydrated-fieldset";
import type { SiteContext } from "@/components/events/types";
import { instantToLocalInput, localInputToInstant } from "@/lib/eventlog/local-input";
import type { RuleSetChoice } from "@/lib/validation/events";

export type RuleSetOptions = { activeVersionId: string | null; draftRevision: number; versions: { id: string; number: number }[] };

function choiceOf(value: string): RuleSetChoice {
  if (value === "active" || value === "draft") return { kind: value };
  return { kind: "version", versionId: value.slice("version:".length) };
}

/** Window (site time) and one or two rule sets; queues the job and hands back its id. */
export function ReplayForm({ ctx, options, initialWindow, onQueued }: { ctx: SiteContext; options: RuleSetOptions; initialWindow: { from: number; to: number }; onQueued: (jobId: string) => void }) {
  const id = useId();
  const [from, setFrom] = useState(instantToLocalInput(initialWindow.from, ctx.timeZone));
  const [to, setTo] = useState(instantToLocalInput(initialWindow.to, ctx.timeZone));
  const [a, setA] = useState("active");
  const [b, setB] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [isBusy, setBusy] = useState(false);
  const active = options.versions.find((v) => v.id === options.activeVersionId);
  const choices = [
    { value: "active", label: active ? `Active rules (version ${active.number})` : "Active rules (none yet)" },
    { value: "draft", label: `Draft (revision ${options.draftRevision})` },
    ...options.versions.map((v) => ({ value: `version:${v.id}`, label: `Version ${v.number}${v.id === options.activeVersionId ? " (active)" : ""}` })),
  ];

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    const fromMs = localInputToInstant(from, ctx.timeZone);
    const toMs = localInputToInstant(to, ctx.timeZone);
    const found: Record<string, string> = {};
    if (fromMs === null) found.from = "Choose when the window starts.";
    if (toMs === null) found.to = "Choose when the window ends.";
    if (fromMs !== null && toMs !== null && toMs <= fromMs) found.to = "The window must end after it starts.";
    if (b && b === a) found.b = "Choose a different rule set to compare with.";
    setErrors(found);
    if (Object.keys(found).length) return;
    setBusy(true);
    try {
      const ruleSets = [choiceOf(a), ...(b ? [choiceOf(b)] : [])];
      const { job } = await fetchJson<{ job: { id: string } }>(`/api/sites/${encodeURIComponent(ctx.siteId)}/replays`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ from: fromMs, to: toMs, ruleSets }) });
      onQueued(job.id);
    } catch (err) {
      const fields = err instanceof ApiError ? (err.body as { fields?: Record<string, string[]>; problems?: { message: string }[] } | undefined) : undefined;
      const next: Record<string, string> = {};
      for (const [k, v] of Object.entries(fields?.fields ?? {})) next[k === "ruleSets" ? "a" : k] = v[0];
      next.form = err instanceof Error ? err.message : String(err);
      if (fields?.problems?.length) next.form += ` ${fields.problems.slice(0, 3).map((p) => p.message).join(" ")}`;
      setErrors(next);
    } finally {
      setBusy(false);
    }
  }

  const field = "mt-1 w-full rounded-md border border-line bg-paper px-2 py-1.5 text-sm";
  const err = (k: string) => (errors[k] ? <span id={`${id}-${k}-err`} className="mt-1 block text-xs font-semibold text-clay">{errors[k]}</span> : null);
  return (
    <form onSubmit={submit} noValidate aria-labelledby={`${id}-h`} className="rounded-xl border border-line bg-paper p-4">
      <h2 id={`${id}-h`} className="text-lg font-bold">
        Run a replay
      </h2>
      <p className="text-xs text-slate">Runs the stored log (gateway and imported events) through the chosen rules in virtual time, starting from an empty state at the start of the window. Nothing is sent to the site.</p>
      <HydratedFieldset>
      <div className="mt-3 grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <label className="text-sm font-semibold" htmlFor={`${id}-from`}>
          From <span className="font-normal text-slate">(site time, {ctx.timeZone})</span>
          <input id={`${id}-from`} type="datetime-local" className={field} value={from} onChange={(e) => setFrom(e.target.value)} aria-invalid={!!errors.from} aria-describedby={errors.from ? `${id}-from-err` : undefined} />
          {err("from")}
        </label>
        <label className="text-sm font-semibold" htmlFor={`${id}-to`}>
          Until <span className="font-normal text-slate">(site time)</span>
          <input id={`${id}-to`} type="datetime-local" className={field} value={to} onChange={(e) => setTo(e.target.value)} aria-invalid={!!errors.to} aria-describedby={errors.to ? `${id}-to-err` : undefined} />
          {err("to")}
        </label>
        <label className="text-sm font-semibold" htmlFor={`${id}-a`}>
          Rule set
          <select id={`${id}-a`} className={field} value={a} onChange={(e) => setA(e.target.value)} aria-invalid={!!errors.a}>
            {choices.map((c) => (
              <option key={c.value} value={c.value}>
                {c.label}
              </option>
            ))}
          </select>
          {err("a")}
        </label>
        <label className="text-sm font-semibold" htmlFor={`${id}-b`}>
          Compare with <span className="font-normal text-slate">(optional)</span>
          <select id={`${id}-b`} className={field} value={b} onChange={(e) => setB(e.target.value)} aria-invalid={!!errors.b} aria-describedby={errors.b ? `${id}-b-err` : undefined}>
            <option value="">Nothing — replay only</option>
            {choices.map((c) => (
              <option key={c.value} value={c.value}>
                {c.label}
              </option>
            ))}
          </select>
          {err("b")}
        </label>
      </div>
      {errors.form ? (
        <p role="alert" className="mt-2 text-sm font-semibold text-clay">
          {errors.form}
        </p>
      ) : null}
      <button type="submit" disabled={isBusy} className="mt-3 rounded-md bg-ink px-4 py-2 font-semibold text-fog disabled:opacity-50">
        {b ? "Run Compare" : "Run replay"}
      </button>
      </HydratedFieldset>
    </form>
  );
}
