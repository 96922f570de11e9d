import { getGraphSide, getSiteNames } from "@/db/queries/rule-sets";
import { siteRoute } from "@/lib/auth/route";
import { diffGraphs, diffSentences } from "@/lib/rules/diff";
import { ruleGraphSchema } from "@/lib/rules/graph";
import { diffQuerySchema, type DiffDto } from "@/lib/validation/rules";

export const dynamic = "force-dynamic";

const EMPTY = { nodes: [], edges: [] };

/**
 * What changes between two Rule sets, rule by rule in plain sentences.
 * from = active | <versionId>; to = draft | <versionId>.
 */
export const GET = siteRoute("rules.edit", async ({ request, siteId }) => {
  const url = new URL(request.url);
  const query = diffQuerySchema.parse({ from: url.searchParams.get("from") ?? undefined, to: url.searchParams.get("to") ?? undefined });
  const [from, to, names] = await Promise.all([getGraphSide({ siteId, side: query.from }), getGraphSide({ siteId, side: query.to }), getSiteNames({ siteId })]);
  // A draft that does not parse has no paths to compare yet; its problems are shown elsewhere.
  const parse = (g: unknown) => ruleGraphSchema.safeParse(g).data ?? EMPTY;
  const diff = diffGraphs(parse(from.graph), parse(to.graph), names);
  const answer: DiffDto = { ...diff, from: { label: from.label }, to: { label: to.label }, sentences: diffSentences(diff) };
  return Response.json(answer);
});
