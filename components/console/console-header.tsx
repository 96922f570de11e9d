import Link from "next/link";
import { LogoMark } from "@/components/ui/logo-mark";
import { SignOutButton } from "@/components/auth/sign-out-button";
import { InboxBadge } from "@/components/notices/inbox-badge";
import { ROLE_LABEL, type Role } from "@/lib/auth/roles";
import { SiteNav, type NavSection } from "./site-nav";
import { SiteSwitcher } from "./site-switcher";

type Props = {
  sites: { id: string; name: string }[];
  user: { name: string };
  current?: { siteId: string; role: Role; sections: NavSection[] };
};

/** The console frame's top bar: product name, site switcher, the site's sections, the person. */
export function ConsoleHeader({ sites, user, current }: Props) {
  return (
    <header className="border-b border-line bg-paper">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-4 gap-y-2 px-4 pt-3 pb-2">
        <Link href="/sites" className="flex items-center gap-2 text-lg font-extrabold tracking-tight text-ink">
          <LogoMark className="h-7 w-7" />
          Joulepath
        </Link>
        {current ? <SiteSwitcher sites={sites} currentSiteId={current.siteId} /> : null}
        {current ? <span className="rounded-full border border-line px-2 py-0.5 text-xs font-semibold text-slate">{ROLE_LABEL[current.role]}</span> : null}
        <div className="ml-auto flex items-center gap-1">
          <InboxBadge />
          <Link href="/account" className="rounded-md px-3 py-1.5 text-sm font-semibold text-slate hover:bg-fog hover:text-ink">
            {user.name}
          </Link>
          <SignOutButton />
        </div>
      </div>
      {current ? (
        <div className="mx-auto max-w-6xl px-2 pb-2">
          <SiteNav siteId={current.siteId} sections={current.sections} />
        </div>
      ) : null}
    </header>
  );
}
