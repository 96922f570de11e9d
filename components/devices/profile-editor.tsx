"use client";

import { useState } from "react";
import { ApiError } from "@/components/api/fetch-json";
import { PROFILE_CHOICES, PROFILE_LABELS, READ_ONLY_KEYS } from "./profile-labels";
import { sendJson } from "./use-inventory";

type Json = null | number | string | boolean | Json[] | { [k: string]: Json };
type Obj = { [k: string]: Json };

const isObj = (v: Json): v is Obj => typeof v === "object" && v !== null && !Array.isArray(v);

function setAt(root: Obj, path: string[], value: Json): Obj {
  const copy: Obj = structuredClone(root);
  let node: Obj = copy;
  // Editing a section of typical values makes it the person's own.
  for (const key of path.slice(0, -1)) {
    node = node[key] as Obj;
    if ("isTypical" in node) {
      node.isTypical = false;
      node.source = "Entered by the integrator";
    }
  }
  if ("isTypical" in node) {
    node.isTypical = false;
    node.source = "Entered by the integrator";
  }
  node[path[path.length - 1]] = value;
  return copy;
}

function Leaf({ path, value, error, onChange }: { path: string[]; value: Json; error?: string; onChange: (v: Json) => void }) {
  const key = path[path.length - 1];
  const id = `profile-${path.join("-")}`;
  const label = PROFILE_LABELS[key] ?? key;
  const choices = PROFILE_CHOICES[key];
  return (
    <div className="flex flex-col gap-0.5">
      <label htmlFor={id} className="text-xs font-semibold">{label}</label>
      {choices ? (
        <select id={id} value={String(value)} onChange={(e) => onChange(e.target.value)} className="rounded border border-line bg-paper px-1.5 py-1 text-sm">
          {choices.map((c) => <option key={c} value={c}>{c}</option>)}
        </select>
      ) : (
        <input
          id={id}
          inputMode="decimal"
          defaultValue={value === null ? "" : String(value)}
          placeholder={value === null ? "none" : undefined}
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? `${id}-err` : undefined}
          onChange={(e) => onChange(e.target.value.trim() === "" ? null : Number.isNaN(Number(e.target.value)) ? e.target.value : Number(e.target.value))}
          className={`rounded border px-1.5 py-1 text-sm ${error ? "border-clay" : "border-line"}`}
        />
      )}
      {error ? <span id={`${id}-err`} role="alert" className="text-xs font-semibold text-clay">{error}</span> : null}
    </div>
  );
}

function Section({ name, value, path, errors, onChange }: { name: string; value: Obj; path: string[]; errors: Record<string, string>; onChange: (path: string[], v: Json) => void }) {
  const entries = Object.entries(value).filter(([k]) => !READ_ONLY_KEYS.has(k));
  const leaves = entries.filter(([, v]) => !isObj(v));
  const children = entries.filter(([, v]) => isObj(v)) as [string, Obj][];
  return (
    <fieldset className="rounded-lg border border-line p-2">
      <legend className="px-1 text-sm font-bold">
        {PROFILE_LABELS[name] ?? name}
        {typeof value.type === "string" ? <span className="ml-1 font-normal text-slate">({value.type})</span> : null}
        {typeof value.interface === "string" ? <span className="ml-1 font-normal text-slate">({value.interface})</span> : null}
        {value.isTypical === true ? <span className="ml-2 rounded-full border border-harvest bg-harvest/10 px-1.5 text-[11px] font-semibold">typical values</span> : null}
      </legend>
      {typeof value.source === "string" ? <p className="mb-1 text-[11px] text-slate">{value.source}</p> : null}
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-3">
        {leaves.map(([k, v]) => <Leaf key={k} path={[...path, k]} value={v} error={errors[[...path, k].join(".")]} onChange={(nv) => onChange([...path, k], nv)} />)}
      </div>
      <div className="mt-2 space-y-2">
        {children.map(([k, v]) => <Section key={k} name={k} value={v} path={[...path, k]} errors={errors} onChange={onChange} />)}
      </div>
    </fieldset>
  );
}

/** Edits a device's profile (energy, output); the server checks it per kind and names the field that is wrong. */
export function ProfileEditor({ siteId, deviceId, profile, onSaved }: { siteId: string; deviceId: string; profile: Record<string, unknown>; onSaved: () => Promise<unknown> }) {
  const [draft, setDraft] = useState<Obj>(profile as Obj);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<{ kind: "ok" | "error"; text: string } | null>(null);
  const sections = Object.entries(draft).filter(([, v]) => isObj(v)) as [string, Obj][];
  if (sections.length === 0) return <p className="text-sm text-slate">This kind has no profile settings.</p>;
  return (
    <form
      className="space-y-2"
      aria-label="Device profile"
      onSubmit={async (e) => {
        e.preventDefault();
        try {
          await sendJson(`/api/sites/${siteId}/devices/${deviceId}`, "PATCH", { profile: draft });
          setErrors({});
          setStatus({ kind: "ok", text: "Profile saved." });
          await onSaved();
        } catch (err) {
          const fields = err instanceof ApiError ? ((err.body as { fields?: Record<string, string[]> })?.fields ?? {}) : {};
          setErrors(Object.fromEntries(Object.entries(fields).map(([k, v]) => [k.replace(/^profile\./, ""), v[0]])));
          setStatus({ kind: "error", text: err instanceof Error ? err.message : String(err) });
        }
      }}
    >
      {sections.map(([k, v]) => <Section key={k} name={k} value={v} path={[k]} errors={errors} onChange={(path, nv) => setDraft((d) => setAt(d, path, nv))} />)}
      <div className="flex items-center gap-3">
        <button type="submit" className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog">Save profile</button>
        {status ? <span role={status.kind === "error" ? "alert" : "status"} className={`text-sm font-semibold ${status.kind === "error" ? "text-clay" : "text-moss"}`}>{status.text}</span> : null}
      </div>
    </form>
  );
}
