"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

export type NavSection = { href: string; label: string };

/** Only sections that work, and that the person's role may open, are listed (the server decides which). */
export function SiteNav({ siteId, sections }: { siteId: string; sections: NavSection[] }) {
  const pathname = usePathname();
  const base = `/sites/${siteId}`;
  return (
    // One row that scrolls sideways on a narrow screen rather than widening the page.
    <nav aria-label="Site sections" className="-mb-px overflow-x-auto">
      <ul className="flex w-max gap-1 px-2">
        {sections.map((s) => {
          const href = `${base}${s.href}`;
          // A section stays marked on its sub-pages (a device's energy view, say); the overview only on itself.
          const isCurrent = pathname === href || (s.href !== "" && pathname.startsWith(`${href}/`));
          return (
            <li key={s.label}>
              <Link
                href={href}
                aria-current={isCurrent ? "page" : undefined}
                className={`block whitespace-nowrap rounded-md px-3 py-1.5 text-sm font-semibold ${isCurrent ? "bg-ink text-fog" : "text-slate hover:bg-fog hover:text-ink"}`}
              >
                {s.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
