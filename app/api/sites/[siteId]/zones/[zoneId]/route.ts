import { deleteZone, updateZone } from "@/db/queries/zones";
import { readJson, siteRoute } from "@/lib/auth/route";
import { zoneInputSchema, zoneParamsSchema } from "@/lib/validation/inventory";

const options = { params: zoneParamsSchema };

export const PATCH = siteRoute(
  "devices.manage",
  async ({ request, params }) => {
    const input = await readJson(request, zoneInputSchema.partial());
    return Response.json({ zone: await updateZone({ ...params, ...input }) });
  },
  options,
);

export const DELETE = siteRoute(
  "devices.manage",
  async ({ params }) => {
    await deleteZone(params);
    return Response.json({ ok: true });
  },
  options,
);
