import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { EventLogPanel } from "@/components/events/event-log-panel";
import { listDevices } from "@/db/queries/devices";
import { getSite, listZoneChoices } from "@/db/queries/sites";
import { requireSitePermission } from "@/lib/auth/current";

export const metadata: Metadata = { title: "Event log" };

export default async function EventLogPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  await requireSitePermission(siteId, "replay.use", `/sites/${siteId}/events`);
  const [site, devices, zones] = await Promise.all([getSite({ siteId }), listDevices({ siteId }), listZoneChoices({ siteId })]);
  if (!site) notFound();
  return <EventLogPanel ctx={{ siteId, timeZone: site.timeZone, devices: devices.map((d) => ({ id: d.id, name: d.name, kind: d.kind, zoneId: d.zoneId })), zones }} />;
}
