"use client";

import { useId, useState } from "react";
import { ruleNodeSchema, type RuleNode } from "@/lib/rules/graph";
import { NOTICE_CHANNELS } from "@/lib/rules/graph-actions";
import { devicesFor, typeLabel, type PaletteSite } from "@/lib/rules/palette";
import { nodeSubject, type SiteNames } from "@/lib/rules/sentence";
import type { Problem } from "@/lib/rules/validate";
import { WEEKDAYS } from "@/lib/sun/local-time";
import { fieldSpecs, numberFromInput, type FieldSpec } from "./param-fields";

type Params = Record<string, unknown>;
type Link = { edgeId: string; nodeId: string; label: string };

type Props = {
  rule: RuleNode;
  site: PaletteSite;
  names: SiteNames;
  problems: Problem[];
  isReadOnly: boolean;
  outgoing: Link[];
  incoming: Link[];
  candidates: { nodeId: string; label: string }[];
  onParams: (params: Params, field: string) => void;
  onConnect: (targetId: string) => void;
  onDisconnect: (edgeId: string) => void;
  onDelete: () => void;
  /** Said under the problems, e.g. that the node's device runs short of energy. */
  notice?: React.ReactNode;
};

const input = "w-full rounded-md border bg-paper px-2 py-1.5 text-sm";
const ROLE_OPTIONS = ["integrator", "manager", "occupant"] as const;

export function describeNode(rule: RuleNode, names: SiteNames): string {
  const { subject, detail } = nodeSubject(rule, names);
  const kind = rule.kind === "gate" ? "Only if" : rule.kind === "trigger" ? "Trigger" : "Action";
  return `${kind}: ${typeLabel(rule.kind, rule.type)} — ${subject}${detail ? `, ${detail}` : ""}`;
}

/**
 * The form for the selected node, built from its zod schema: each change is
 * parsed with the same schema the server uses; a valid node is saved at once,
 * an invalid field keeps what was typed and shows the schema's message.
 */
export function Inspector(props: Props) {
  const { rule, site, problems, isReadOnly } = props;
  const id = useId();
  const [raw, setRaw] = useState<Record<string, string>>({});
  const [errors, setErrors] = useState<Record<string, string>>({});
  const params = rule.params as Params;
  const specs = fieldSpecs(rule.kind, rule.type);

  const attempt = (key: string, value: unknown) => {
    const next = { ...params, [key]: value };
    if (value === undefined) delete next[key];
    const parsed = ruleNodeSchema.safeParse({ ...rule, params: next });
    if (parsed.success) {
      setErrors({});
      props.onParams(parsed.data.params as Params, key);
      return;
    }
    const found: Record<string, string> = {};
    for (const issue of parsed.error.issues) {
      const field = issue.path[0] === "params" && issue.path.length > 1 ? String(issue.path[1]) : key;
      found[field] ??= issue.message;
    }
    setErrors(found);
  };
  const typed = (key: string, text: string, value: unknown) => {
    setRaw((r) => ({ ...r, [key]: text }));
    attempt(key, value);
  };
  const settle = (key: string) => {
    if (!errors[key]) setRaw(({ [key]: _drop, ...r }) => r);
  };

  return (
    <section aria-labelledby={`${id}-title`} className="space-y-3">
      <div>
        <p className="text-xs font-bold uppercase tracking-wide text-slate">{rule.kind === "gate" ? "Gate (only if)" : rule.kind === "trigger" ? "Trigger" : "Action"}</p>
        <h2 id={`${id}-title`} className="text-lg font-extrabold">
          {typeLabel(rule.kind, rule.type)}
        </h2>
      </div>
      {problems.length ? (
        <ul className="space-y-1" aria-label="Problems with this node">
          {problems.map((p, i) => (
            <li key={i} className={`rounded-md border px-2 py-1 text-sm ${p.severity === "error" ? "border-clay text-clay" : "border-harvest"}`}>
              <span className="font-bold">{p.severity === "error" ? "Error: " : "Warning: "}</span>
              {p.message}
            </li>
          ))}
        </ul>
      ) : null}
      {props.notice}
      <fieldset disabled={isReadOnly} className="space-y-3">
        <legend className="sr-only">Settings</legend>
        {specs.length === 0 ? <p className="text-sm text-slate">This node has nothing to set.</p> : null}
        {specs.map((spec) => (
          <Field key={spec.key} spec={spec} fieldId={`${id}-${spec.key}`} error={errors[spec.key]}>
            {renderWidget(spec, `${id}-${spec.key}`)}
          </Field>
        ))}
      </fieldset>
      <Connections {...props} />
      {!isReadOnly ? (
        <button type="button" onClick={props.onDelete} className="rounded-md border border-clay px-3 py-1.5 text-sm font-semibold text-clay hover:bg-clay/10">
          Delete node
        </button>
      ) : null}
    </section>
  );

  function renderWidget(spec: FieldSpec, fid: string) {
    const value = params[spec.key];
    const err = errors[spec.key] ? `${fid}-error` : undefined;
    const cls = `${input} ${errors[spec.key] ? "border-clay" : "border-line"}`;
    const aria = { id: fid, "aria-invalid": errors[spec.key] ? true : undefined, "aria-describedby": err };
    switch (spec.widget) {
      case "device": {
        const options = devicesFor(site, rule.kind, rule.type);
        const known = options.some((d) => d.id === value);
        return (
          <select {...aria} className={cls} value={String(value ?? "")} onChange={(e) => attempt(spec.key, e.target.value)}>
            {!known ? <option value={String(value ?? "")}>{value ? `“${String(value)}” (not on this site)` : "Choose a device"}</option> : null}
            {options.map((d) => (
              <option key={d.id} value={d.id}>
                {d.name}
              </option>
            ))}
          </select>
        );
      }
      case "zone":
        return (
          <select {...aria} className={cls} value={String(value ?? "")} onChange={(e) => attempt(spec.key, e.target.value)}>
            {!site.zones.some((z) => z.id === value) ? <option value={String(value ?? "")}>Choose a zone</option> : null}
            {site.zones.map((z) => (
              <option key={z.id} value={z.id}>
                {z.name}
              </option>
            ))}
          </select>
        );
      case "scene":
        return (
          <select {...aria} className={cls} value={String(value ?? "")} onChange={(e) => attempt(spec.key, Number(e.target.value))}>
            {!site.scenes.some((s) => s.number === value) ? <option value={String(value ?? "")}>{value ? `Scene ${String(value)} (not set up)` : "Choose a scene"}</option> : null}
            {site.scenes.map((s) => (
              <option key={s.number} value={s.number}>
                {s.number} · {s.name}
              </option>
            ))}
          </select>
        );
      case "button": {
        const device = site.devices.find((d) => d.id === params.device);
        const count = Math.max(device?.buttons ?? 4, Number(value) || 1);
        return (
          <select {...aria} className={cls} value={String(value ?? 1)} onChange={(e) => attempt(spec.key, Number(e.target.value))}>
            {Array.from({ length: count }, (_, i) => (
              <option key={i} value={i + 1}>
                Button {i + 1}
              </option>
            ))}
          </select>
        );
      }
      case "number":
        return (
          <input
            {...aria}
            className={cls}
            inputMode="decimal"
            value={raw[spec.key] ?? (value === undefined ? "" : String(value))}
            placeholder={spec.optional ? "leave empty for the default" : undefined}
            onChange={(e) => typed(spec.key, e.target.value, numberFromInput(e.target.value))}
            onBlur={() => settle(spec.key)}
          />
        );
      case "text":
        return spec.long ? (
          <textarea {...aria} className={cls} rows={3} value={raw[spec.key] ?? String(value ?? "")} onChange={(e) => typed(spec.key, e.target.value, e.target.value)} onBlur={() => settle(spec.key)} />
        ) : (
          <input {...aria} className={cls} value={raw[spec.key] ?? String(value ?? "")} onChange={(e) => typed(spec.key, e.target.value, spec.optional && e.target.value === "" ? undefined : e.target.value)} onBlur={() => settle(spec.key)} />
        );
      case "enum":
        return (
          <select {...aria} className={cls} value={String(value ?? "")} onChange={(e) => attempt(spec.key, e.target.value === "" ? undefined : e.target.value)}>
            {spec.optional ? <option value="">(from the trigger)</option> : null}
            {spec.options.map((o) => (
              <option key={o} value={o}>
                {o}
              </option>
            ))}
          </select>
        );
      case "boolean":
        return <input {...aria} type="checkbox" className="h-4 w-4" checked={Boolean(value)} onChange={(e) => attempt(spec.key, e.target.checked)} />;
      case "modes": {
        const modes = (value as string[] | undefined) ?? [];
        return <input {...aria} className={cls} value={raw[spec.key] ?? modes.join(", ")} onChange={(e) => typed(spec.key, e.target.value, e.target.value.split(",").map((m) => m.trim()).filter(Boolean))} onBlur={() => settle(spec.key)} />;
      }
      case "days":
      case "channels": {
        const options = spec.widget === "days" ? [...WEEKDAYS] : [...NOTICE_CHANNELS];
        const chosen = new Set((value as string[] | undefined) ?? []);
        return (
          <div id={fid} role="group" aria-describedby={err} className="flex flex-wrap gap-x-3 gap-y-1">
            {options.map((o) => (
              <label key={o} className="flex items-center gap-1 text-sm">
                <input type="checkbox" checked={chosen.has(o)} onChange={(e) => attempt(spec.key, options.filter((x) => (x === o ? e.target.checked : chosen.has(x))))} />
                {o === "email" ? "e-mail" : o}
              </label>
            ))}
          </div>
        );
      }
      case "recipients": {
        const to = (value ?? { role: "manager" }) as { role?: string; people?: string[] };
        const people = new Set(to.people ?? []);
        return (
          <div id={fid} role="group" aria-describedby={err} className="space-y-1.5">
            <label className="flex items-center gap-2 text-sm">
              <input type="radio" name={`${fid}-mode`} checked={!!to.role} onChange={() => attempt(spec.key, { role: "manager" })} />
              Everyone with a role
            </label>
            {to.role ? (
              <select aria-label="Role" className={`${input} border-line`} value={to.role} onChange={(e) => attempt(spec.key, { role: e.target.value })}>
                {ROLE_OPTIONS.map((r) => (
                  <option key={r} value={r}>
                    {r}s
                  </option>
                ))}
              </select>
            ) : null}
            <label className="flex items-center gap-2 text-sm">
              <input type="radio" name={`${fid}-mode`} checked={!to.role} onChange={() => attempt(spec.key, { people: site.people.slice(0, 1).map((p) => p.id) })} />
              Chosen people
            </label>
            {!to.role ? (
              <div className="ml-5 space-y-0.5">
                {site.people.map((p) => (
                  <label key={p.id} className="flex items-center gap-2 text-sm">
                    <input type="checkbox" checked={people.has(p.id)} onChange={(e) => attempt(spec.key, { people: site.people.filter((x) => (x.id === p.id ? e.target.checked : people.has(x.id))).map((x) => x.id) })} />
                    {p.name} <span className="text-slate">({p.role})</span>
                  </label>
                ))}
              </div>
            ) : null}
          </div>
        );
      }
      case "target": {
        const t = (value ?? {}) as { zone?: string; device?: string };
        const lights = devicesFor(site, "action", "set-level");
        const v = t.zone ? `zone:${t.zone}` : t.device ? `device:${t.device}` : "";
        return (
          <select {...aria} className={cls} value={v} onChange={(e) => attempt(spec.key, e.target.value.startsWith("zone:") ? { zone: e.target.value.slice(5) } : { device: e.target.value.slice(7) })}>
            {v === "" ? <option value="">Choose a zone or luminaire</option> : null}
            <optgroup label="Zones">
              {site.zones.map((z) => (
                <option key={z.id} value={`zone:${z.id}`}>
                  {z.name}
                </option>
              ))}
            </optgroup>
            <optgroup label="Single luminaires">
              {lights.map((d) => (
                <option key={d.id} value={`device:${d.id}`}>
                  {d.name}
                </option>
              ))}
            </optgroup>
          </select>
        );
      }
      case "time": {
        const t = (value ?? { kind: "fixed", time: "07:00" }) as { kind: string; time?: string; offsetMinutes?: number };
        return (
          <div id={fid} role="group" aria-describedby={err} className="flex gap-2">
            <select aria-label={`${spec.label}: kind of time`} className={`${input} border-line`} value={t.kind} onChange={(e) => attempt(spec.key, e.target.value === "fixed" ? { kind: "fixed", time: "07:00" } : { kind: e.target.value, offsetMinutes: 0 })}>
              <option value="fixed">clock time</option>
              <option value="sunrise">sunrise</option>
              <option value="sunset">sunset</option>
            </select>
            {t.kind === "fixed" ? (
              <input aria-label={`${spec.label}: time`} type="time" className={`${input} border-line`} value={t.time ?? ""} onChange={(e) => attempt(spec.key, { kind: "fixed", time: e.target.value })} />
            ) : (
              <input
                aria-label={`${spec.label}: minutes after (negative: before)`}
                className={`${input} border-line`}
                inputMode="numeric"
                value={raw[spec.key] ?? String(t.offsetMinutes ?? 0)}
                onChange={(e) => typed(spec.key, e.target.value, { kind: t.kind, offsetMinutes: numberFromInput(e.target.value) ?? 0 })}
                onBlur={() => settle(spec.key)}
              />
            )}
          </div>
        );
      }
    }
  }
}

function Field({ spec, fieldId, error, children }: { spec: FieldSpec; fieldId: string; error?: string; children: React.ReactNode }) {
  const grouped = ["days", "channels", "recipients", "time"].includes(spec.widget);
  return (
    <div className={spec.widget === "boolean" ? "flex flex-row-reverse items-center justify-end gap-2" : "flex flex-col gap-1"}>
      {grouped ? (
        <p id={`${fieldId}-label`} className="text-sm font-semibold">
          {spec.label}
        </p>
      ) : (
        <label htmlFor={fieldId} className="text-sm font-semibold">
          {spec.label}
          {spec.optional && spec.widget !== "boolean" ? <span className="font-normal text-slate"> (optional)</span> : null}
        </label>
      )}
      {children}
      {error ? (
        <p id={`${fieldId}-error`} role="alert" className="text-sm font-semibold text-clay">
          {error}
        </p>
      ) : null}
    </div>
  );
}

function Connections({ rule, outgoing, incoming, candidates, isReadOnly, onConnect, onDisconnect }: Props) {
  const id = useId();
  const [target, setTarget] = useState("");
  return (
    <div className="space-y-2 border-t border-line pt-3">
      {rule.kind !== "trigger" ? <LinkList title="Comes from" links={incoming} empty="Nothing leads here yet." isReadOnly={isReadOnly} onRemove={onDisconnect} /> : null}
      {rule.kind !== "action" ? (
        <>
          <LinkList title="Leads to" links={outgoing} empty="Leads nowhere yet." isReadOnly={isReadOnly} onRemove={onDisconnect} />
          {!isReadOnly && candidates.length ? (
            <div className="flex items-end gap-2">
              <div className="flex min-w-0 flex-1 flex-col gap-1">
                <label htmlFor={id} className="text-sm font-semibold">
                  Connect to
                </label>
                <select id={id} className={`${input} border-line`} value={target} onChange={(e) => setTarget(e.target.value)}>
                  <option value="">Choose a gate or action</option>
                  {candidates.map((c) => (
                    <option key={c.nodeId} value={c.nodeId}>
                      {c.label}
                    </option>
                  ))}
                </select>
              </div>
              <button
                type="button"
                disabled={!target}
                onClick={() => {
                  onConnect(target);
                  setTarget("");
                }}
                className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog disabled:opacity-50"
              >
                Connect
              </button>
            </div>
          ) : null}
        </>
      ) : (
        <p className="text-sm text-slate">An action ends its path; nothing follows it.</p>
      )}
    </div>
  );
}

function LinkList({ title, links, empty, isReadOnly, onRemove }: { title: string; links: Link[]; empty: string; isReadOnly: boolean; onRemove: (edgeId: string) => void }) {
  return (
    <div>
      <p className="text-sm font-semibold">{title}</p>
      {links.length === 0 ? <p className="text-sm text-slate">{empty}</p> : null}
      <ul className="space-y-1">
        {links.map((l) => (
          <li key={l.edgeId} className="flex items-center gap-2 text-sm">
            <span className="min-w-0 flex-1 truncate" title={l.label}>
              {l.label}
            </span>
            {!isReadOnly ? (
              <button type="button" onClick={() => onRemove(l.edgeId)} className="rounded px-1.5 text-xs font-semibold text-clay hover:bg-clay/10">
                Remove<span className="sr-only"> connection: {l.label}</span>
              </button>
            ) : null}
          </li>
        ))}
      </ul>
    </div>
  );
}
