import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import { assignUnicastAddresses, parseDeviceCsv, type CsvContext, type CsvError } from "./device-csv";

export type ImportDevice = {
  line: number;
  name: string;
  kind: DeviceKind;
  zoneId: string | null;
  unicastAddress: number;
  elementCount: number;
  profile: Record<string, unknown>;
  floorId: string | null;
  x: number | null;
  y: number | null;
};

/**
 * What an import would write: every row parsed and given an address, or the
 * errors. Preview and commit both call this, so what the user saw is what goes in.
 */
export function planDeviceImport(csv: string, context: CsvContext): { devices: ImportDevice[]; errors: CsvError[] } {
  const parsed = parseDeviceCsv(csv, context);
  if (parsed.errors.length) return { devices: [], errors: parsed.errors };
  const names = new Set(context.existing.map((d) => d.name.toLowerCase()));
  const clashes: CsvError[] = parsed.rows.filter((r) => names.has(r.name.toLowerCase())).map((r) => ({ line: r.line, field: "name", message: `a device named "${r.name}" is already on this site` }));
  if (clashes.length) return { devices: [], errors: clashes };
  const assigned = assignUnicastAddresses(parsed.rows, context.existing);
  if (assigned.errors.length) return { devices: [], errors: assigned.errors };
  return {
    devices: assigned.rows.map((r) => ({
      line: r.line,
      name: r.name,
      kind: r.kind,
      zoneId: r.zoneId,
      unicastAddress: r.unicastAddress,
      elementCount: r.elementCount,
      profile: r.buttons ? { buttons: r.buttons } : {},
      floorId: r.floorId,
      x: r.x,
      y: r.y,
    })),
    errors: [],
  };
}
