import { readUploadFile, removeUploadFile, saveUploadFile } from "@/db/files";
import { getPlanUpload, replacePlan } from "@/db/queries/floors";
import { planRecord, readPlanForm } from "@/lib/api/plan-upload";
import { siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { floorParamsSchema } from "@/lib/validation/inventory";

const options = { params: floorParamsSchema };

/** The plan image, to members of the site only. */
export const GET = siteRoute(
  "site.view",
  async ({ params }) => {
    const upload = await getPlanUpload(params);
    if (!upload) throw new AppError("not_found", "This floor has no plan.");
    const bytes = await readUploadFile(upload.storedName);
    return new Response(new Uint8Array(bytes), {
      headers: {
        "content-type": upload.mimeType,
        "content-length": String(bytes.byteLength),
        "cache-control": "private, max-age=300",
        "x-content-type-options": "nosniff",
        "content-security-policy": "default-src 'none'",
      },
    });
  },
  options,
);

/** Replace the plan (multipart `plan`); the old file is removed and the scale must be set again. */
export const PUT = siteRoute(
  "devices.manage",
  async ({ request, params }) => {
    const { plan } = await readPlanForm(request);
    if (!plan) throw new AppError("bad_request", "Choose a plan image.", { fields: { plan: ["Choose a PNG, JPEG or WebP image"] } });
    await saveUploadFile(plan.storedName, plan.bytes);
    try {
      await removeUploadFile(await replacePlan({ ...params, plan: planRecord(plan) }));
    } catch (err) {
      await removeUploadFile(plan.storedName);
      throw err;
    }
    return Response.json({ ok: true });
  },
  options,
);
