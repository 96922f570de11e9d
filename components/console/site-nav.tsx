"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

/** Only sections that work are listed; later sections add themselves here. */
const sections = [{ href: "", label: "Overview" }] as const;

export function SiteNav({ siteId }: { siteId: string }) {
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
