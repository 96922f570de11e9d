import { deleteScene, updateScene } from "@/db/queries/scenes";
import { readJson, siteRoute } from "@/lib/auth/route";
import { sceneInputSchema, sceneParamsSchema } from "@/lib/validation/inventory";

const options = { params: sceneParamsSchema };

export const PUT = siteRoute(
  "scenes.edit",
  async ({ request, params }) => {
    const fields = await readJson(request, sceneInputSchema);
    return Response.json({ scene: await updateScene({ ...params, fields }) });
  },
  options,
);

export const DELETE = siteRoute(
  "scenes.edit",
  async ({ params }) => {
    await deleteScene(params);
    return Response.json({ ok: true });
  },
  options,
);
