import type { PowerSource } from "@/lib/catalogue/device-kinds";

const styles: Record<PowerSource, { label: string; className: string; icon: React.ReactNode }> = {
  kinetic: {
    label: "Kinetic",
    className: "border-harvest/60 bg-harvest/10 text-ink",
    icon: <path d="M8 1v8M4 6l4 4 4-4M3 14h10" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />,
  },
  solar: {
    label: "Solar",
    className: "border-harvest/60 bg-harvest/10 text-ink",
    icon: (
      <g fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round">
        <circle cx="8" cy="8" r="3" />
        <path d="M8 1v2M8 13v2M1 8h2M13 8h2M3 3l1.4 1.4M11.6 11.6 13 13M3 13l1.4-1.4M11.6 4.4 13 3" />
      </g>
    ),
  },
  mains: {
    label: "Wired",
    className: "border-line bg-fog text-slate",
    icon: <path d="M5 1v4M11 1v4M3 5h10v3a5 5 0 0 1-10 0zM8 13v2" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />,
  },
};

/** Power source told by icon shape and word, not colour alone. */
export function PowerBadge({ power }: { power: PowerSource }) {
  const s = styles[power];
  return (
    <span className={`inline-flex items-center gap-1 rounded-full border px-2 py-0.5 text-xs font-semibold ${s.className}`}>
      <svg aria-hidden="true" viewBox="0 0 16 16" className="h-3.5 w-3.5">
        {s.icon}
      </svg>
      {s.label}
    </span>
  );
}
