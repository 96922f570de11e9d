import { randomUUID } from "node:crypto";
import { getLiveState, ingestEvents } from "@/db/queries/live";
import { siteRoute } from "@/lib/auth/route";
import { CONSOLE_DEVICE } from "@/lib/bus/derive";
import { AppError } from "@/lib/errors";

/**
 * A manager or integrator clears a latched emergency, once the fire-alarm system
 * has been reset and the building is safe. It goes through the engine like any
 * event, so the Event log and Trace record who cleared it and what changed.
 */
export const POST = siteRoute("emergency.clear", async ({ siteId, user }) => {
  const state = await getLiveState({ siteId });
  if (!state?.emergency.active) throw new AppError("conflict", "No emergency is latched on this site.");
  const id = `console-clear-${randomUUID()}`;
  const result = await ingestEvents({ siteId, batch: [{ id, siteId, at: Math.max(Date.now(), state.now ?? 0), device: CONSOLE_DEVICE, kind: "clear-emergency", value: user.name }], source: "console" });
  return Response.json({ ok: true, commands: result.commands.length });
});
