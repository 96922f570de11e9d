"use client";

import { isLuminaire } from "@/lib/catalogue/device-kinds";
import type { DeviceDto, ZoneDto } from "@/lib/validation/devices";
import type { SceneDto } from "@/lib/validation/scenes";
import { resolveLevels } from "./levels-editor";

/** Each luminaire as a lamp whose glow follows the level; "unchanged" is drawn hollow and said in words. */
export function ScenePreview({ levels, zones, devices }: { levels: SceneDto["levels"]; zones: ZoneDto[]; devices: DeviceDto[] }) {
  const resolved = resolveLevels(levels, devices);
  return (
    <div className="grid gap-3 sm:grid-cols-2" aria-label="Scene preview">
      {zones.map((z) => {
        const lums = devices.filter((d) => d.zoneId === z.id && isLuminaire(d.kind));
        if (!lums.length) return null;
        return (
          <div key={z.id} className="rounded-lg border border-line bg-ink p-3 text-fog">
            <p className="text-sm font-bold">{z.name}</p>
            <ul className="mt-2 flex flex-wrap gap-3">
              {lums.map((d) => {
                const level = resolved.get(d.id) ?? null;
                return (
                  <li key={d.id} className="flex w-20 flex-col items-center text-center text-[11px] leading-tight">
                    <span
                      aria-hidden="true"
                      className="mb-1 block h-7 w-7 rounded-full border-2 border-harvest"
                      style={level === null ? undefined : { background: `rgba(217,154,30,${0.08 + (0.92 * level) / 100})`, boxShadow: level ? `0 0 ${4 + level / 5}px rgba(217,154,30,${level / 100})` : undefined }}
                    />
                    <span className="line-clamp-2">{d.name}</span>
                    <span className="font-mono">{level === null ? "unchanged" : `${level} %`}</span>
                  </li>
                );
              })}
            </ul>
          </div>
        );
      })}
    </div>
  );
}
