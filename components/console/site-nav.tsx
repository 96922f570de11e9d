"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

export type NavSection = { href: string; label: string };

/** Only sections that work, and that the person's role may open, are listed (the server decides which). */
export function SiteNav({ siteId, sections }: { siteId: string; sections: NavSection[] }) {
  const pathname = usePathname();
  const base = `/sites/${siteId}`;
  return (
    <nav aria-label="Site sections" className="ml-auto">
      <ul className="flex gap-1">
        {sections.map((s) => {
          const href = `${base}${s.href}`;
          const isCurrent = pathname === href;
          return (
            <li key={s.label}>
              <Link
                href={href}
                aria-current={isCurrent ? "page" : undefined}
                className={`rounded-md px-3 py-1.5 text-sm font-semibold ${isCurrent ? "bg-ink text-fog" : "text-slate hover:bg-fog hover:text-ink"}`}
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
