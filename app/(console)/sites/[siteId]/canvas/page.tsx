import type { Metadata } from "next";
import { CanvasPage } from "@/components/canvas/canvas-page";
import { listDevices } from "@/db/queries/devices";
import { listMembers } from "@/db/queries/members";
import { getSiteNames } from "@/db/queries/rule-sets";
import { listScenes } from "@/db/queries/scenes";
import { listZones } from "@/db/queries/zones";
import { requireSitePermission } from "@/lib/auth/current";
import { can } from "@/lib/auth/permissions";
import type { PaletteSite } from "@/lib/rules/palette";

export const metadata: Metadata = { title: "Canvas" };

/** The Canvas: managers and integrators only (occupants are sent back to the overview, checked here on the server). */
export default async function CanvasRoute({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { membership } = await requireSitePermission(siteId, "rules.edit", `/sites/${siteId}/canvas`);
  const [devices, zones, scenes, members, names] = await Promise.all([listDevices({ siteId }), listZones({ siteId }), listScenes({ siteId }), listMembers({ siteId }), getSiteNames({ siteId })]);
  const site: PaletteSite = {
    devices: devices.map((d) => ({ id: d.id, name: d.name, kind: d.kind, zoneId: d.zoneId, buttons: typeof d.profile.buttons === "number" ? d.profile.buttons : undefined })),
    zones: zones.map((z) => ({ id: z.id, name: z.name })),
    scenes: scenes.map((s) => ({ number: s.number, name: s.name })),
    people: members.map((m) => ({ id: m.userId, name: m.name, role: m.role })),
  };
  return <CanvasPage siteId={siteId} site={site} names={names} canActivate={can(membership.role, "rules.activate")} />;
}
