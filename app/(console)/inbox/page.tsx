import type { Metadata } from "next";
import { ConsoleHeader } from "@/components/console/console-header";
import { InboxList } from "@/components/notices/inbox-list";
import { listSitesForUser } from "@/db/queries/members";
import { requireUser } from "@/lib/auth/current";

export const metadata: Metadata = { title: "Inbox" };
export const dynamic = "force-dynamic";

export default async function InboxPage() {
  const user = await requireUser("/inbox");
  const sites = await listSitesForUser({ userId: user.id });
  return (
    <>
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-paper focus:px-3 focus:py-2">
        Skip to content
      </a>
      <ConsoleHeader sites={sites} user={user} />
      <main id="main" className="mx-auto max-w-3xl px-4 py-8">
        <h1 className="text-2xl font-extrabold">Inbox</h1>
        <p className="mt-1 text-sm text-slate">
          Notices the rules sent you, newest first. Choose which reach you, and how, on your <a href="/account#notices" className="font-semibold text-ink underline">account page</a>.
        </p>
        <InboxList sites={sites.map((s) => ({ id: s.id, name: s.name }))} />
      </main>
    </>
  );
}
