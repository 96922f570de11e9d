import { getDeviceEnergy } from "@/db/queries/energy";
import { siteRoute } from "@/lib/auth/route";
import { deviceEnergyParamsSchema, parseEnergyQuery } from "@/lib/validation/energy";

export const dynamic = "force-dynamic";

/** One device's budget with its inputs, so the browser can rerun the model for what-ifs. */
export const GET = siteRoute(
  "energy.view",
  async ({ siteId, params, request }) => {
    const query = parseEnergyQuery(request.url);
    return Response.json(await getDeviceEnergy({ siteId, deviceId: params.deviceId, ...query }));
  },
  { params: deviceEnergyParamsSchema },
);
