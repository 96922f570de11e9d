import { importDevices, listDevices } from "@/db/queries/devices";
import { listFloors } from "@/db/queries/floors";
import { listZones } from "@/db/queries/zones";
import { readJson, siteRoute } from "@/lib/auth/route";
import { planDeviceImport } from "@/lib/inventory/import-plan";
import { csvImportSchema } from "@/lib/validation/inventory";

/**
 * Device CSV import. `preview` writes nothing and answers the rows (with their
 * addresses) or every error with its line and field; `commit` parses again and
 * writes all rows in one transaction, or none.
 */
export const POST = siteRoute("devices.manage", async ({ request, siteId }) => {
  const { csv, mode } = await readJson(request, csvImportSchema, 1024 * 1024 + 4096);
  const [zones, floors, existing] = await Promise.all([listZones({ siteId }), listFloors({ siteId }), listDevices({ siteId })]);
  const plan = planDeviceImport(csv, { zones, floors, existing });
  if (plan.errors.length) {
    return Response.json({ error: "invalid_csv", message: `The file has ${plan.errors.length} problem${plan.errors.length === 1 ? "" : "s"}; nothing was imported.`, errors: plan.errors }, { status: 422 });
  }
  if (mode === "preview") return Response.json({ devices: plan.devices });
  const imported = await importDevices({ siteId, rows: plan.devices.map(({ line: _line, ...fields }) => fields) });
  return Response.json({ imported }, { status: 201 });
});
