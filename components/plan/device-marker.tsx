import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import type { DeviceDto } from "@/lib/validation/devices";

/** Marker shapes tell device roles apart without colour: control ▲, sensor ●, output ■, safety ◆. */
export function MarkerShape({ device, level }: { device: DeviceDto; level?: number | null }) {
  const role = DEVICE_KIND_INFO[device.kind].role;
  const glow = level === undefined || level === null ? undefined : `rgba(217,154,30,${0.15 + (0.85 * level) / 100})`;
  const common = { stroke: "#1d2833", strokeWidth: 2, fill: glow ?? (role === "safety" ? "#b8553a" : DEVICE_KIND_INFO[device.kind].power === "mains" ? "#ffffff" : "#d99a1e") };
  return (
    <svg viewBox="-10 -10 20 20" className="h-5 w-5 overflow-visible" aria-hidden="true">
      {level ? <circle r={6 + level / 10} fill="rgba(217,154,30,0.35)" /> : null}
      {role === "control" ? <polygon points="0,-8 8,7 -8,7" {...common} /> : null}
      {role === "sensor" ? <circle r="7" {...common} /> : null}
      {role === "output" ? <rect x="-7" y="-7" width="14" height="14" {...common} /> : null}
      {role === "safety" ? <polygon points="0,-9 9,0 0,9 -9,0" {...common} /> : null}
    </svg>
  );
}
