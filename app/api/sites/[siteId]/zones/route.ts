import { createZone, listZones } from "@/db/queries/zones";
import { readJson, siteRoute } from "@/lib/auth/route";
import { zoneInputSchema } from "@/lib/validation/inventory";

export const dynamic = "force-dynamic";

export const GET = siteRoute("inventory.view", async ({ siteId }) => Response.json({ zones: await listZones({ siteId }) }));

/** A new zone gets the next free group address unless one is given. */
export const POST = siteRoute("devices.manage", async ({ request, siteId }) => {
  const input = await readJson(request, zoneInputSchema);
  return Response.json({ zone: await createZone({ siteId, ...input }) }, { status: 201 });
});
