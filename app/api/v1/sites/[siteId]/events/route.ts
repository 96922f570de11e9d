import { listDevices } from "@/db/queries/devices";
import { ingestEvents } from "@/db/queries/live";
import { gatewayRoute } from "@/lib/auth/gateway-route";
import { readJson } from "@/lib/auth/route";
import { gatewayBatchSchema, validateGatewayEvents } from "@/lib/gateway/validate-events";

export const dynamic = "force-dynamic";

/**
 * A gateway posts up to 500 events. Valid ones are stored and run through the
 * active rules (ids already seen are ignored); each bad one is listed with its
 * field and nothing of it is kept. The answer carries the commands to send.
 */
export const POST = gatewayRoute(async ({ request, siteId }) => {
  const { events: items } = await readJson(request, gatewayBatchSchema, 2 * 1024 * 1024);
  const devices = await listDevices({ siteId });
  const { events, errors } = validateGatewayEvents(items, { siteId, devices, now: Date.now() });
  const result = events.length ? await ingestEvents({ siteId, batch: events, source: "gateway" }) : { accepted: [], duplicates: [], commands: [] };
  const status = events.length === 0 && errors.length > 0 ? 422 : 200;
  return Response.json(
    {
      ...(status === 422 ? { error: "invalid_events", message: "No event in the batch was valid; nothing was stored." } : {}),
      accepted: result.accepted.length,
      duplicates: result.duplicates,
      rejected: errors,
      commands: result.commands.map(({ seq, at, destination, addressing, message, bytes, tid, ttl, transition }) => ({ seq, at, destination, addressing, message, bytes, tid, ttl, transition })),
    },
    { status },
  );
});
