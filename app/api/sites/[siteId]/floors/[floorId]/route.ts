import { removeUploadFile } from "@/db/files";
import { deleteFloor, updateFloor } from "@/db/queries/floors";
import { readJson, siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { scaleFromTwoPoints } from "@/lib/inventory/scale";
import { floorPatchSchema } from "@/lib/validation/floors";
import { floorParamsSchema } from "@/lib/validation/inventory";

const options = { params: floorParamsSchema };

/** Rename, or set the scale from two points on the plan (pixels) and the distance between them (metres). */
export const PATCH = siteRoute(
  "devices.manage",
  async ({ request, params }) => {
    const input = await readJson(request, floorPatchSchema);
    let pixelsPerMetre: number | undefined;
    if (input.scale) {
      const scale = scaleFromTwoPoints(input.scale.a, input.scale.b, input.scale.distanceM);
      if (!scale.ok) throw new AppError("bad_request", scale.message, { fields: { [`scale.${scale.field}`]: [scale.message] } });
      pixelsPerMetre = scale.pixelsPerMetre;
    }
    return Response.json({ floor: await updateFloor({ ...params, name: input.name, pixelsPerMetre }) });
  },
  options,
);

export const DELETE = siteRoute(
  "devices.manage",
  async ({ params }) => {
    await removeUploadFile(await deleteFloor(params));
    return Response.json({ ok: true });
  },
  options,
);
