import { getBenchView, listBenchDevices } from "@/db/queries/bench";
import type { Membership } from "@/db/schema";
import type { AuthUser } from "@/lib/auth/session";
import { can } from "@/lib/auth/permissions";
import { checkAction } from "@/lib/bench/actions";
import { AppError } from "@/lib/errors";
import type { BenchAction, BenchSource } from "@/lib/validation/bench";
import { z } from "zod";

/** Every bench change answers with the whole bench, so the page redraws from one response. */
export async function benchView({ siteId, user, membership, source }: { siteId: string; user: AuthUser; membership: Membership; source?: BenchSource }): Promise<Response> {
  const view = await getBenchView({ siteId, userId: user.id, person: user.name, source, canClearEmergency: can(membership.role, "emergency.clear") });
  return Response.json(view);
}

/** A device action checked against the site's devices now: a missing device or button is a 422 on that field. */
export async function checkAgainstSite({ siteId, membership, action, path }: { siteId: string; membership: Membership; action: BenchAction; path: (string | number)[] }): Promise<void> {
  if (action.type === "clear-emergency" && !can(membership.role, "emergency.clear")) throw new AppError("forbidden", "Your role on this site does not clear the emergency latch.");
  const problem = checkAction(action, await listBenchDevices({ siteId }));
  if (problem) throw new z.ZodError([{ code: "custom", path: [...path, problem.field], message: problem.message, input: action }]);
}
