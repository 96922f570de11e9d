import { z } from "zod";
import { ruleGraphSchema, type RuleGraph } from "@/lib/rules/graph";
import type { RuleDiff } from "@/lib/rules/diff";
import type { Problem } from "@/lib/rules/validate";
import { idSchema } from "./site";

/**
 * The Rule set API (/api/sites/{id}/rules/…): request schemas, limits and the
 * shapes of the answers, shared by the route handlers and the Canvas.
 */

/** A 500-node site must stay usable; past these sizes a graph is refused (413) rather than slowing every save. */
export const MAX_GRAPH_NODES = 2000;
export const MAX_GRAPH_EDGES = 6000;
/** Bytes of a draft request body; a 2000-node graph of typical nodes fits well inside. */
export const MAX_DRAFT_BYTES = 1024 * 1024;

const revision = z.number({ error: "Send the draft revision you started from." }).int("The revision is a whole number.").min(0, "The revision is a whole number.");

/** The graph is checked in two steps so a graph that is too large gets 413, not a page of field messages. */
export const draftPutSchema = z.object({ graph: z.unknown(), revision }).strict();
export const activateSchema = z.object({ revision }).strict();

export const graphSizeSchema = z.object({
  nodes: z.array(z.unknown(), { error: "The graph needs a list of nodes." }),
  edges: z.array(z.unknown(), { error: "The graph needs a list of connections." }),
});

export { ruleGraphSchema };

export const versionParamsSchema = z.object({ siteId: idSchema, versionId: z.string().min(1).max(100) }).strict();

const side = (fixed: string) => z.union([z.literal(fixed), z.string().min(1).max(100)]);
export const diffQuerySchema = z.object({ from: side("active").default("active"), to: side("draft").default("draft") });

/** Every device and zone a graph points at, with the node that points at it. */
export function graphReferences(graph: RuleGraph): { devices: { nodeId: string; id: string }[]; zones: { nodeId: string; id: string }[] } {
  const devices: { nodeId: string; id: string }[] = [];
  const zones: { nodeId: string; id: string }[] = [];
  for (const n of graph.nodes) {
    const p = n.params as Record<string, unknown>;
    if (typeof p.device === "string") devices.push({ nodeId: n.id, id: p.device });
    if (typeof p.zone === "string") zones.push({ nodeId: n.id, id: p.zone });
    const target = p.target as Record<string, unknown> | undefined;
    if (target && typeof target.device === "string") devices.push({ nodeId: n.id, id: target.device });
    if (target && typeof target.zone === "string") zones.push({ nodeId: n.id, id: target.zone });
  }
  return { devices, zones };
}

export type DraftDto = { graph: RuleGraph; revision: number; updatedAt: string | null; updatedBy: string | null };
export type RulesDto = { draft: DraftDto; active: { versionId: string; number: number } | null; problems: Problem[] };
export type SaveDraftDto = { revision: number; problems: Problem[] };
export type ConflictDto = { error: "conflict"; message: string; revision: number; currentRevision: number };
export type ActivateDto = { versionId: string; number: number };
export type VersionDto = {
  id: string;
  number: number;
  createdAt: string;
  createdBy: string | null;
  isActive: boolean;
  activations: { at: string; by: string | null }[];
};
export type VersionsDto = { versions: VersionDto[] };
export type DiffDto = RuleDiff & { from: { label: string }; to: { label: string }; sentences: string[] };
