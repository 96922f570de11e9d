import type { Metadata } from "next";
import Link from "next/link";
import { ConsoleHeader } from "@/components/console/console-header";
import { listSitesForUser } from "@/db/queries/members";
import { requireUser } from "@/lib/auth/current";
import { ROLE_LABEL } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Sites" };
export const dynamic = "force-dynamic";

export default async function SitesPage() {
  const user = await requireUser("/sites");
  const sites = await listSitesForUser({ userId: user.id });
  return (
    <>
      <ConsoleHeader sites={sites} user={user} />
      <main id="main" className="mx-auto max-w-6xl px-4 py-8">
        <div className="flex flex-wrap items-center gap-4">
          <h1 className="mr-auto text-2xl font-extrabold">Your sites</h1>
          <Link href="/sites/new" className="rounded-md bg-ink px-4 py-2 font-semibold text-fog">
            New site
          </Link>
        </div>
        {sites.length === 0 ? (
          <p className="mt-6 text-slate">You are not on any site yet. Create one (you become its integrator), or ask to be invited.</p>
        ) : (
          <ul className="mt-6 grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            {sites.map((s) => (
              <li key={s.id}>
                <Link href={`/sites/${s.id}`} className="block rounded-xl border border-line bg-paper p-5 shadow-sm hover:border-slate">
                  <span className="text-lg font-bold">{s.name}</span>
                  <span className="mt-1 block text-sm text-slate">{ROLE_LABEL[s.role]} · open overview →</span>
                </Link>
              </li>
            ))}
          </ul>
        )}
      </main>
    </>
  );
}
