import { getReplayJob } from "@/db/queries/replays";
import { siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { replayParamsSchema } from "@/lib/validation/events";

export const dynamic = "force-dynamic";

/** A replay's progress, and its result once done. */
export const GET = siteRoute(
  "replay.use",
  async ({ siteId, params }) => {
    const job = await getReplayJob({ siteId, jobId: params.jobId });
    if (!job) throw new AppError("not_found", "No such replay.");
    return Response.json({ job });
  },
  { params: replayParamsSchema },
);
