import { describe, expect, it } from "vitest";
import { createLogParser, csvValue, MAX_LINE_CHARS, type LogFormat } from "@/lib/eventlog/parse";

/** Feeds the text in pieces of `size` characters, as a network stream would. */
function parse(format: LogFormat, text: string, size = 7) {
  const p = createLogParser(format);
  const items: { line: number; item: Record<string, unknown> }[] = [];
  const errors: { line: number; field: string; message: string }[] = [];
  for (let i = 0; i < text.length; i += size) {
    const out = p.push(text.slice(i, i + size));
    items.push(...out.items);
    errors.push(...out.errors);
  }
  const end = p.end();
  return { items: [...items, ...end.items], errors: [...errors, ...end.errors], lines: p.lines };
}

describe("NDJSON", () => {
  it("reads one object per line whatever the chunk size, with CRLF and blank lines", () => {
    const text = '{"id":"a","at":1,"device":"d","kind":"press","value":1}\r\n\n{"id":"b","at":2,"device":"d","kind":"press","value":2}\n';
    for (const size of [1, 3, 7, 1000]) {
      const { items, errors, lines } = parse("ndjson", text, size);
      expect(errors).toEqual([]);
      expect(items.map((i) => [i.line, i.item.id])).toEqual([
        [1, "a"],
        [3, "b"],
      ]);
      expect(lines).toBe(3);
    }
  });

  it("names the line of broken JSON, and calls a broken last line a cut-off file", () => {
    const { items, errors } = parse("ndjson", '{"id":"a"}\nnot json\n[1,2]\n{"id":"c","at":');
    expect(items.map((i) => i.line)).toEqual([1]);
    expect(errors).toEqual([
      { line: 2, field: "line", message: "This line is not valid JSON." },
      { line: 3, field: "line", message: expect.stringContaining("one JSON object") },
      { line: 4, field: "line", message: expect.stringContaining("cut off") },
    ]);
  });

  it("a last line without a newline is still read", () => {
    expect(parse("ndjson", '{"id":"a"}').items).toHaveLength(1);
  });

  it("reports an overlong line once and goes on with the next", () => {
    const text = `{"id":"a"}\n${"x".repeat(MAX_LINE_CHARS + 10)}\n{"id":"c"}\n`;
    const { items, errors } = parse("ndjson", text, 4096);
    expect(items.map((i) => [i.line, i.item.id])).toEqual([
      [1, "a"],
      [3, "c"],
    ]);
    expect(errors.map((e) => e.line)).toEqual([2]);
  });
});

describe("CSV", () => {
  it("takes the columns in any order, with a BOM, quotes and typed values", () => {
    const text = '\uFEFFkind,id,device,at,value\npress,a,d1,1718863200000,2\ncontact,b,"d,2",2024-06-20T06:00:00Z,open\nmotion,c,d3,5,true\nlight-level,e,d4,6,\n';
    const { items, errors } = parse("csv", text);
    expect(errors).toEqual([]);
    expect(items.map((i) => i.item)).toEqual([
      { kind: "press", id: "a", device: "d1", at: 1718863200000, value: 2 },
      { kind: "contact", id: "b", device: "d,2", at: "2024-06-20T06:00:00Z", value: "open" },
      { kind: "motion", id: "c", device: "d3", at: 5, value: true },
      { kind: "light-level", id: "e", device: "d4", at: 6, value: null },
    ]);
  });

  it("refuses a header with wrong columns and reads no line under it", () => {
    const { items, errors } = parse("csv", "id,when,device,kind,colour\na,1,d,press,red\n");
    expect(items).toEqual([]);
    expect(errors).toHaveLength(1);
    expect(errors[0]).toMatchObject({ line: 1, field: "header" });
    expect(errors[0].message).toMatch(/missing at; unknown "when", "colour"/);
  });

  it("says which line has the wrong number of columns, and that a short last line means a cut-off file", () => {
    const { items, errors } = parse("csv", "id,at,device,kind,value\na,1,d,press,1\nb,2,d,press\nc,3,d");
    expect(items.map((i) => i.line)).toEqual([2]);
    expect(errors).toEqual([
      { line: 3, field: "line", message: "This line has 4 columns; the header has 5." },
      { line: 4, field: "line", message: "This line has 3 columns; the header has 5. The file looks cut off." },
    ]);
  });

  it("an empty file is an error", () => {
    expect(parse("csv", "").errors[0].field).toBe("header");
  });

  it("cell values", () => {
    expect([csvValue(""), csvValue("true"), csvValue("false"), csvValue("-3.5"), csvValue("1e3"), csvValue("open"), csvValue("12ab")]).toEqual([null, true, false, -3.5, 1000, "open", "12ab"]);
  });
});
