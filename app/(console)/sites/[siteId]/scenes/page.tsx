import type { Metadata } from "next";
import { ScenesPanel } from "@/components/scenes/scenes-panel";
import { requireSitePermission } from "@/lib/auth/current";

export const metadata: Metadata = { title: "Scenes" };

export default async function ScenesPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  await requireSitePermission(siteId, "scenes.edit", `/sites/${siteId}/scenes`);
  return <ScenesPanel siteId={siteId} />;
}
