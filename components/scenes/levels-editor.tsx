"use client";

import { isLuminaire } from "@/lib/catalogue/device-kinds";
import type { DeviceDto, ZoneDto } from "@/lib/validation/devices";
import type { SceneDto } from "@/lib/validation/scenes";

type Levels = SceneDto["levels"];

function LevelRow({ label, value, onChange }: { label: string; value: number | undefined; onChange: (v: number | undefined) => void }) {
  const isIn = value !== undefined;
  return (
    <div className="flex flex-wrap items-center gap-3 py-1">
      <label className="flex w-56 items-center gap-2 text-sm">
        <input type="checkbox" checked={isIn} onChange={(e) => onChange(e.target.checked ? 100 : undefined)} />
        <span className={isIn ? "font-semibold" : "text-slate"}>{label}</span>
      </label>
      <input
        type="range"
        min={0}
        max={100}
        step={1}
        value={value ?? 0}
        disabled={!isIn}
        aria-label={`Level of ${label}, percent`}
        onChange={(e) => onChange(Number(e.target.value))}
        className="w-48 accent-harvest"
      />
      <span className="w-14 text-right font-mono text-sm">{isIn ? `${value} %` : "—"}</span>
    </div>
  );
}

/** Sliders per zone, and per luminaire to differ from its zone; unticked targets are left as they are. */
export function LevelsEditor({ zones, devices, value, onChange }: { zones: ZoneDto[]; devices: DeviceDto[]; value: Levels; onChange: (v: Levels) => void }) {
  const zoneLevel = new Map(value.filter((l) => l.zoneId).map((l) => [l.zoneId!, l.level]));
  const deviceLevel = new Map(value.filter((l) => l.deviceId).map((l) => [l.deviceId!, l.level]));
  const set = (key: "zoneId" | "deviceId", id: string, level: number | undefined) => {
    const rest = value.filter((l) => l[key] !== id);
    onChange(level === undefined ? rest : [...rest, { [key]: id, level }]);
  };
  return (
    <div className="space-y-3">
      {zones.map((z) => {
        const lums = devices.filter((d) => d.zoneId === z.id && isLuminaire(d.kind));
        if (lums.length === 0) return null;
        return (
          <fieldset key={z.id} className="rounded-lg border border-line p-3">
            <legend className="px-1 text-sm font-bold">{z.name}</legend>
            <LevelRow label={`Whole zone (${lums.length})`} value={zoneLevel.get(z.id)} onChange={(v) => set("zoneId", z.id, v)} />
            <details className="ml-4">
              <summary className="cursor-pointer text-xs text-slate">Luminaires that differ from the zone</summary>
              {lums.map((d) => (
                <LevelRow key={d.id} label={d.name} value={deviceLevel.get(d.id)} onChange={(v) => set("deviceId", d.id, v)} />
              ))}
            </details>
          </fieldset>
        );
      })}
    </div>
  );
}

/** The level each luminaire would take: its own entry, else its zone's, else unchanged (null). */
export function resolveLevels(levels: Levels, devices: DeviceDto[]): Map<string, number | null> {
  const zoneLevel = new Map(levels.filter((l) => l.zoneId).map((l) => [l.zoneId!, l.level]));
  const deviceLevel = new Map(levels.filter((l) => l.deviceId).map((l) => [l.deviceId!, l.level]));
  return new Map(devices.filter((d) => isLuminaire(d.kind)).map((d) => [d.id, deviceLevel.get(d.id) ?? (d.zoneId ? (zoneLevel.get(d.zoneId) ?? null) : null)]));
}
