import type { z } from "zod";
import { GraphReferenceError, saveDraftGraph, validateDraftGraph } from "@/db/queries/rule-sets";
import { fieldErrors } from "@/lib/api/respond";
import { readJson, siteRoute } from "@/lib/auth/route";
import { AppError } from "@/lib/errors";
import { draftPutSchema, graphSizeSchema, MAX_DRAFT_BYTES, MAX_GRAPH_EDGES, MAX_GRAPH_NODES, ruleGraphSchema, type SaveDraftDto } from "@/lib/validation/rules";

export const dynamic = "force-dynamic";

/**
 * Saves the draft with optimistic concurrency: 409 (with the stored revision)
 * when someone saved since `revision`. A graph that is malformed, too large or
 * points at devices/zones not on this site is refused and the draft stays as it was.
 */
export const PUT = siteRoute("rules.edit", async ({ request, siteId, user }) => {
  const body = await readJson(request, draftPutSchema, MAX_DRAFT_BYTES);
  const size = graphSizeSchema.safeParse(body.graph);
  if (!size.success) return malformed(size.error);
  if (size.data.nodes.length > MAX_GRAPH_NODES || size.data.edges.length > MAX_GRAPH_EDGES) {
    throw new AppError("too_large", `A Rule set can hold at most ${MAX_GRAPH_NODES} nodes and ${MAX_GRAPH_EDGES} connections; this one has ${size.data.nodes.length} and ${size.data.edges.length}.`);
  }
  const graph = ruleGraphSchema.safeParse(body.graph);
  if (!graph.success) return malformed(graph.error);
  let revision: number;
  try {
    revision = await saveDraftGraph({ siteId, graph: graph.data, expectedRevision: body.revision, userId: user.id });
  } catch (err) {
    if (err instanceof GraphReferenceError) return Response.json({ error: "invalid_input", message: err.message, fields: err.fields }, { status: 422 });
    throw err;
  }
  const answer: SaveDraftDto = { revision, problems: await validateDraftGraph({ siteId, graph: graph.data }) };
  return Response.json(answer);
});

/** 422 naming the first problem; field paths are relative to the body ("graph.nodes.2.params.lux") so the Canvas can place them. */
function malformed(error: z.ZodError) {
  const fields = fieldErrors(error);
  const prefixedFields = Object.fromEntries(Object.entries(fields).map(([k, v]) => [k === "_" ? "graph" : `graph.${k}`, v]));
  return Response.json({ error: "invalid_input", message: `The graph is not valid: ${error.issues[0]?.message ?? "unknown problem"}`, fields: prefixedFields }, { status: 422 });
}
