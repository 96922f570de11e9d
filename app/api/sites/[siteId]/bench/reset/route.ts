import { resetBench } from "@/db/queries/bench";
import { readJson, siteRoute } from "@/lib/auth/route";
import { benchResetSchema } from "@/lib/validation/bench";
import { benchView } from "../respond";

/** Back to a copy of the live state (or a fresh state when the site has none), optionally on the other rules. */
export const POST = siteRoute("bench.use", async ({ request, siteId, user, membership }) => {
  const { source } = await readJson(request, benchResetSchema);
  await resetBench({ siteId, userId: user.id, person: user.name, source });
  return benchView({ siteId, user, membership });
});
