"use client";

import { useQuery } from "@tanstack/react-query";
import { fetchJson } from "@/components/api/fetch-json";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import type { PaletteSite } from "@/lib/rules/palette";
import type { SiteNames } from "@/lib/rules/sentence";
import type { RulesDto } from "@/lib/validation/rules";
import { CanvasEditor } from "./canvas-editor";

/** Loads the draft once; the editor then owns it (autosave, conflicts) until the page is left. */
export function CanvasPage({ siteId, site, names, canActivate }: { siteId: string; site: PaletteSite; names: SiteNames; canActivate: boolean }) {
  const rules = useQuery({ queryKey: ["sites", siteId, "rules", "draft-on-open"], queryFn: () => fetchJson<RulesDto>(`/api/sites/${siteId}/rules`), staleTime: Infinity, gcTime: 0 });
  if (rules.isPending) return <LoadingPanel label="Loading the Canvas…" />;
  if (rules.isError) return <ErrorPanel title="The Canvas could not be loaded." detail={rules.error.message} onRetry={() => void rules.refetch()} />;
  return <CanvasEditor siteId={siteId} site={site} names={names} canActivate={canActivate} initial={rules.data} />;
}
