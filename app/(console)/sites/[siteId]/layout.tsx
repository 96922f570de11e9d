import { notFound } from "next/navigation";
import { getSite, listSites } from "@/db/queries/sites";
import { ConsoleHeader } from "@/components/console/console-header";
import { siteParamsSchema } from "@/lib/validation/site";

export const dynamic = "force-dynamic";

export default async function SiteLayout({ children, params }: { children: React.ReactNode; params: Promise<{ siteId: string }> }) {
  const parsed = siteParamsSchema.safeParse(await params);
  if (!parsed.success) notFound();
  const [site, sites] = await Promise.all([getSite({ siteId: parsed.data.siteId }), listSites()]);
  if (!site) notFound();
  return (
    <>
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-paper focus:px-3 focus:py-2">
        Skip to content
      </a>
      <ConsoleHeader sites={sites} currentSiteId={site.id} />
      <main id="main" className="mx-auto max-w-6xl px-4 py-8">
        {children}
      </main>
    </>
  );
}
