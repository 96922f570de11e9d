"use client";

import { useId, useState } from "react";
import { ApiError } from "@/components/api/fetch-json";
import { DEVICE_KIND_INFO, type DeviceKind } from "@/lib/catalogue/device-kinds";
import { formatAddress } from "@/lib/mesh/address";
import { sendJson } from "./use-inventory";

type CsvError = { line: number; field: string; message: string };
type PreviewDevice = { line: number; name: string; kind: DeviceKind; unicastAddress: number; elementCount: number };
type State = { kind: "idle" } | { kind: "errors"; errors: CsvError[]; message: string } | { kind: "preview"; devices: PreviewDevice[] } | { kind: "done"; count: number };

const MAX_BYTES = 1024 * 1024;

/** Preview first (nothing written), then import everything in one go — or fix the lines it names. */
export function CsvImport({ siteId, onImported }: { siteId: string; onImported: () => Promise<unknown> }) {
  const fileId = useId();
  const [csv, setCsv] = useState<string | null>(null);
  const [state, setState] = useState<State>({ kind: "idle" });
  const [isBusy, setBusy] = useState(false);

  async function send(mode: "preview" | "commit", text: string) {
    setBusy(true);
    try {
      if (mode === "preview") {
        const { devices } = await sendJson<{ devices: PreviewDevice[] }>(`/api/sites/${siteId}/devices/import`, "POST", { csv: text, mode });
        setState({ kind: "preview", devices });
      } else {
        const { imported } = await sendJson<{ imported: number }>(`/api/sites/${siteId}/devices/import`, "POST", { csv: text, mode });
        setState({ kind: "done", count: imported });
        setCsv(null);
        await onImported();
      }
    } catch (err) {
      const errors = err instanceof ApiError ? ((err.body as { errors?: CsvError[] } | undefined)?.errors ?? []) : [];
      setState({ kind: "errors", errors, message: err instanceof Error ? err.message : String(err) });
    } finally {
      setBusy(false);
    }
  }

  return (
    <section aria-labelledby="csv-heading" className="rounded-xl border border-line bg-paper p-4">
      <h2 id="csv-heading" className="text-lg font-bold">Import devices (CSV)</h2>
      <p className="text-xs text-slate">Columns: name, kind, zone, unicast_address, elements, buttons, floor, x_m, y_m. Export gives a template. Nothing is written until you confirm.</p>
      <label htmlFor={fileId} className="mt-3 block text-sm font-semibold">CSV file</label>
      <input
        id={fileId}
        type="file"
        accept=".csv,text/csv"
        className="text-sm"
        onChange={async (e) => {
          const file = e.target.files?.[0];
          e.target.value = "";
          if (!file) return;
          if (file.size > MAX_BYTES) return setState({ kind: "errors", errors: [], message: "The file is larger than 1 MiB; split it into several files." });
          const text = await file.text();
          setCsv(text);
          await send("preview", text);
        }}
      />
      <div aria-live="polite" className="mt-3 space-y-2 text-sm">
        {isBusy ? <p role="status">Checking…</p> : null}
        {state.kind === "errors" ? (
          <div role="alert">
            <p className="font-semibold text-clay">{state.message}</p>
            {state.errors.length ? (
              <table className="mt-2 w-full text-xs">
                <caption className="sr-only">Problems in the file</caption>
                <thead>
                  <tr className="text-left text-slate"><th scope="col">Line</th><th scope="col">Field</th><th scope="col">Problem</th></tr>
                </thead>
                <tbody>
                  {state.errors.map((e, i) => (
                    <tr key={i} className="border-t border-line align-top">
                      <td className="pr-2 font-mono">{e.line || "—"}</td>
                      <td className="pr-2 font-mono">{e.field}</td>
                      <td>{e.message}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            ) : null}
          </div>
        ) : null}
        {state.kind === "preview" ? (
          <div>
            <p className="font-semibold text-moss">{state.devices.length} devices ready, no problems found.</p>
            <ul className="mt-1 max-h-40 overflow-auto text-xs">
              {state.devices.map((d) => (
                <li key={d.line}>
                  <span className="font-mono">{formatAddress(d.unicastAddress)}</span> {d.name} · {DEVICE_KIND_INFO[d.kind].label}
                </li>
              ))}
            </ul>
            <button type="button" disabled={isBusy || !csv} onClick={() => csv && void send("commit", csv)} className="mt-2 rounded-md bg-ink px-3 py-1.5 font-semibold text-fog">
              Import {state.devices.length} devices
            </button>
          </div>
        ) : null}
        {state.kind === "done" ? <p className="font-semibold text-moss">{state.count} devices imported.</p> : null}
      </div>
    </section>
  );
}
