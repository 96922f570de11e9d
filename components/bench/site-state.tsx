"use client";

import { DEVICE_KIND_INFO, isLuminaire } from "@/lib/catalogue/device-kinds";
import { formatAddress } from "@/lib/mesh/address";
import type { BenchView } from "@/lib/validation/bench";
import { formatBenchTime, LEVEL_WORD } from "./format";

type Props = { view: BenchView; levels: Record<string, number>; moving: Set<string>; isBusy: boolean; onClear: () => void };

/** Site mode and the emergency latch; the latch carries the usual caution and, for those allowed, the clear button. */
export function ModeAndLatch({ view, isBusy, onClear }: Omit<Props, "levels" | "moving">) {
  const { state, site } = view;
  return (
    <section aria-label="Site mode and emergency" className="space-y-2">
      <dl className="flex flex-wrap gap-x-8 gap-y-1 rounded-lg border border-line bg-paper px-4 py-3 text-sm">
        <div className="flex gap-2"><dt className="text-slate">Site mode</dt><dd className="font-bold" data-testid="bench-mode">{state.mode}</dd></div>
        <div className="flex gap-2"><dt className="text-slate">Emergency</dt><dd className="font-bold">{state.emergency.active ? "latched" : "none"}</dd></div>
      </dl>
      {state.emergency.active ? (
        <div role="alert" className="rounded-lg border-2 border-clay bg-clay/10 px-4 py-3">
          <p className="font-extrabold text-clay">◆ Emergency latched{state.emergency.since ? ` since ${formatBenchTime(state.emergency.since, site.timeZone)}` : ""}{state.emergency.scene ? ` (scene ${state.emergency.scene})` : ""} — on the bench only.</p>
          <p className="text-sm">It holds every luminaire until cleared, whatever rockers and sensors do. On a real site, clear it only once the fire-alarm system has been reset and the building is safe; this console&apos;s emergency scene does not replace certified emergency lighting or the fire-alarm system — follow local codes.</p>
          {view.canClearEmergency ? (
            <button
              type="button"
              disabled={isBusy}
              className="mt-2 rounded-md border-2 border-clay bg-paper px-3 py-1.5 text-sm font-bold text-clay"
              onClick={() => {
                if (window.confirm("Clear the emergency on the bench? On a real site, only once the fire-alarm system has been reset and the building is safe.")) onClear();
              }}
            >
              Clear emergency (bench)
            </button>
          ) : null}
        </div>
      ) : null}
    </section>
  );
}

function LevelBar({ level, isMoving }: { level: number; isMoving: boolean }) {
  return (
    <span className="flex items-center gap-2">
      <span aria-hidden="true" className="h-2.5 w-20 overflow-hidden rounded-full border border-line bg-fog">
        <span className={`block h-full ${isMoving ? "bg-harvest" : "bg-harvest/80"}`} style={{ width: `${Math.max(0, Math.min(100, level))}%` }} />
      </span>
      <span className="w-11 text-right font-mono tabular-nums">{Math.round(level)} %</span>
    </span>
  );
}

/** Zones with their luminaires' levels, which override holds each, and relays. */
export function ZoneLevels({ view, levels, moving }: Omit<Props, "isBusy" | "onClear">) {
  const byZone = new Map<string | null, BenchView["devices"]>();
  for (const d of view.devices) {
    if (!isLuminaire(d.kind) && d.kind !== "relay") continue;
    byZone.set(d.zoneId, [...(byZone.get(d.zoneId) ?? []), d]);
  }
  const groups = [...view.zones.map((z) => ({ key: z.id, name: z.name, group: z.groupAddress })), { key: null, name: "Not in a zone", group: null }].filter((z) => byZone.get(z.key)?.length);
  return (
    <section aria-labelledby="bench-zones-title" className="space-y-2">
      <h2 id="bench-zones-title" className="font-bold">Zones and levels</h2>
      <div className="grid gap-3 sm:grid-cols-2">
        {groups.map((z) => (
          <article key={z.key ?? "none"} aria-label={`Zone ${z.name}`} className="rounded-lg border border-line bg-paper p-3">
            <header className="flex items-baseline justify-between gap-2">
              <h3 className="font-bold">{z.name}</h3>
              {z.group !== null ? <span className="font-mono text-xs text-slate">group {formatAddress(z.group)}</span> : null}
            </header>
            <table className="mt-1 w-full table-fixed text-sm">
              <caption className="sr-only">Luminaires and relays in {z.name}</caption>
              <colgroup>
                <col />
                <col className="w-36" />
                <col className="w-24" />
              </colgroup>
              <thead className="sr-only">
                <tr><th scope="col">Device</th><th scope="col">Level</th><th scope="col">Held by</th></tr>
              </thead>
              <tbody>
                {byZone.get(z.key)!.map((d) => {
                  const hold = view.state.holding[d.id];
                  return (
                    <tr key={d.id} className="border-t border-line/60 first:border-0" data-testid={`level-${d.id}`}>
                      <td className="py-1 pr-2">{d.name}<span className="sr-only"> ({DEVICE_KIND_INFO[d.kind].label})</span></td>
                      <td className="py-1 pr-2">
                        {d.kind === "relay" ? <span className="font-mono font-bold">{view.state.relays[d.id] ? "on" : "off"}</span> : <LevelBar level={levels[d.id] ?? 0} isMoving={moving.has(d.id)} />}
                      </td>
                      <td className="py-1 text-right text-xs">
                        {hold ? <span className={`rounded px-1.5 py-0.5 font-semibold ${hold.level === "emergency" ? "bg-clay/15 text-clay" : "bg-fog text-ink"}`}>{hold.level === "emergency" ? "◆ " : ""}{LEVEL_WORD[hold.level]}</span> : <span className="text-slate">—</span>}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </table>
          </article>
        ))}
      </div>
      <p className="text-xs text-slate">Held by: the override level whose claim sets the luminaire now (Emergency &gt; Manual &gt; Sensor &gt; Schedule). A bar in amber is fading.</p>
    </section>
  );
}
