import { lastEventSeq, listEvents, tailEvents } from "@/db/queries/events";
import { siteRoute } from "@/lib/auth/route";
import { eventFilterSchema, eventListQuerySchema } from "@/lib/validation/events";

export const dynamic = "force-dynamic";

/**
 * The Event log, filtered, newest first, one keyset page at a time
 * (`before=at:seq` from the previous page's `nextCursor`). With `afterSeq`, the
 * live tail: events stored since that sequence number.
 */
export const GET = siteRoute("replay.use", async ({ request, siteId }) => {
  const query = Object.fromEntries(new URL(request.url).searchParams);
  const filter = eventFilterSchema.parse(query);
  const { before, afterSeq, limit } = eventListQuerySchema.parse(query);
  if (afterSeq !== undefined) {
    const events = await tailEvents({ siteId, filter, afterSeq, limit });
    return Response.json({ events, lastSeq: events.length ? events[events.length - 1].seq : afterSeq });
  }
  const [events, lastSeq] = await Promise.all([listEvents({ siteId, filter, before, limit }), before ? Promise.resolve(null) : lastEventSeq({ siteId })]);
  const last = events[events.length - 1];
  return Response.json({ events, nextCursor: events.length === limit && last ? `${last.at}:${last.seq}` : null, lastSeq });
});
