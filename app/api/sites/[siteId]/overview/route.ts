import { getSiteOverview } from "@/db/queries/sites";
import { errorResponse } from "@/lib/api/respond";
import { AppError } from "@/lib/errors";
import { siteParamsSchema } from "@/lib/validation/site";

export const dynamic = "force-dynamic";

type Context = { params: Promise<{ siteId: string }> };

export async function GET(_request: Request, context: Context) {
  try {
    const { siteId } = siteParamsSchema.parse(await context.params);
    const overview = await getSiteOverview({ siteId });
    if (!overview) throw new AppError("not_found", "No such site.");
    return Response.json(overview);
  } catch (err) {
    return errorResponse(err);
  }
}
