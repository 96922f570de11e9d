import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { DeviceEnergy } from "@/components/energy/device-energy";
import { requireSitePermission } from "@/lib/auth/current";
import { idSchema } from "@/lib/validation/site";
import { readEnergyQuery } from "@/lib/validation/energy";

export const metadata: Metadata = { title: "Device energy budget" };

type Props = { params: Promise<{ siteId: string; deviceId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

export default async function DeviceEnergyPage({ params, searchParams }: Props) {
  const { siteId, deviceId } = await params;
  await requireSitePermission(siteId, "energy.view", `/sites/${siteId}/energy/${deviceId}`);
  if (!idSchema.safeParse(deviceId).success) notFound();
  return <DeviceEnergy siteId={siteId} deviceId={deviceId} query={readEnergyQuery(await searchParams)} />;
}
