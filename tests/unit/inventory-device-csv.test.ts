import { describe, expect, it } from "vitest";
import { MAX_CSV_BYTES, MAX_CSV_ROWS, MAX_REPORTED_ERRORS, parseDeviceCsv, type CsvContext } from "@/lib/inventory/device-csv";

const context: CsvContext = {
  zones: [
    { id: "z-shop", name: "Shop floor" },
    { id: "z-work", name: "Workshop" },
  ],
  floors: [{ id: "f-ground", name: "Ground" }],
  existing: [{ name: "Shop downlight 1", unicastAddress: 0x0010, elementCount: 3 }],
};
const HEADER = "name,kind,zone,unicast_address,elements,buttons,floor,x_m,y_m";
const csv = (...lines: string[]) => [HEADER, ...lines].join("\n");
const errorsAt = (text: string) => parseDeviceCsv(text, context).errors.map((e) => [e.line, e.field]);

describe("parseDeviceCsv: good files", () => {
  it("reads a full row: zone by name, hex address, floor and position", () => {
    const { rows, errors } = parseDeviceCsv(csv("Door rocker,kinetic-rocker,Shop floor,0x0020,2,4,Ground,1.5,2.25"), context);
    expect(errors).toEqual([]);
    expect(rows).toEqual([
      { line: 2, name: "Door rocker", kind: "kinetic-rocker", zoneId: "z-shop", unicastAddress: 0x20, elementCount: 2, buttons: 4, floorId: "f-ground", x: 1.5, y: 2.25 },
    ]);
  });

  it("fills defaults: no zone, address to assign, one element, no buttons, no position", () => {
    const { rows } = parseDeviceCsv("name,kind\nPath light,mesh-luminaire\n", context);
    expect(rows[0]).toMatchObject({ zoneId: null, unicastAddress: null, elementCount: 1, buttons: null, floorId: null, x: null, y: null });
  });

  it("takes decimal addresses, any letter case in hex, kinds and zone names", () => {
    const { rows, errors } = parseDeviceCsv(csv("A,Mesh-Luminaire,workshop,32,,,,,", "B,relay,,0X7fFf,,,,,"), context);
    expect(errors).toEqual([]);
    expect(rows.map((r) => [r.kind, r.zoneId, r.unicastAddress])).toEqual([
      ["mesh-luminaire", "z-work", 32],
      ["relay", null, 0x7fff],
    ]);
  });

  it("handles a BOM, CRLF, quoted commas and quotes, blank lines and trailing empty lines", () => {
    const text = `\uFEFF${HEADER}\r\n"Counter, left ""call""",kinetic-call-button,Shop floor,,,,,,\r\n\r\nRelay,relay,,,,,,,\r\n\r\n\r\n`;
    const { rows, errors } = parseDeviceCsv(text, context);
    expect(errors).toEqual([]);
    expect(rows.map((r) => [r.line, r.name])).toEqual([
      [2, 'Counter, left "call"'],
      [4, "Relay"],
    ]);
  });

  it("counts a quoted line break as one spreadsheet row", () => {
    const { errors } = parseDeviceCsv(csv('"Two\nlines",relay', "Bad,lamp"), context);
    expect(errors.map((e) => [e.line, e.field])).toEqual([
      [2, "name"],
      [3, "kind"],
    ]);
  });

  it("reads semicolon-separated files from spreadsheets set to a decimal-comma locale", () => {
    const { rows, errors } = parseDeviceCsv("name;kind;zone\nStrip;bridge-0-10v;Shop floor\n", context);
    expect(errors).toEqual([]);
    expect(rows[0]).toMatchObject({ name: "Strip", zoneId: "z-shop" });
  });

  it("accepts columns in any order, with spaced or capitalised header names", () => {
    const { rows, errors } = parseDeviceCsv("Kind, Unicast Address ,Name\nrelay,0x0005,Fan\n", context);
    expect(errors).toEqual([]);
    expect(rows[0]).toMatchObject({ name: "Fan", unicastAddress: 5 });
  });
});

describe("parseDeviceCsv: problems, with the spreadsheet line and field", () => {
  it("names the kinds when a kind is unknown", () => {
    const [error] = parseDeviceCsv(csv("Lamp,lamp"), context).errors;
    expect(error).toMatchObject({ line: 2, field: "kind" });
    expect(error.message).toContain('"lamp" is not a device kind');
    expect(error.message).toContain("kinetic-rocker");
    expect(error.message).toContain("notice-panel");
  });

  it("refuses an unknown zone or floor and lists what exists", () => {
    const [zone, floor] = parseDeviceCsv(csv("A,relay,Cellar,,,,Attic"), context).errors;
    expect(zone).toMatchObject({ line: 2, field: "zone" });
    expect(zone.message).toContain("Shop floor");
    expect(floor).toMatchObject({ line: 2, field: "floor" });
  });

  it("refuses addresses outside the unicast range 0x0001–0x7FFF", () => {
    // Source: Mesh Profile 1.0.1 §3.4.2 — 0x0000 unassigned, 0x8000 and above are not unicast.
    expect(errorsAt(csv("A,relay,,0x0000", "B,relay,,0x8000", "C,relay,,0xC000", "D,relay,,32768"))).toEqual([
      [2, "unicast_address"],
      [3, "unicast_address"],
      [4, "unicast_address"],
      [5, "unicast_address"],
    ]);
    expect(parseDeviceCsv(csv("A,relay,,0x8000"), context).errors[0].message).toContain("0x0001–0x7FFF");
  });

  it("refuses a multi-element device that would run past 0x7FFF", () => {
    // Source: Mesh Profile 1.0.1 §3.4.2 — every element needs its own unicast address.
    expect(errorsAt(csv("A,kinetic-rocker,,0x7FFF,2"))).toEqual([[2, "unicast_address"]]);
  });

  it("refuses overlapping address ranges in the file and with the site's devices", () => {
    const { errors } = parseDeviceCsv(csv("A,relay,,0x0020,3", "B,relay,,0x0022", "C,relay,,0x0012"), context);
    expect(errors.map((e) => [e.line, e.field])).toEqual([
      [3, "unicast_address"],
      [4, "unicast_address"],
    ]);
    expect(errors[0].message).toContain("line 2");
    expect(errors[1].message).toContain("Shop downlight 1");
  });

  it("lets ranges touch without overlapping", () => {
    expect(parseDeviceCsv(csv("A,relay,,0x0013,2", "B,relay,,0x0015"), context).errors).toEqual([]);
  });

  it("refuses duplicate names, in the file or on the site, ignoring letter case", () => {
    const { errors, rows } = parseDeviceCsv(csv("Fan,relay", "fan,relay", "shop downlight 1,mesh-luminaire"), context);
    expect(errors.map((e) => [e.line, e.field])).toEqual([
      [3, "name"],
      [4, "name"],
    ]);
    expect(rows.map((r) => r.line)).toEqual([2]);
  });

  it("reports missing required values and malformed numbers", () => {
    expect(errorsAt(csv(",relay", "A,", "B,relay,,0x12G", "C,relay,,,0", "D,relay,,,1.5", "E,relay,,,,,Ground,abc,1", "F,relay,,,,,Ground,1,5,5"))).toEqual([
      [2, "name"],
      [3, "kind"],
      [4, "unicast_address"],
      [5, "elements"],
      [6, "elements"],
      [7, "x_m"],
      [8, "row"],
    ]);
    expect(parseDeviceCsv(csv("A,relay,,,,,Ground,\"1,5\",2"), context).errors[0].message).toContain("1.5");
  });

  it("asks for both coordinates, a floor for a position, and catches millimetres", () => {
    expect(errorsAt(csv("A,relay,,,,,Ground,1,", "B,relay,,,,,,1,2", "C,relay,,,,,Ground,1200,3", "D,relay,,,,,Ground,-1,3"))).toEqual([
      [2, "y_m"],
      [3, "floor"],
      [4, "x_m"],
      [5, "x_m"],
    ]);
  });

  it("allows buttons on rockers only, and only 2 or 4", () => {
    expect(errorsAt(csv("A,kinetic-rocker,,,,3", "B,relay,,,,2", "C,kinetic-rocker,,,,2"))).toEqual([
      [2, "buttons"],
      [3, "buttons"],
    ]);
  });

  it("refuses unknown, repeated and missing header columns", () => {
    expect(errorsAt("name,colour,name\nA,red,B\n")).toEqual([
      [1, "colour"],
      [1, "name"],
      [1, "kind"],
    ]);
    expect(parseDeviceCsv("name,kind,colour\nA,relay,red\n", context).rows).toEqual([]);
  });

  it("refuses names with control characters and an unclosed quote", () => {
    expect(errorsAt(csv("A\tB,relay"))).toEqual([[2, "name"]]);
    expect(errorsAt(csv("Good,relay", '"Open,relay'))).toContainEqual([3, "row"]);
  });

  it("says an empty file is empty", () => {
    expect(errorsAt("\uFEFF\r\n\r\n")).toEqual([[1, "file"]]);
    expect(parseDeviceCsv(`${HEADER}\n`, context)).toEqual({ rows: [], errors: [] });
  });

  it(`refuses more than ${MAX_CSV_ROWS} devices, counting only non-empty rows`, () => {
    const lines = (n: number) => Array.from({ length: n }, (_, i) => `D${i},relay`);
    expect(parseDeviceCsv(csv(...lines(MAX_CSV_ROWS), "", ""), context).errors).toEqual([]);
    expect(parseDeviceCsv(csv(...lines(MAX_CSV_ROWS)), context).rows).toHaveLength(MAX_CSV_ROWS);
    expect(errorsAt(csv(...lines(MAX_CSV_ROWS + 1)))).toEqual([[MAX_CSV_ROWS + 2, "file"]]);
  });

  it("refuses a file over 1 MiB, counting bytes, not characters", () => {
    const padding = "µ".repeat(MAX_CSV_BYTES / 2); // 2 bytes each in UTF-8: just over the limit with the header
    expect(errorsAt(`${HEADER}\n${padding}`)).toEqual([[0, "file"]]);
    expect(errorsAt(`${HEADER}\n${"x".repeat(MAX_CSV_BYTES - HEADER.length - 1)}`)).not.toContainEqual([0, "file"]);
  });

  it(`lists at most ${MAX_REPORTED_ERRORS} problems and says how many more there are`, () => {
    const { errors } = parseDeviceCsv(csv(...Array.from({ length: 150 }, (_, i) => `D${i},lamp`)), context);
    expect(errors).toHaveLength(MAX_REPORTED_ERRORS + 1);
    expect(errors.at(-1)).toMatchObject({ line: 0, field: "file" });
    expect(errors.at(-1)?.message).toContain("50 more");
  });
});
