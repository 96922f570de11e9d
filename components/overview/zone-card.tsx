import { PowerBadge } from "@/components/ui/power-badge";
import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import { formatAddress } from "@/lib/mesh/address";
import type { LiveSummary, OverviewDevice } from "@/lib/validation/overview";

function addressText(d: OverviewDevice): string {
  const first = formatAddress(d.unicastAddress);
  return d.elementCount > 1 ? `${first}–${formatAddress(d.unicastAddress + d.elementCount - 1)}` : first;
}

function nowText(d: OverviewDevice, live: LiveSummary | null): string {
  if (!live) return "—";
  if (d.id in live.relays) return live.relays[d.id] ? "on" : "off";
  if (d.id in live.levels) return `${Math.round(live.levels[d.id])} %`;
  return "—";
}

export function ZoneCard({ title, groupAddress, devices, live = null }: { title: string; groupAddress?: number; devices: OverviewDevice[]; live?: LiveSummary | null }) {
  return (
    <article className="rounded-xl border border-line bg-paper p-4 shadow-sm" aria-label={`Zone ${title}`}>
      <header className="flex items-baseline justify-between gap-2">
        <h3 className="text-lg font-bold">{title}</h3>
        {groupAddress !== undefined ? (
          <span className="font-mono text-sm text-slate" title="Mesh group address of the zone">
            group {formatAddress(groupAddress)}
          </span>
        ) : null}
      </header>
      {devices.length === 0 ? (
        <p className="mt-2 text-sm text-slate">No devices in this zone yet.</p>
      ) : (
        <table className="mt-2 w-full text-sm">
          <caption className="sr-only">Devices in {title}</caption>
          <thead>
            <tr className="border-b border-line text-left text-slate">
              <th scope="col" className="py-1 pr-2 font-semibold">Device</th>
              <th scope="col" className="py-1 pr-2 font-semibold">Power</th>
              <th scope="col" className="py-1 pr-2 text-right font-semibold">Unicast</th>
              <th scope="col" className="py-1 text-right font-semibold">Now</th>
            </tr>
          </thead>
          <tbody>
            {devices.map((d) => {
              const info = DEVICE_KIND_INFO[d.kind];
              return (
                <tr key={d.id} className="border-b border-line/60 last:border-0">
                  <td className="py-1.5 pr-2">
                    <span className="font-semibold">{d.name}</span>
                    <span className="block text-xs text-slate">{info.label}</span>
                  </td>
                  <td className="py-1.5 pr-2">
                    <PowerBadge power={info.power} />
                  </td>
                  <td className="py-1.5 pr-2 text-right font-mono">{addressText(d)}</td>
                  <td className="py-1.5 text-right font-mono">{nowText(d, live)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
    </article>
  );
}
