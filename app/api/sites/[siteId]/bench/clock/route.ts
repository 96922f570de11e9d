import { runBenchAction } from "@/db/queries/bench";
import { readJson, siteRoute } from "@/lib/auth/route";
import { benchActionSchema, benchClockSchema } from "@/lib/validation/bench";
import { benchView } from "../respond";

/** Skip the bench clock ahead by `minutes`, or to the next `time` (HH:MM, site time); timers due on the way fire in order. */
export const POST = siteRoute("bench.use", async ({ request, siteId, user, membership }) => {
  const body = await readJson(request, benchClockSchema);
  const action = benchActionSchema.parse("minutes" in body ? { type: "skip", minutes: body.minutes } : { type: "skip-to", time: body.time });
  await runBenchAction({ siteId, userId: user.id, person: user.name, deliverNotices: body.deliverNotices, action });
  return benchView({ siteId, user, membership });
});
