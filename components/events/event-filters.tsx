"use client";

import { NamedOptions } from "@/components/ui/named-options";
import { useId } from "react";
import { useIsHydrated } from "@/components/forms/hydrated-fieldset";
import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import type { SiteContext } from "./types";

export type FilterState = { device: string; zone: string; kind: string; from: string; to: string };
export const EMPTY_FILTER: FilterState = { device: "", zone: "", kind: "", from: "", to: "" };

/** Device, zone, kind and a time range on the site's clock. */
export function EventFilters({ ctx, value, onChange, error }: { ctx: SiteContext; value: FilterState; onChange: (f: FilterState) => void; error: string | null }) {
  const id = useId();
  const isHydrated = useIsHydrated();
  const kinds = [...new Set(ctx.devices.flatMap((d) => DEVICE_KIND_INFO[d.kind].reports))].sort();
  const set = (k: keyof FilterState) => (e: React.ChangeEvent<HTMLInputElement | HTMLSelectElement>) => onChange({ ...value, [k]: e.target.value });
  const field = "mt-1 w-full rounded-md border border-line bg-paper px-2 py-1.5 text-sm";
  return (
    // Disabled until hydrated, so a filter chosen in the first moment is not lost (the log is server-rendered).
    <fieldset disabled={!isHydrated} className="grid gap-3 rounded-xl border border-line bg-paper p-4 sm:grid-cols-2 lg:grid-cols-5">
      <legend className="px-1 text-sm font-bold">Filter the log</legend>
      <label className="text-sm font-semibold" htmlFor={`${id}-device`}>
        Device
        <select id={`${id}-device`} className={field} value={value.device} onChange={set("device")}>
          <NamedOptions all="All devices" items={ctx.devices.filter((d) => DEVICE_KIND_INFO[d.kind].reports.length > 0)} />
        </select>
      </label>
      <label className="text-sm font-semibold" htmlFor={`${id}-zone`}>
        Zone
        <select id={`${id}-zone`} className={field} value={value.zone} onChange={set("zone")}>
          <NamedOptions all="All zones" items={ctx.zones} />
        </select>
      </label>
      <label className="text-sm font-semibold" htmlFor={`${id}-kind`}>
        Kind
        <select id={`${id}-kind`} className={field} value={value.kind} onChange={set("kind")}>
          <option value="">All kinds</option>
          {kinds.map((k) => (
            <option key={k} value={k}>
              {k}
            </option>
          ))}
        </select>
      </label>
      <label className="text-sm font-semibold" htmlFor={`${id}-from`}>
        From <span className="font-normal text-slate">(site time, {ctx.timeZone})</span>
        <input id={`${id}-from`} type="datetime-local" className={field} value={value.from} onChange={set("from")} />
      </label>
      <label className="text-sm font-semibold" htmlFor={`${id}-to`}>
        Until <span className="font-normal text-slate">(site time)</span>
        <input id={`${id}-to`} type="datetime-local" className={field} value={value.to} onChange={set("to")} aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-err` : undefined} />
      </label>
      {error ? (
        <p id={`${id}-err`} role="alert" className="text-sm font-semibold text-clay sm:col-span-2 lg:col-span-5">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
