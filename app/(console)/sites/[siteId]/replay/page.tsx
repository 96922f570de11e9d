import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { Suspense } from "react";
import { ReplayPanel } from "@/components/replay/replay-panel";
import { listDevices } from "@/db/queries/devices";
import { listEvents } from "@/db/queries/events";
import { getRuleSet } from "@/db/queries/rule-sets";
import { getSite, listZoneChoices } from "@/db/queries/sites";
import { requireSitePermission } from "@/lib/auth/current";

export const metadata: Metadata = { title: "Replay" };

const DAY = 86_400_000;

/** The default window: the day up to the newest event in the log (or up to now), to the minute. */
function windowEnd(latestAt: number | undefined): number {
  return Math.ceil(((latestAt ?? Date.now()) + 60_000) / 60_000) * 60_000;
}

export default async function ReplayPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  await requireSitePermission(siteId, "replay.use", `/sites/${siteId}/replay`);
  const [site, devices, zones, ruleSet, [latest]] = await Promise.all([getSite({ siteId }), listDevices({ siteId }), listZoneChoices({ siteId }), getRuleSet({ siteId }), listEvents({ siteId, filter: {}, limit: 1 })]);
  if (!site) notFound();
  const end = windowEnd(latest?.at);
  return (
    <Suspense>
      <ReplayPanel
        ctx={{ siteId, timeZone: site.timeZone, devices: devices.map((d) => ({ id: d.id, name: d.name, kind: d.kind, zoneId: d.zoneId })), zones }}
        options={{ activeVersionId: ruleSet.activeVersionId, draftRevision: ruleSet.draftRevision, versions: ruleSet.versions.map((v) => ({ id: v.id, number: v.number })) }}
        initialWindow={{ from: end - DAY, to: end }}
      />
    </Suspense>
  );
}
