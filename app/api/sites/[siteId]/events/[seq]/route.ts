import { getEventTrace } from "@/db/queries/events";
import { siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { eventSeqParamsSchema } from "@/lib/validation/events";

export const dynamic = "force-dynamic";

/** One event and its Trace as the live engine recorded it (none for imported events). */
export const GET = siteRoute(
  "replay.use",
  async ({ siteId, params }) => {
    const found = await getEventTrace({ siteId, seq: params.seq });
    if (!found) throw new AppError("not_found", "No such event in this site's log.");
    return Response.json(found);
  },
  { params: eventSeqParamsSchema },
);
