import { setBenchSource } from "@/db/queries/bench";
import { readJson, siteRoute } from "@/lib/auth/route";
import { benchPatchSchema, benchQuerySchema } from "@/lib/validation/bench";
import { benchView } from "./respond";

export const dynamic = "force-dynamic";

/** The caller's bench: sandbox state, devices, plan and the latest steps. `?source=draft|active` picks the rules the first time. */
export const GET = siteRoute("bench.use", async ({ request, siteId, user, membership }) => {
  const { source } = benchQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  return benchView({ siteId, user, membership, source });
});

/** Switch between the active rule set and the draft, keeping the sandbox's state. */
export const PATCH = siteRoute("bench.use", async ({ request, siteId, user, membership }) => {
  const { source } = await readJson(request, benchPatchSchema);
  await setBenchSource({ siteId, userId: user.id, person: user.name, source });
  return benchView({ siteId, user, membership });
});
