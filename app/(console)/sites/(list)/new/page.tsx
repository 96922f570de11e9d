import type { Metadata } from "next";
import { ConsoleHeader } from "@/components/console/console-header";
import { NewSiteForm } from "@/components/sites/new-site-form";
import { listSitesForUser } from "@/db/queries/members";
import { requireUser } from "@/lib/auth/current";

export const metadata: Metadata = { title: "New site" };
export const dynamic = "force-dynamic";

export default async function NewSitePage() {
  const user = await requireUser("/sites/new");
  const sites = await listSitesForUser({ userId: user.id });
  return (
    <>
      <ConsoleHeader sites={sites} user={user} />
      <main id="main" className="mx-auto max-w-xl px-4 py-8">
        <h1 className="text-2xl font-extrabold">New site</h1>
        <p className="mt-1 text-slate">You become the site&apos;s integrator. The time zone and position drive schedules and sun times.</p>
        <div className="mt-6 rounded-2xl border border-line bg-paper p-6">
          <NewSiteForm />
        </div>
      </main>
    </>
  );
}
