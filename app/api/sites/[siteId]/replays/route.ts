import { createReplayJob, listReplayJobs } from "@/db/queries/replays";
import { readJson, siteRoute } from "@/lib/auth/route";
import { replayRequestSchema } from "@/lib/validation/events";

export const dynamic = "force-dynamic";

export const GET = siteRoute("replay.use", async ({ siteId }) => Response.json({ jobs: await listReplayJobs({ siteId }) }));

/** Queues a Replay (one rule set) or a Compare (two) of a window of the log; the replay worker runs it. */
export const POST = siteRoute("replay.use", async ({ request, siteId, user }) => {
  const body = await readJson(request, replayRequestSchema, 16 * 1024);
  const job = await createReplayJob({ siteId, userId: user.id, request: body });
  return Response.json({ job: { id: job.id, status: job.status, total: job.total } }, { status: 201 });
});
