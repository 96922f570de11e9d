import { describe, expect, it } from "vitest";
import { DEVICE_KINDS } from "@/lib/catalogue/device-kinds";
import { isAssignableGroupAddress, unicastRange } from "@/lib/mesh/address";
import { demoDevices, demoZones } from "@/db/seed/demo-site";

describe("demo site data", () => {
  it("gives every device a unicast range that overlaps no other (Mesh Profile 1.0.1 §3.4.2)", () => {
    const taken = new Set<number>();
    for (const d of demoDevices) {
      const range = unicastRange(d.unicastAddress, d.elementCount ?? 1);
      expect(range, d.name).not.toBeNull();
      for (let a = range!.first; a <= range!.last; a++) {
        expect(taken.has(a), `${d.name} reuses 0x${a.toString(16)}`).toBe(false);
        taken.add(a);
      }
    }
  });

  it("gives every zone a distinct assignable group address", () => {
    const addrs = demoZones.map((z) => z.groupAddress);
    expect(new Set(addrs).size).toBe(addrs.length);
    for (const a of addrs) expect(isAssignableGroupAddress(a)).toBe(true);
  });

  it("holds the devices the scenario names", () => {
    const kinds = new Set(demoDevices.map((d) => d.kind));
    for (const k of ["kinetic-rocker", "solar-motion-light", "solar-contact", "light-sensor", "climate-sensor", "kinetic-call-button", "fire-alarm-input", "mesh-luminaire", "cc-driver", "bridge-0-10v", "relay"] as const) {
      expect(kinds.has(k), k).toBe(true);
    }
    for (const d of demoDevices) expect(DEVICE_KINDS).toContain(d.kind);
  });
});
