import type { Metadata } from "next";
import { GatewayKeysPanel, type ExampleDevice } from "@/components/keys/gateway-keys-panel";
import { listDevices } from "@/db/queries/devices";
import { requireSitePermission } from "@/lib/auth/current";
import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import { env } from "@/lib/env";
import { formatAddress } from "@/lib/mesh/address";

export const metadata: Metadata = { title: "Gateway keys" };

/** A device of this site for the how-to's example call: a light-level reading changes the least. */
async function exampleDevice(siteId: string): Promise<ExampleDevice | null> {
  const devices = await listDevices({ siteId });
  const lux = devices.find((d) => DEVICE_KIND_INFO[d.kind].reports.includes("light-level"));
  if (lux) return { name: lux.name, address: formatAddress(lux.unicastAddress), kind: "light-level", value: 250 };
  const press = devices.find((d) => DEVICE_KIND_INFO[d.kind].reports.includes("press"));
  return press ? { name: press.name, address: formatAddress(press.unicastAddress), kind: "press", value: 1 } : null;
}

export default async function GatewayKeysPage({ params }: { params: Promise<{ siteId: string }> }) {
  const { siteId } = await params;
  await requireSitePermission(siteId, "gateway-keys.manage", `/sites/${siteId}/keys`);
  return <GatewayKeysPanel siteId={siteId} fallbackOrigin={env().APP_URL.replace(/\/$/, "")} example={await exampleDevice(siteId)} />;
}
