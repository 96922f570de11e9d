import type { Metadata } from "next";
import { BenchPanel } from "@/components/bench/bench-panel";
import { requireSitePermission } from "@/lib/auth/current";
import { benchSourceSchema } from "@/lib/validation/bench";

export const metadata: Metadata = { title: "Test bench" };

/** `?source=draft` (the Canvas's "Try on bench") or `?source=active` picks the rules the sandbox runs. */
export default async function BenchPage({ params, searchParams }: { params: Promise<{ siteId: string }>; searchParams: Promise<{ source?: string | string[] }> }) {
  const [{ siteId }, query] = await Promise.all([params, searchParams]);
  await requireSitePermission(siteId, "bench.use", `/sites/${siteId}/bench`);
  const source = benchSourceSchema.safeParse(query.source);
  return <BenchPanel siteId={siteId} source={source.success ? source.data : undefined} />;
}
