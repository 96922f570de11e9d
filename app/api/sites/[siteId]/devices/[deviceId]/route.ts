import { deleteDevice, getDevice, updateDevice } from "@/db/queries/devices";
import { readJson, siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { deviceParamsSchema, devicePatchSchema } from "@/lib/validation/inventory";

const options = { params: deviceParamsSchema };

export const GET = siteRoute(
  "inventory.view",
  async ({ params }) => {
    const device = await getDevice(params);
    if (!device) throw new AppError("not_found", "No such device on this site.");
    return Response.json({ device });
  },
  options,
);

export const PATCH = siteRoute(
  "devices.manage",
  async ({ request, params }) => {
    const patch = await readJson(request, devicePatchSchema);
    return Response.json({ device: await updateDevice({ ...params, patch }) });
  },
  options,
);

export const DELETE = siteRoute(
  "devices.manage",
  async ({ params }) => {
    await deleteDevice(params);
    return Response.json({ ok: true });
  },
  options,
);
