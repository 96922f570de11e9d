"use client";

import { isLuminaire } from "@/lib/catalogue/device-kinds";
import type { DeviceDto } from "@/lib/validation/devices";
import { OutputMapping } from "./output-mapping";
import { ProfileEditor } from "./profile-editor";

/** Below the edit form: what a level means on the wire, and the device's profile. */
export function DeviceDetail({ siteId, device, onSaved }: { siteId: string; device: DeviceDto; onSaved: () => Promise<unknown> }) {
  const output = (device.profile.output ?? {}) as Parameters<typeof OutputMapping>[0]["output"];
  return (
    <div className="mt-5 space-y-5 border-t border-line pt-4">
      {isLuminaire(device.kind) ? (
        <section aria-label="Output">
          <h3 className="mb-2 font-bold">Output at a level</h3>
          <OutputMapping output={output} />
        </section>
      ) : null}
      <section aria-label="Profile">
        <h3 className="mb-2 font-bold">Profile</h3>
        <ProfileEditor key={JSON.stringify(device.profile)} siteId={siteId} deviceId={device.id} profile={device.profile} onSaved={onSaved} />
      </section>
    </div>
  );
}
