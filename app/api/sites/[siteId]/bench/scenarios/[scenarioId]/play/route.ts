import { getBenchView, playScenario } from "@/db/queries/bench";
import { readJson, siteRoute } from "@/lib/auth/route";
import { can } from "@/lib/auth/permissions";
import { scenarioParamsSchema, scenarioPlaySchema } from "@/lib/validation/bench";

/** Plays a saved scenario on the caller's bench with its current rules; a step naming a deleted device stops it, and the answer says which. */
export const POST = siteRoute(
  "bench.use",
  async ({ request, siteId, user, membership, params }) => {
    const { deliverNotices } = await readJson(request, scenarioPlaySchema);
    const result = await playScenario({ siteId, userId: user.id, person: user.name, deliverNotices, scenarioId: params.scenarioId });
    const view = await getBenchView({ siteId, userId: user.id, person: user.name, canClearEmergency: can(membership.role, "emergency.clear") });
    return Response.json({ ...result, view });
  },
  { params: scenarioParamsSchema },
);
