import { pingDatabase } from "@/db/queries/sites";

export const dynamic = "force-dynamic";

/** Liveness and database round trip, for load balancers and the demo script. */
export async function GET() {
  try {
    const ms = await pingDatabase();
    return Response.json({ status: "ok", database: { ok: true, roundTripMs: Number(ms.toFixed(3)) } });
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    console.error("[health] database unreachable", reason);
    return Response.json({ status: "unavailable", database: { ok: false, reason: `database unreachable: ${reason}` } }, { status: 503 });
  }
}
