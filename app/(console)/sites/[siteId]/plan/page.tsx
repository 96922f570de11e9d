import type { Metadata } from "next";
import { PlanPanel } from "@/components/plan/plan-panel";
import { requireSitePermission } from "@/lib/auth/current";
import { can } from "@/lib/auth/permissions";

export const metadata: Metadata = { title: "Floor plan" };

export default async function PlanPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  const { membership } = await requireSitePermission(siteId, "inventory.view", `/sites/${siteId}/plan`);
  return <PlanPanel siteId={siteId} canEdit={can(membership.role, "devices.manage")} />;
}
