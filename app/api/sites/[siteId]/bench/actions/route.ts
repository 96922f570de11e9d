import { runBenchAction } from "@/db/queries/bench";
import { readJson, siteRoute } from "@/lib/auth/route";
import { benchRunSchema } from "@/lib/validation/bench";
import { benchView, checkAgainstSite } from "../respond";

/** Operate a device by hand (or move the clock); runs on the sandbox only, never on the live site. */
export const POST = siteRoute("bench.use", async ({ request, siteId, user, membership }) => {
  const { action, deliverNotices } = await readJson(request, benchRunSchema);
  await checkAgainstSite({ siteId, membership, action, path: ["action"] });
  await runBenchAction({ siteId, userId: user.id, person: user.name, deliverNotices, action });
  return benchView({ siteId, user, membership });
});
