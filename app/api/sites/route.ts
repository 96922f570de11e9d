import { listSitesForUser } from "@/db/queries/members";
import { createSite } from "@/db/queries/sites";
import { readJson, userRoute } from "@/lib/auth/route";
import { createSiteSchema } from "@/lib/validation/auth";

export const dynamic = "force-dynamic";

/** The caller's sites, with their role on each. */
export const GET = userRoute(async ({ user }) => Response.json({ sites: await listSitesForUser({ userId: user.id }) }));

/** Creating a site makes the caller its integrator. */
export const POST = userRoute(async ({ request, user }) => {
  const input = await readJson(request, createSiteSchema);
  const site = await createSite({ userId: user.id, ...input });
  return Response.json({ site: { id: site.id, name: site.name } }, { status: 201 });
});
