import type { Metadata } from "next";
import { EnergyPanel } from "@/components/energy/energy-panel";
import { requireSitePermission } from "@/lib/auth/current";
import { readEnergyQuery } from "@/lib/validation/energy";

export const metadata: Metadata = { title: "Energy budget" };

type Props = { params: Promise<{ siteId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

export default async function EnergyPage({ params, searchParams }: Props) {
  const { siteId } = await params;
  await requireSitePermission(siteId, "energy.view", `/sites/${siteId}/energy`);
  return <EnergyPanel siteId={siteId} query={readEnergyQuery(await searchParams)} />;
}
