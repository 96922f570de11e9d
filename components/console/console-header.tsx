import Link from "next/link";
import { SiteSwitcher } from "./site-switcher";
import { SiteNav } from "./site-nav";

type Props = {
  sites: { id: string; name: string }[];
  currentSiteId?: string;
};

/** The console frame's top bar: product name, site switcher and the site's sections. */
export function ConsoleHeader({ sites, currentSiteId }: Props) {
  return (
    <header className="border-b border-line bg-paper">
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-4 py-3">
        <Link href="/sites" className="flex items-center gap-2 text-lg font-extrabold tracking-tight text-ink">
          <svg aria-hidden="true" viewBox="0 0 32 32" className="h-7 w-7">
            <rect width="32" height="32" rx="7" fill="#1d2833" />
            <path d="M18 4 9 18h6l-2 10 10-15h-6z" fill="#d99a1e" />
          </svg>
          Joulepath
        </Link>
        {currentSiteId ? <SiteSwitcher sites={sites} currentSiteId={currentSiteId} /> : null}
        {currentSiteId ? <SiteNav siteId={currentSiteId} /> : null}
      </div>
    </header>
  );
}
