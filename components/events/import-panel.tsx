"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useId, useState } from "react";
import type { ImportReport } from "@/lib/eventlog/check";
import { MAX_IMPORT_BYTES } from "@/lib/validation/events";

type Answer = { status: number; body: { report?: ImportReport; summary?: string; message?: string; inserted?: number; skipped?: number } };
type State =
  | { kind: "idle" }
  | { kind: "sending"; label: string; sent: number; total: number }
  | { kind: "checked"; report: ImportReport; summary: string }
  | { kind: "done"; inserted: number; skipped: number; summary: string }
  | { kind: "failed"; message: string; report?: ImportReport };

/** XMLHttpRequest, not fetch: it reports upload progress for the progress bar. */
function send(url: string, file: File, onProgress: (sent: number) => void): Promise<Answer> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open("POST", url);
    xhr.setRequestHeader("content-type", file.name.endsWith(".csv") ? "text/csv" : "application/x-ndjson");
    xhr.upload.onprogress = (e) => onProgress(e.loaded);
    xhr.onload = () => {
      let body: Answer["body"] = {};
      try {
        body = JSON.parse(xhr.responseText) as Answer["body"];
      } catch {
        body = { message: `The server answered ${xhr.status}.` };
      }
      resolve({ status: xhr.status, body });
    };
    xhr.onerror = () => reject(new Error("The console could not reach the server. Check the connection and try again."));
    xhr.send(file);
  });
}

/**
 * Import a log file: first it is read and checked (nothing written), then
 * imported — everything, or with "import the valid lines" ticked, the lines
 * without problems.
 */
export function ImportPanel({ siteId }: { siteId: string }) {
  const id = useId();
  const client = useQueryClient();
  const [file, setFile] = useState<File | null>(null);
  const [acceptValid, setAcceptValid] = useState(false);
  const [state, setState] = useState<State>({ kind: "idle" });
  const format = (f: File) => (f.name.toLowerCase().endsWith(".csv") ? "csv" : "ndjson");

  async function run(f: File, mode: "check" | "commit") {
    if (f.size > MAX_IMPORT_BYTES) return setState({ kind: "failed", message: `The file is ${Math.round(f.size / 1024 / 1024)} MiB; at most ${MAX_IMPORT_BYTES / 1024 / 1024} MiB can be imported at once. Split it by date.` });
    const label = mode === "check" ? "Checking" : "Importing";
    setState({ kind: "sending", label, sent: 0, total: f.size });
    try {
      const url = `/api/sites/${encodeURIComponent(siteId)}/events/import?format=${format(f)}&mode=${mode}&acceptValid=${acceptValid ? 1 : 0}`;
      const { status, body } = await send(url, f, (sent) => setState({ kind: "sending", label, sent, total: f.size }));
      if (status >= 400) return setState({ kind: "failed", message: body.message ?? `The server answered ${status}.`, report: body.report });
      if (mode === "check") return setState({ kind: "checked", report: body.report!, summary: body.summary ?? "" });
      setState({ kind: "done", inserted: body.inserted ?? 0, skipped: body.skipped ?? 0, summary: body.summary ?? "" });
      await client.invalidateQueries({ queryKey: ["sites", siteId, "events"] });
    } catch (err) {
      setState({ kind: "failed", message: err instanceof Error ? err.message : String(err) });
    }
  }

  const report = state.kind === "checked" || state.kind === "failed" ? state.report : undefined;
  const canImport = state.kind === "checked" && state.report.valid > 0 && (state.report.errorCount === 0 || acceptValid);

  return (
    <section aria-labelledby={`${id}-h`} className="rounded-xl border border-line bg-paper p-4">
      <h2 id={`${id}-h`} className="text-lg font-bold">Import a log file</h2>
      <p className="text-xs text-slate">
        NDJSON (one event per line) or CSV with the columns id, at, device, kind, value — what Export writes, or a gateway&apos;s own storage. Times are ms since 1970 or ISO 8601; devices by id or unicast address. Events already in the log (same id) are skipped. Imported events are history for Replay: the live engine does not run them.
      </p>
      <label htmlFor={`${id}-file`} className="mt-3 block text-sm font-semibold">
        Log file (.ndjson, .jsonl or .csv)
      </label>
      <input
        id={`${id}-file`}
        type="file"
        accept=".ndjson,.jsonl,.json,.csv,text/csv,application/x-ndjson"
        className="text-sm"
        onChange={(e) => {
          const f = e.target.files?.[0] ?? null;
          e.target.value = "";
          setFile(f);
          setAcceptValid(false);
          if (f) void run(f, "check");
        }}
      />
      <div aria-live="polite" className="mt-3 space-y-2 text-sm">
        {state.kind === "sending" ? (
          <div>
            <label htmlFor={`${id}-progress`} className="font-semibold">
              {state.label} {file?.name}… {Math.round((state.sent / Math.max(1, state.total)) * 100)} %
            </label>
            <progress id={`${id}-progress`} className="block h-2 w-full accent-harvest" max={state.total} value={state.sent} />
          </div>
        ) : null}
        {state.kind === "checked" ? <p className={state.report.errorCount ? "font-semibold text-clay" : "font-semibold text-moss"}>{state.summary}</p> : null}
        {state.kind === "failed" ? (
          <p role="alert" className="font-semibold text-clay">
            {state.message}
          </p>
        ) : null}
        {state.kind === "done" ? (
          <p role="status" className="font-semibold text-moss">
            {state.inserted} event{state.inserted === 1 ? "" : "s"} imported{state.skipped ? `, ${state.skipped} already in the log` : ""}.
          </p>
        ) : null}
        {report && report.errors.length ? (
          <div className="max-h-56 overflow-auto rounded-md border border-line">
            <table className="w-full text-xs">
              <caption className="sr-only">Lines with problems</caption>
              <thead>
                <tr className="text-left text-slate">
                  <th scope="col" className="px-2 py-1">Line</th>
                  <th scope="col" className="px-2 py-1">Field</th>
                  <th scope="col" className="px-2 py-1">Problem</th>
                </tr>
              </thead>
              <tbody>
                {report.errors.map((e, i) => (
                  <tr key={i} className="border-t border-line align-top">
                    <td className="px-2 py-1 font-mono">{e.line}</td>
                    <td className="px-2 py-1 font-mono">{e.field}</td>
                    <td className="px-2 py-1">{e.message}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            {report.errorCount > report.errors.length ? <p className="px-2 py-1 text-xs text-slate">…and {report.errorCount - report.errors.length} more.</p> : null}
          </div>
        ) : null}
        {state.kind === "checked" && file ? (
          <div className="flex flex-wrap items-center gap-3">
            {state.report.errorCount > 0 ? (
              <label className="flex items-center gap-2">
                <input type="checkbox" checked={acceptValid} onChange={(e) => setAcceptValid(e.target.checked)} />
                Import the valid lines ({state.report.valid}) and leave out the {state.report.errorCount} with problems
              </label>
            ) : null}
            <button type="button" disabled={!canImport} onClick={() => void run(file, "commit")} className="rounded-md bg-ink px-3 py-1.5 font-semibold text-fog disabled:opacity-50">
              Import {state.report.valid} event{state.report.valid === 1 ? "" : "s"}
            </button>
          </div>
        ) : null}
      </div>
    </section>
  );
}
