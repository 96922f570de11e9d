import { listSites } from "@/db/queries/sites";
import { errorResponse } from "@/lib/api/respond";

export const dynamic = "force-dynamic";

export async function GET() {
  try {
    return Response.json({ sites: await listSites() });
  } catch (err) {
    return errorResponse(err);
  }
}
