import type { Metadata } from "next";
import Link from "next/link";
import { listSites } from "@/db/queries/sites";
import { ConsoleHeader } from "@/components/console/console-header";

export const metadata: Metadata = { title: "Sites" };
export const dynamic = "force-dynamic";

export default async function SitesPage() {
  const sites = await listSites();
  return (
    <>
      <ConsoleHeader sites={sites} />
      <main id="main" className="mx-auto max-w-6xl px-4 py-8">
        <h1 className="text-2xl font-extrabold">Sites</h1>
        {sites.length === 0 ? (
          <p className="mt-4 text-slate">No sites yet. Run <code>npm run db:seed</code> to add the demo site.</p>
        ) : (
          <ul className="mt-6 grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            {sites.map((s) => (
              <li key={s.id}>
                <Link href={`/sites/${s.id}`} className="block rounded-xl border border-line bg-paper p-5 shadow-sm hover:border-slate">
                  <span className="text-lg font-bold">{s.name}</span>
                  <span className="mt-1 block text-sm text-slate">Open overview →</span>
                </Link>
              </li>
            ))}
          </ul>
        )}
      </main>
    </>
  );
}
