import { listDevices } from "@/db/queries/devices";
import { listFloors } from "@/db/queries/floors";
import { getSite } from "@/db/queries/sites";
import { listZones } from "@/db/queries/zones";
import { siteRoute } from "@/lib/auth/route";
import { devicesToCsv } from "@/lib/inventory/device-csv";

export const dynamic = "force-dynamic";

/** The same columns the import reads, so an export imports back unchanged. */
export const GET = siteRoute("inventory.view", async ({ siteId }) => {
  const [site, zones, floors, devices] = await Promise.all([getSite({ siteId }), listZones({ siteId }), listFloors({ siteId }), listDevices({ siteId })]);
  const csv = devicesToCsv(devices, zones, floors);
  const filename = `${(site?.name ?? siteId).replace(/[^A-Za-z0-9-]+/g, "-").toLowerCase()}-devices.csv`;
  return new Response(csv, { headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"`, "cache-control": "no-store" } });
});
