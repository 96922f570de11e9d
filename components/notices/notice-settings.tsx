import { BrowserNoticesCard } from "./browser-notices-card";
import { NoticePrefsForm } from "./notice-prefs-form";

/** The account page's "Notices" section: this browser, then each site's preferences. */
export function NoticeSettings({ sites }: { sites: { id: string; name: string }[] }) {
  return (
    <section id="notices" aria-labelledby="notices-title" className="rounded-2xl border border-line bg-paper p-6">
      <h2 id="notices-title" className="text-lg font-bold">
        Notices
      </h2>
      <p className="mt-1 text-sm text-slate">Visitors, the call button, doors left open, alerts: what the rules tell you, and how.</p>
      <h3 className="mt-4 font-bold">On this browser</h3>
      <BrowserNoticesCard />
      {sites.map((s) => (
        <div key={s.id} className="mt-6 border-t border-line pt-4">
          <h3 className="mb-2 font-bold">{s.name}</h3>
          <NoticePrefsForm siteId={s.id} siteName={s.name} />
        </div>
      ))}
    </section>
  );
}
