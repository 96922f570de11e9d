import { describe, expect, it } from "vitest";
import fc from "fast-check";
import { DEVICE_KINDS } from "@/lib/catalogue/device-kinds";
import { devicesToCsv, parseDeviceCsv, type InventoryDevice } from "@/lib/inventory/device-csv";
import type { Device } from "@/db/schema";

const zones = [
  { id: "z1", name: "Shop floor" },
  { id: "z2", name: "=Kiln, \"hot\" room" },
  { id: "z3", name: "Étage; flat" },
];
const floors = [
  { id: "f1", name: "Ground" },
  { id: "f2", name: "-1 cellar" },
];

// Characters that stress quoting and the formula guard: delimiters, quotes, formula starts, non-ASCII.
const nameChar = fc.constantFrom(..."abcXYZ019 ,;\"'=+-@µé°/\\#".split(""));
const name = fc
  .array(nameChar, { minLength: 1, maxLength: 30 })
  .map((chars) => chars.join("").trim())
  .filter((n) => n !== "");

const device = fc.record({
  name,
  kind: fc.constantFrom(...DEVICE_KINDS),
  zoneId: fc.constantFrom(null, ...zones.map((z) => z.id)),
  hasAddress: fc.boolean(),
  gap: fc.integer({ min: 0, max: 40 }),
  elementCount: fc.integer({ min: 1, max: 4 }),
  buttons: fc.constantFrom(null, 2 as const, 4 as const),
  position: fc.option(fc.record({ floorId: fc.constantFrom(...floors.map((f) => f.id)), x: fc.double({ min: 0, max: 1000, noNaN: true }), y: fc.double({ min: 0, max: 1000, noNaN: true }) })),
});

/** Lays generated devices out on non-overlapping addresses, as a valid site would have them. */
const devices = fc.uniqueArray(device, { maxLength: 25, selector: (d) => d.name.toLowerCase() }).map((list) => {
  let next = 1;
  return list.map((d): InventoryDevice => {
    const first = next + d.gap;
    next = first + d.elementCount;
    return {
      name: d.name,
      kind: d.kind,
      zoneId: d.zoneId,
      unicastAddress: d.hasAddress ? first : null,
      elementCount: d.elementCount,
      buttons: d.kind === "kinetic-rocker" ? d.buttons : null,
      floorId: d.position?.floorId ?? null,
      x: d.position?.x ?? null,
      y: d.position?.y ?? null,
    };
  });
});

describe("devicesToCsv ↔ parseDeviceCsv", () => {
  it("round-trips any valid inventory (property)", () => {
    fc.assert(
      fc.property(devices, (list) => {
        const text = devicesToCsv(list, zones, floors);
        const { rows, errors } = parseDeviceCsv(text, { zones, floors, existing: [] });
        expect(errors).toEqual([]);
        expect(rows).toEqual(list.map((d, i) => ({ ...d, line: i + 2 })));
      }),
      { numRuns: 200 },
    );
  });

  it("keeps formula-looking text inert in a spreadsheet, and gets it back on import", () => {
    // Source: OWASP CSV Injection — prefix cells starting with = + - @ so they are not run as formulas.
    const list: InventoryDevice[] = [
      { name: "=SUM(A1)", kind: "relay", zoneId: "z2", unicastAddress: 1, elementCount: 1, buttons: null, floorId: null, x: null, y: null },
      { name: "'=already quoted", kind: "relay", zoneId: null, unicastAddress: 2, elementCount: 1, buttons: null, floorId: null, x: null, y: null },
    ];
    const text = devicesToCsv(list, zones, floors);
    expect(text.split("\r\n")[1]).toMatch(/^'=SUM\(A1\),relay,"'=Kiln, ""hot"" room",0x0001/);
    expect(text).toContain("''=already quoted");
    expect(parseDeviceCsv(text, { zones, floors, existing: [] }).rows.map((r) => r.name)).toEqual(["=SUM(A1)", "'=already quoted"]);
  });

  it("writes the header, CRLF lines, hex addresses and a rocker's buttons from its profile", () => {
    const text = devicesToCsv(
      [{ name: "Door rocker", kind: "kinetic-rocker", zoneId: "z1", unicastAddress: 0x2a, elementCount: 2, profile: { buttons: 4 } }],
      zones,
      floors,
    );
    expect(text).toBe("name,kind,zone,unicast_address,elements,buttons,floor,x_m,y_m\r\nDoor rocker,kinetic-rocker,Shop floor,0x002A,2,4,,,");
  });

  it("exports device rows as the database returns them", () => {
    const row: Device = { id: "d1", siteId: "s1", zoneId: "z1", name: "Track head", kind: "mesh-luminaire", unicastAddress: 0x10, elementCount: 1, floorId: "f1", x: 2.5, y: 4, profile: {}, createdAt: new Date(0) };
    const { rows } = parseDeviceCsv(devicesToCsv([row], zones, floors), { zones, floors, existing: [] });
    expect(rows[0]).toMatchObject({ name: "Track head", zoneId: "z1", unicastAddress: 0x10, floorId: "f1", x: 2.5, y: 4 });
  });

  it("refuses to export a zone it was not given, rather than write an empty one", () => {
    expect(() => devicesToCsv([{ name: "A", kind: "relay", zoneId: "gone", unicastAddress: 1, elementCount: 1 }], zones, floors)).toThrow(/zone gone/);
  });
});
