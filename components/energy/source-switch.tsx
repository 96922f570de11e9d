import Link from "next/link";

type Option = { value: string; label: string };

/** A pair of links that set one query parameter (the page re-reads it); the current one is marked for screen readers. */
export function QuerySwitch({ label, name, value, options, hrefFor }: { label: string; name: string; value: string; options: Option[]; hrefFor: (name: string, value: string) => string }) {
  return (
    <nav aria-label={label} className="flex items-center gap-2 text-sm">
      <span className="text-slate">{label}:</span>
      <span className="inline-flex overflow-hidden rounded-md border border-line bg-paper">
        {options.map((o) => (
          <Link
            key={o.value}
            href={hrefFor(name, o.value)}
            aria-current={o.value === value ? "page" : undefined}
            className={`px-3 py-1 font-semibold ${o.value === value ? "bg-ink text-fog" : "text-ink hover:bg-fog"}`}
          >
            {o.label}
          </Link>
        ))}
      </span>
    </nav>
  );
}
