import { getSiteEnergy } from "@/db/queries/energy";
import { siteRoute } from "@/lib/auth/route";
import { summarise } from "@/lib/energy/summary";
import { parseEnergyQuery } from "@/lib/validation/energy";

export const dynamic = "force-dynamic";

/** The Energy budget of every battery-free device: `?source=active|draft`, `?week=shortest|longest`. */
export const GET = siteRoute("energy.view", async ({ siteId, request }) => {
  const query = parseEnergyQuery(request.url);
  const budget = await getSiteEnergy({ siteId, ...query });
  return Response.json({
    source: budget.source,
    week: budget.week,
    weekLabel: budget.weekLabel,
    notes: budget.notes,
    devices: budget.devices.map(summarise),
  });
});
