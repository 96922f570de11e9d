import { listDevices } from "@/db/queries/devices";
import { createScene, listScenes, scenesForOccupant } from "@/db/queries/scenes";
import { readJson, siteRoute } from "@/lib/auth/route";
import { sceneInputSchema } from "@/lib/validation/inventory";

export const dynamic = "force-dynamic";

/** Managers see every scene; occupants only those marked for them in their zones. */
export const GET = siteRoute("site.view", async ({ siteId, membership }) => {
  const all = await listScenes({ siteId });
  if (membership.role !== "occupant") return Response.json({ scenes: all });
  const deviceZone = new Map((await listDevices({ siteId })).map((d) => [d.id, d.zoneId]));
  return Response.json({ scenes: scenesForOccupant(all, membership.zoneIds, deviceZone) });
});

export const POST = siteRoute("scenes.edit", async ({ request, siteId }) => {
  const fields = await readJson(request, sceneInputSchema);
  return Response.json({ scene: await createScene({ siteId, fields }) }, { status: 201 });
});
