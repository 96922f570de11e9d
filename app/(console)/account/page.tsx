import type { Metadata } from "next";
import { ChangePasswordForm } from "@/components/account/change-password-form";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { ConsoleHeader } from "@/components/console/console-header";
import { NoticeSettings } from "@/components/notices/notice-settings";
import { listSitesForUser } from "@/db/queries/members";
import { requireUser } from "@/lib/auth/current";
import { ROLE_LABEL } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Account" };
export const dynamic = "force-dynamic";

export default async function AccountPage() {
  const user = await requireUser("/account");
  const sites = await listSitesForUser({ userId: user.id });
  return (
    <>
      <ConsoleHeader sites={sites} user={user} />
      <main id="main" className="mx-auto max-w-3xl space-y-8 px-4 py-8">
        <section>
          <h1 className="text-2xl font-extrabold">Your account</h1>
          <p className="mt-1 text-slate">
            {user.name} · {user.email}
          </p>
          {sites.length ? (
            <ul className="mt-3 flex flex-wrap gap-2">
              {sites.map((s) => (
                <li key={s.id} className="rounded-full border border-line bg-paper px-3 py-1 text-sm">
                  {s.name}: <strong>{ROLE_LABEL[s.role]}</strong>
                </li>
              ))}
            </ul>
          ) : null}
        </section>
        <NoticeSettings sites={sites} />
        <section aria-labelledby="pw-title" className="rounded-2xl border border-line bg-paper p-6">
          <h2 id="pw-title" className="text-lg font-bold">
            Change password
          </h2>
          <ChangePasswordForm />
        </section>
        <section aria-labelledby="sessions-title" className="rounded-2xl border border-line bg-paper p-6">
          <h2 id="sessions-title" className="text-lg font-bold">
            Sessions
          </h2>
          <p className="mt-1 text-sm text-slate">Signs you out on every browser and phone, including this one. Use it if a device was lost or shared.</p>
          <div className="mt-3">
            <SignOutButton everywhere className="rounded-md border border-clay px-3 py-1.5 text-sm font-semibold text-clay hover:bg-clay/10" />
          </div>
        </section>
      </main>
    </>
  );
}
