import { z } from "zod";
import { listCommandsAfter } from "@/db/queries/live";
import { gatewayRoute } from "@/lib/auth/gateway-route";

export const dynamic = "force-dynamic";

const querySchema = z.object({
  after: z.coerce.number().int("after is the last command number you have").min(0).default(0),
  limit: z.coerce.number().int().min(1).max(500).default(500),
});

/** For gateways that poll: commands numbered after `after`, oldest first. */
export const GET = gatewayRoute(async ({ request, siteId }) => {
  const url = new URL(request.url);
  const { after, limit } = querySchema.parse({ after: url.searchParams.get("after") ?? undefined, limit: url.searchParams.get("limit") ?? undefined });
  const rows = await listCommandsAfter({ siteId, after, limit });
  return Response.json({ commands: rows.map((r) => ({ seq: r.seq, ...(r.command as object) })), last: rows.at(-1)?.seq ?? after });
});
