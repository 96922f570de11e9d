import { getSiteOverview } from "@/db/queries/sites";
import { siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";

export const dynamic = "force-dynamic";

/** Zones and devices; an occupant sees only the zones on their membership. */
export const GET = siteRoute("site.view", async ({ siteId, membership }) => {
  const zoneIds = membership.role === "occupant" ? membership.zoneIds : null;
  const overview = await getSiteOverview({ siteId, zoneIds });
  if (!overview) throw new AppError("not_found", "No such site.");
  return Response.json({ ...overview, role: membership.role });
});
