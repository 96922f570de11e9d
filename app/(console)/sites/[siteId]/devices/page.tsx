import type { Metadata } from "next";
import { DevicesPanel } from "@/components/devices/devices-panel";
import { requireSitePermission } from "@/lib/auth/current";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Devices" };

export default async function DevicesPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { membership } = await requireSitePermission(siteId, "inventory.view", `/sites/${siteId}/devices`);
  return <DevicesPanel siteId={siteId} canEdit={can(membership.role, "devices.manage")} />;
}
