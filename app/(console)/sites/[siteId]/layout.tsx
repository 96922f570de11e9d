import { notFound } from "next/navigation";
import { ConsoleHeader } from "@/components/console/console-header";
import { getMembership, listSitesForUser } from "@/db/queries/members";
import { requireUser } from "@/lib/auth/current";
import { sectionsFor } from "@/lib/auth/sections";
import { siteParamsSchema } from "@/lib/validation/site";

export const dynamic = "force-dynamic";

export default async function SiteLayout({ children, params }: { children: React.ReactNode; params: Promise<{ siteId: string }> }) {
  const parsed = siteParamsSchema.safeParse(await params);
  if (!parsed.success) notFound();
  const { siteId } = parsed.data;
  const user = await requireUser(`/sites/${siteId}`);
  const [membership, sites] = await Promise.all([getMembership({ siteId, userId: user.id }), listSitesForUser({ userId: user.id })]);
  // Not a member: as far as this person can tell, the site does not exist.
  if (!membership) notFound();
  return (
    <>
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-paper focus:px-3 focus:py-2">
        Skip to content
      </a>
      <ConsoleHeader sites={sites} user={user} current={{ siteId, role: membership.role, sections: sectionsFor(membership.role) }} />
      <main id="main" className="mx-auto max-w-6xl px-4 py-8">
        {children}
      </main>
    </>
  );
}
