import { listVersions } from "@/db/queries/rule-sets";
import { siteRoute } from "@/lib/auth/route";
import type { VersionsDto } from "@/lib/validation/rules";

export const dynamic = "force-dynamic";

/** Every version of the site's rules, newest first, with who made it and each activation (rollbacks included). */
export const GET = siteRoute("rules.edit", async ({ siteId }) => {
  const answer: VersionsDto = { versions: await listVersions({ siteId }) };
  return Response.json(answer);
});
