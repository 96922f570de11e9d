import { getShortDevices, newlyShortOf, type ShortDevice } from "@/db/queries/energy";
import { siteRoute } from "@/lib/auth/route";
import { energyShortQuerySchema, type ShortDeviceDto, type ShortDevicesDto } from "@/lib/validation/energy";

export const dynamic = "force-dynamic";

// JSON has no infinity: a device with nothing to spend has no margin to show.
const dto = (d: ShortDevice): ShortDeviceDto => ({ ...d, margin: Number.isFinite(d.margin) ? d.margin : null });

/**
 * Devices that run short of energy under `?source=active|draft`, and those the draft
 * would newly make Short (what Activate warns about). The Canvas and the Test bench mark
 * their triggers; nothing here blocks anything.
 */
export const GET = siteRoute("energy.view", async ({ siteId, request }) => {
  const { source } = energyShortQuerySchema.parse(Object.fromEntries(new URL(request.url).searchParams));
  // Both budgets once: the list asked for is one of them, and newlyShort needs both.
  const [active, draft] = await Promise.all([getShortDevices({ siteId, source: "active" }), getShortDevices({ siteId, source: "draft" })]);
  const body: ShortDevicesDto = { source, short: (source === "draft" ? draft : active).map(dto), newlyShort: newlyShortOf(active, draft).map(dto) };
  return Response.json(body);
});
