"use client";

import { useRouter } from "next/navigation";
import { useId } from "react";

type Props = { sites: { id: string; name: string }[]; currentSiteId: string };

export function SiteSwitcher({ sites, currentSiteId }: Props) {
  const router = useRouter();
  const id = useId();
  return (
    <div className="flex items-center gap-2">
      <label htmlFor={id} className="text-sm text-slate">
        Site
      </label>
      <select
        id={id}
        value={currentSiteId}
        onChange={(e) => router.push(`/sites/${e.target.value}`)}
        className="rounded-md border border-line bg-fog px-2 py-1 text-sm font-semibold text-ink"
      >
        {sites.map((s) => (
          <option key={s.id} value={s.id}>
            {s.name}
          </option>
        ))}
      </select>
    </div>
  );
}
