import type { Metadata } from "next";
import { SiteOverview } from "@/components/overview/site-overview";

export const metadata: Metadata = { title: "Overview" };

export default async function OverviewPage({ params, searchParams }: { params: Promise<{ siteId: string }>; searchParams: Promise<{ denied?: string }> }) {
  const [{ siteId }, { denied }] = await Promise.all([params, searchParams]);
  return (
    <>
      {denied ? (
        <p role="alert" className="mb-6 rounded-md border border-clay/50 bg-clay/10 px-3 py-2 font-semibold text-clay">
          Your role on this site does not open that page.
        </p>
      ) : null}
      <SiteOverview siteId={siteId} />
    </>
  );
}
