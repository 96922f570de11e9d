import { runBenchAction } from "@/db/queries/bench";
import { readJson, siteRoute } from "@/lib/auth/route";
import { benchDateSchema } from "@/lib/validation/bench";
import { benchView } from "../respond";

/**
 * Start the sandbox afresh on a chosen local date and time (the engine's clock
 * never runs backwards): the day runs from midnight, so its schedules fire first.
 */
export const POST = siteRoute("bench.use", async ({ request, siteId, user, membership }) => {
  const { date, time } = await readJson(request, benchDateSchema);
  await runBenchAction({ siteId, userId: user.id, person: user.name, deliverNotices: false, action: { type: "set-date", date, time } });
  return benchView({ siteId, user, membership });
});
