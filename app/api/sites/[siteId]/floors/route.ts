import { removeUploadFile, saveUploadFile } from "@/db/files";
import { createFloor, listFloors } from "@/db/queries/floors";
import { planRecord, readPlanForm } from "@/lib/api/plan-upload";
import { siteRoute } from "@/lib/auth/route";
import { floorInputSchema } from "@/lib/validation/inventory";

export const dynamic = "force-dynamic";

export const GET = siteRoute("site.view", async ({ siteId }) => Response.json({ floors: await listFloors({ siteId }) }));

/** multipart/form-data: `name`, and optionally `plan` (PNG, JPEG or WebP). */
export const POST = siteRoute("devices.manage", async ({ request, siteId }) => {
  const form = await readPlanForm(request);
  const { name } = floorInputSchema.parse({ name: form.name ?? "" });
  // File first, row second: a failed insert removes the file, so no row ever points at nothing.
  if (form.plan) await saveUploadFile(form.plan.storedName, form.plan.bytes);
  try {
    const floor = await createFloor({ siteId, name, plan: form.plan ? planRecord(form.plan) : null });
    return Response.json({ floor }, { status: 201 });
  } catch (err) {
    await removeUploadFile(form.plan?.storedName ?? null);
    throw err;
  }
});
