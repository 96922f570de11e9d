import { getSite, updateSite } from "@/db/queries/sites";
import { readJson, siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { siteUpdateSchema } from "@/lib/validation/auth";

export const dynamic = "force-dynamic";

export const GET = siteRoute("site.view", async ({ siteId }) => {
  const site = await getSite({ siteId });
  if (!site) throw new AppError("not_found", "No such site.");
  return Response.json({ site });
});

/** Name, address, time zone and position (sun times and schedules use the last two). */
export const PATCH = siteRoute("site.edit", async ({ request, siteId }) => {
  const input = await readJson(request, siteUpdateSchema);
  return Response.json({ site: await updateSite({ siteId, ...input }) });
});
