import type { Metadata } from "next";
import { SiteOverview } from "@/components/overview/site-overview";

export const metadata: Metadata = { title: "Overview" };

export default async function OverviewPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  return <SiteOverview siteId={siteId} />;
}
