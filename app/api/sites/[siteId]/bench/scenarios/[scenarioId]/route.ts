import { deleteScenario, getScenario, updateScenario } from "@/db/queries/bench";
import { readJson, siteRoute } from "@/lib/auth/route";
import { scenarioInputSchema, scenarioParamsSchema } from "@/lib/validation/bench";

export const dynamic = "force-dynamic";

export const GET = siteRoute("bench.use", async ({ siteId, params }) => Response.json({ scenario: await getScenario({ siteId, scenarioId: params.scenarioId }) }), { params: scenarioParamsSchema });

export const PUT = siteRoute(
  "bench.use",
  async ({ request, siteId, params }) => {
    const { name, steps } = await readJson(request, scenarioInputSchema, 256 * 1024);
    return Response.json({ scenario: await updateScenario({ siteId, scenarioId: params.scenarioId, name, steps }) });
  },
  { params: scenarioParamsSchema },
);

export const DELETE = siteRoute(
  "bench.use",
  async ({ siteId, params }) => {
    await deleteScenario({ siteId, scenarioId: params.scenarioId });
    return Response.json({ ok: true });
  },
  { params: scenarioParamsSchema },
);
