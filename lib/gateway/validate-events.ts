import { READING_RANGES } from "@/lib/catalogue/sensor-ranges";
import { z } from "zod";
import { DEVICE_KIND_INFO, type DeviceKind } from "@/lib/catalogue/device-kinds";
import type { DeviceEvent } from "@/lib/bus/types";

/** Largest batch a gateway may post at once. */
export const MAX_BATCH = 500;
/** A gateway clock may run a little ahead; further than this is refused. */
export const MAX_FUTURE_MS = 5 * 60 * 1000;

/** One event as a gateway posts it: `device` is our device id or the device's unicast address ("0x0013"). */
export const gatewayEventSchema = z
  .object({
    id: z.string().min(1, "Every event needs an id, so sending it twice is harmless").max(200),
    at: z.union([z.number().int().nonnegative(), z.iso.datetime({ offset: true })], "Give the time as milliseconds since 1970 or an ISO 8601 date-time"),
    device: z.string().min(1, "Name the device that reported").max(100),
    kind: z.string().min(1, "Say what the device reported").max(40),
    value: z.union([z.number().finite(), z.boolean(), z.string().max(40), z.null()]).default(null),
  })
  .strict();

export const gatewayBatchSchema = z
  .object({ events: z.array(z.unknown()).min(1, "Send at least one event").max(MAX_BATCH, `At most ${MAX_BATCH} events in one batch`) })
  .strict();

export type SiteDevice = { id: string; name: string; kind: DeviceKind; unicastAddress: number; elementCount: number; profile?: Record<string, unknown> };
export type ItemError = { index: number; id?: string; field: string; message: string };


function checkValue(kind: string, value: unknown, device: SiteDevice): string | null {
  if (kind in READING_RANGES) {
    const { min, max, unit } = READING_RANGES[kind as keyof typeof READING_RANGES];
    if (typeof value !== "number") return `a ${kind} reading is a number in ${unit}`;
    if (value < min || value > max) return `${value} ${unit} is outside what a sensor reports (${min}–${max} ${unit})`;
  }
  if (kind === "press" || kind === "release" || kind === "long-press") {
    const buttons = device.kind === "kinetic-rocker" ? Number(device.profile?.buttons ?? 4) : 1;
    if (value !== null && (typeof value !== "number" || !Number.isInteger(value) || value < 1 || value > buttons)) return `the button is a whole number from 1 to ${buttons}`;
  }
  if (kind === "motion" && typeof value !== "boolean") return "a motion report is true or false";
  if (kind === "contact" && value !== "open" && value !== "closed") return 'a contact reports "open" or "closed"';
  if (kind === "fire-alarm" && value !== "active" && value !== "cleared" && typeof value !== "boolean") return 'a fire-alarm input reports "active" or "cleared"';
  return null;
}

function findDevice(ref: string, devices: SiteDevice[]): SiteDevice | undefined {
  const byId = devices.find((d) => d.id === ref);
  if (byId) return byId;
  if (/^0x[0-9a-f]{1,4}$/i.test(ref)) {
    const address = Number.parseInt(ref.slice(2), 16);
    return devices.find((d) => address >= d.unicastAddress && address < d.unicastAddress + d.elementCount);
  }
  return undefined;
}

/**
 * Checks each item of a batch against the site's devices. Valid items come back
 * as engine events (device ids resolved, times in ms); each bad item gets its
 * own message with the field, and nothing of it is kept.
 */
export function validateGatewayEvents(items: unknown[], ctx: { siteId: string; devices: SiteDevice[]; now: number }): { events: DeviceEvent[]; errors: ItemError[] } {
  const events: DeviceEvent[] = [];
  const errors: ItemError[] = [];
  const seen = new Set<string>();
  items.forEach((raw, index) => {
    const parsed = gatewayEventSchema.safeParse(raw);
    if (!parsed.success) {
      const issue = parsed.error.issues[0];
      const id = typeof raw === "object" && raw && "id" in raw && typeof raw.id === "string" ? raw.id : undefined;
      errors.push({ index, id, field: issue.path.join(".") || "event", message: issue.message });
      return;
    }
    const e = parsed.data;
    const at = typeof e.at === "number" ? e.at : Date.parse(e.at);
    const fail = (field: string, message: string) => errors.push({ index, id: e.id, field, message });
    if (seen.has(e.id)) return fail("id", "the same id appears twice in this batch");
    seen.add(e.id);
    if (at > ctx.now + MAX_FUTURE_MS) return fail("at", `${new Date(at).toISOString()} is more than 5 minutes ahead of the server's clock; check the gateway's clock`);
    const device = findDevice(e.device, ctx.devices);
    if (!device) return fail("device", `no device "${e.device}" on this site (use its id or unicast address)`);
    const info = DEVICE_KIND_INFO[device.kind];
    if (!info.reports.includes(e.kind)) {
      return fail("kind", info.reports.length ? `${device.name} (${info.label}) reports ${info.reports.join(", ")}, not "${e.kind}"` : `${device.name} (${info.label}) reports nothing`);
    }
    const problem = checkValue(e.kind, e.value, device);
    if (problem) return fail("value", problem);
    events.push({ id: e.id, siteId: ctx.siteId, at, device: device.id, kind: e.kind, value: e.value });
  });
  return { events, errors };
}
