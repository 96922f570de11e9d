import type { Metadata } from "next";
import { MembersPanel } from "@/components/members/members-panel";
import { requireSitePermission } from "@/lib/auth/current";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  await requireSitePermission(siteId, "members.manage", `/sites/${siteId}/members`);
  return <MembersPanel siteId={siteId} />;
}
