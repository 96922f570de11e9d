import { createDevice, listDevices } from "@/db/queries/devices";
import { readJson, siteRoute } from "@/lib/auth/route";
import { deviceInputSchema } from "@/lib/validation/inventory";

export const dynamic = "force-dynamic";

export const GET = siteRoute("inventory.view", async ({ siteId }) => Response.json({ devices: await listDevices({ siteId }) }));

/** Add a device; an empty unicast address gets the next free range. */
export const POST = siteRoute("devices.manage", async ({ request, siteId }) => {
  const fields = await readJson(request, deviceInputSchema);
  const device = await createDevice({ siteId, fields });
  return Response.json({ device }, { status: 201 });
});
