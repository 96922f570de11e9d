import { getRulesView } from "@/db/queries/rule-sets";
import { siteRoute } from "@/lib/auth/route";
import type { RulesDto } from "@/lib/validation/rules";

export const dynamic = "force-dynamic";

/** The Canvas: the site's draft graph with its revision, the active version and the draft's problems. */
export const GET = siteRoute("rules.edit", async ({ siteId }) => {
  const view: RulesDto = await getRulesView({ siteId });
  return Response.json(view);
});
