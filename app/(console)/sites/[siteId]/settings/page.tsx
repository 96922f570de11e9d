import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { NewSiteForm } from "@/components/sites/new-site-form";
import { getSite } from "@/db/queries/sites";
import { requireSitePermission } from "@/lib/auth/current";

export const metadata: Metadata = { title: "Site settings" };

export default async function SiteSettingsPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  await requireSitePermission(siteId, "site.edit", `/sites/${siteId}/settings`);
  const site = await getSite({ siteId });
  if (!site) notFound();
  return (
    <div className="max-w-xl">
      <h1 className="text-2xl font-extrabold">Site settings</h1>
      <p className="mt-1 text-slate">The time zone and position drive schedules, sunrise/sunset rules and daylight harvesting.</p>
      <div className="mt-6 rounded-2xl border border-line bg-paper p-6">
        <NewSiteForm site={site} />
      </div>
    </div>
  );
}
