import { activateDraft, getRulesView } from "@/db/queries/rule-sets";
import { readJson, siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { activateSchema, type ActivateDto } from "@/lib/validation/rules";

export const dynamic = "force-dynamic";

/**
 * Activate the draft the caller reviewed (`revision`): it becomes the next
 * numbered version. 409 when the draft changed since; 422 with the problems when
 * validation finds errors.
 */
export const POST = siteRoute("rules.activate", async ({ request, siteId, user }) => {
  const { revision } = await readJson(request, activateSchema);
  const view = await getRulesView({ siteId });
  if (view.draft.revision !== revision) {
    throw new AppError("conflict", "The draft changed since you reviewed it; look at the changes again.", { revision: view.draft.revision, currentRevision: view.draft.revision });
  }
  const errors = view.problems.filter((p) => p.severity === "error");
  if (errors.length) {
    return Response.json(
      { error: "invalid_input", message: `The draft has ${errors.length} problem${errors.length === 1 ? "" : "s"} to fix before it can be activated.`, problems: view.problems },
      { status: 422 },
    );
  }
  const activated: ActivateDto = await activateDraft({ siteId, userId: user.id, expectedRevision: revision });
  return Response.json(activated);
});
