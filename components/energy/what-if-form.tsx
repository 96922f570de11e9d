"use client";

import { useId } from "react";
import { whatIfSchema, type WhatIfFields } from "@/lib/validation/energy";

export type WhatIfKey = keyof WhatIfFields;
export type WhatIfText = Partial<Record<WhatIfKey, string>>;

const FIELDS: { key: WhatIfKey; label: string; unit: string; step: string }[] = [
  { key: "luxAtFull", label: "Illuminance at the device, zone at 100 %", unit: "lx", step: "10" },
  { key: "cellAreaCm2", label: "Cell area", unit: "cm²", step: "0.5" },
  { key: "reportingIntervalS", label: "Reporting interval", unit: "s", step: "1" },
  { key: "repeats", label: "Repeats per message", unit: "0–7", step: "1" },
];

/** Parses the typed text of each control; empty means "the device's own value". */
export function parseWhatIf(text: WhatIfText): { values: Partial<WhatIfFields>; errors: Partial<Record<WhatIfKey, string>> } {
  const values: Partial<WhatIfFields> = {};
  const errors: Partial<Record<WhatIfKey, string>> = {};
  for (const { key } of FIELDS) {
    const raw = text[key]?.trim();
    if (!raw) continue;
    const parsed = whatIfSchema.shape[key].safeParse(Number(raw));
    if (parsed.success) values[key] = parsed.data;
    else errors[key] = parsed.error.issues[0]?.message ?? "Not a valid number.";
  }
  return { values, errors };
}

type Props = { text: WhatIfText; errors: Partial<Record<WhatIfKey, string>>; current: Record<WhatIfKey, number | null>; isKinetic: boolean; onChange: (key: WhatIfKey, value: string) => void; onReset: () => void };

/** What-if controls: each change reruns the model in the browser at once. */
export function WhatIfForm({ text, errors, current, isKinetic, onChange, onReset }: Props) {
  const id = useId();
  const fields = isKinetic ? FIELDS.filter((f) => f.key === "repeats") : FIELDS;
  return (
    <form aria-labelledby={`${id}-title`} onSubmit={(e) => e.preventDefault()} className="rounded-xl border border-line bg-paper p-3">
      <div className="mb-2 flex items-center gap-2">
        <h2 id={`${id}-title`} className="mr-auto text-lg font-bold">What if…</h2>
        <button type="button" onClick={onReset} className="rounded-md border border-line px-2 py-1 text-sm font-semibold hover:bg-fog">
          Reset to the device
        </button>
      </div>
      <div className="grid gap-3 sm:grid-cols-2">
        {fields.map((f) => {
          const err = errors[f.key];
          const inputId = `${id}-${f.key}`;
          return (
            <div key={f.key} className="flex flex-col">
              <label htmlFor={inputId} className="text-sm font-semibold">
                {f.label} <span className="font-normal text-slate">({f.unit})</span>
              </label>
              <input
                id={inputId}
                type="number"
                inputMode="decimal"
                step={f.step}
                value={text[f.key] ?? ""}
                placeholder={current[f.key] === null ? "none" : String(Number(current[f.key]!.toPrecision(4)))}
                onChange={(e) => onChange(f.key, e.target.value)}
                aria-invalid={err ? true : undefined}
                aria-describedby={err ? `${inputId}-err` : undefined}
                className={`rounded-md border bg-paper px-2 py-1.5 tabular-nums ${err ? "border-clay" : "border-line"}`}
              />
              {err ? (
                <span id={`${inputId}-err`} className="text-xs font-semibold text-clay">
                  {err}
                </span>
              ) : null}
            </div>
          );
        })}
      </div>
      {isKinetic ? <p className="mt-2 text-xs text-slate">A kinetic switch pays for each press with that press, so only the radio matters here.</p> : null}
    </form>
  );
}
