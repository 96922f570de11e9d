import { cancelReplayJob } from "@/db/queries/replays";
import { siteRoute } from "@/lib/auth/route";
import { replayParamsSchema } from "@/lib/validation/events";

export const dynamic = "force-dynamic";

/** Asks the worker to stop the replay after the page in hand; a queued one is cancelled at once. */
export const POST = siteRoute("replay.use", async ({ siteId, params }) => Response.json({ job: await cancelReplayJob({ siteId, jobId: params.jobId }) }), { params: replayParamsSchema });
