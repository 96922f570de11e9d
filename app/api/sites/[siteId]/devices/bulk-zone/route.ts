import { assignZone } from "@/db/queries/devices";
import { readJson, siteRoute } from "@/lib/auth/route";
import { bulkZoneSchema } from "@/lib/validation/inventory";

/** Move several devices into one zone (or none), all or nothing. */
export const POST = siteRoute("devices.manage", async ({ request, siteId }) => {
  const { deviceIds, zoneId } = await readJson(request, bulkZoneSchema);
  return Response.json({ updated: await assignZone({ siteId, deviceIds, zoneId }) });
});
