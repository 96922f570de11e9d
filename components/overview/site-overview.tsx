"use client";

import { useQuery } from "@tanstack/react-query";
import { useId, useMemo, useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import { DEVICE_KIND_INFO, isBatteryFree, isLuminaire, type PowerSource } from "@/lib/catalogue/device-kinds";
import type { OverviewDevice, SiteOverviewResponse } from "@/lib/validation/overview";
import { LiveStrip } from "./live-strip";
import { ZoneCard } from "./zone-card";

type PowerFilter = "all" | PowerSource;

function matches(d: OverviewDevice, text: string, power: PowerFilter): boolean {
  const info = DEVICE_KIND_INFO[d.kind];
  if (power !== "all" && info.power !== power) return false;
  if (!text) return true;
  const t = text.toLowerCase();
  return d.name.toLowerCase().includes(t) || info.label.toLowerCase().includes(t);
}

export function SiteOverview({ siteId }: { siteId: string }) {
  const searchId = useId();
  const powerId = useId();
  const [text, setText] = useState("");
  const [power, setPower] = useState<PowerFilter>("all");
  const query = useQuery({
    queryKey: ["sites", siteId, "overview"],
    queryFn: () => fetchJson<SiteOverviewResponse>(`/api/sites/${encodeURIComponent(siteId)}/overview`),
    // The live state changes as the gateway reports; a calm refresh keeps the overview current.
    refetchInterval: 10_000,
  });

  const filtered = useMemo(() => {
    if (!query.data) return null;
    const zones = query.data.zones.map((z) => ({ ...z, devices: z.devices.filter((d) => matches(d, text, power)) }));
    const unassigned = query.data.unassigned.filter((d) => matches(d, text, power));
    return { zones, unassigned };
  }, [query.data, text, power]);

  if (query.isPending) return <LoadingPanel label="Loading zones and devices…" />;
  if (query.isError) return <ErrorPanel title="The overview could not be loaded." detail={query.error.message} onRetry={() => void query.refetch()} />;

  const { site, zones, unassigned, role, live } = query.data;
  const isOccupant = role === "occupant";
  const all = [...zones.flatMap((z) => z.devices), ...unassigned];
  const stats = [
    { label: "Zones", value: zones.length },
    { label: "Devices", value: all.length },
    { label: "Battery-free", value: all.filter((d) => isBatteryFree(d.kind)).length, accent: true },
    { label: "Luminaires and drivers", value: all.filter((d) => isLuminaire(d.kind)).length },
  ];
  const shown = filtered!.zones.reduce((n, z) => n + z.devices.length, 0) + filtered!.unassigned.length;
  const isFiltering = text !== "" || power !== "all";

  return (
    <div className="space-y-8">
      <section aria-labelledby="site-title">
        <h1 id="site-title" className="text-3xl font-extrabold tracking-tight">
          {site.name}
        </h1>
        <p className="mt-1 text-slate">
          {site.address ? `${site.address} · ` : ""}Time zone {site.timeZone} · {site.latitude.toFixed(2)}°, {site.longitude.toFixed(2)}°
        </p>
        <dl className="mt-5 grid grid-cols-2 gap-3 sm:grid-cols-4">
          {stats.map((s) => (
            <div key={s.label} className={`rounded-xl border bg-paper p-4 ${s.accent ? "border-harvest/60" : "border-line"}`}>
              <dt className="text-sm text-slate">{s.label}</dt>
              <dd className="text-2xl font-extrabold">{s.value}</dd>
            </div>
          ))}
        </dl>
      </section>

      <LiveStrip live={live} timeZone={site.timeZone} siteId={site.id} canClear={!isOccupant} />

      <section aria-labelledby="zones-title" className="space-y-4">
        <div className="flex flex-wrap items-end gap-4">
          <h2 id="zones-title" className="mr-auto text-xl font-bold">
            {isOccupant ? "Your zones" : "Zones and devices"}
          </h2>
          <div className="flex flex-col">
            <label htmlFor={searchId} className="text-sm text-slate">
              Find a device
            </label>
            <input
              id={searchId}
              type="search"
              value={text}
              maxLength={100}
              onChange={(e) => setText(e.target.value)}
              placeholder="Name or kind"
              className="w-56 rounded-md border border-line bg-paper px-2 py-1.5"
            />
          </div>
          <div className="flex flex-col">
            <label htmlFor={powerId} className="text-sm text-slate">
              Power
            </label>
            <select id={powerId} value={power} onChange={(e) => setPower(e.target.value as PowerFilter)} className="rounded-md border border-line bg-paper px-2 py-1.5">
              <option value="all">All</option>
              <option value="kinetic">Kinetic</option>
              <option value="solar">Solar</option>
              <option value="mains">Wired (mains)</option>
            </select>
          </div>
        </div>
        <p aria-live="polite" className="text-sm text-slate">
          {isFiltering ? `${shown} of ${all.length} devices match.` : `${all.length} devices in ${zones.length} zones.`}
        </p>
        <div className="grid gap-4 lg:grid-cols-2">
          {filtered!.zones
            .filter((z) => !isFiltering || z.devices.length > 0)
            .map((z) => (
              <ZoneCard key={z.id} title={z.name} groupAddress={z.groupAddress} devices={z.devices} live={live} />
            ))}
          {filtered!.unassigned.length > 0 ? <ZoneCard title="Not in a zone" devices={filtered!.unassigned} live={live} /> : null}
        </div>
      </section>
    </div>
  );
}
