import { createScenario, listScenarios, sessionActions } from "@/db/queries/bench";
import { readJson, siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { scenarioCreateSchema } from "@/lib/validation/bench";

export const dynamic = "force-dynamic";

export const GET = siteRoute("bench.use", async ({ siteId }) => Response.json({ scenarios: await listScenarios({ siteId }) }));

/** Save a scenario: given steps, or `fromSession: true` for what this bench did since its last reset. */
export const POST = siteRoute("bench.use", async ({ request, siteId, user }) => {
  const body = await readJson(request, scenarioCreateSchema, 256 * 1024);
  const steps = "fromSession" in body ? await sessionActions({ siteId, userId: user.id }) : body.steps;
  if (!steps.length) throw new AppError("bad_request", "Nothing to save yet: operate some devices or move the clock first.");
  const scenario = await createScenario({ siteId, userId: user.id, name: body.name, steps });
  return Response.json({ scenario }, { status: 201 });
});
