import Papa from "papaparse";

/**
 * Streaming parse of an event log file, line by line, so a file of any size is
 * read in constant memory. NDJSON: one JSON object per line. CSV: a header line
 * naming the columns (any order), then one event per line; values never hold a
 * line break, so a quoted newline is not supported (it reads as a broken line).
 * Every problem comes back with its 1-based line number.
 */
export type LogFormat = "ndjson" | "csv";
export type LineError = { line: number; field: string; message: string };
export type RawLine = { line: number; item: Record<string, unknown> };
export type ParseOutput = { items: RawLine[]; errors: LineError[] };

/** The columns of an event, as exported; `at` is milliseconds since 1970 or ISO 8601 with an offset. */
export const EVENT_COLUMNS = ["id", "at", "device", "kind", "value"] as const;
const REQUIRED = ["id", "at", "device", "kind"] as const;
/** A line longer than this is not an event: it is reported and skipped without being held in memory. */
export const MAX_LINE_CHARS = 16 * 1024;

export function createLogParser(format: LogFormat) {
  let buffer = "";
  let lineNo = 0;
  let isOverlong = false;
  let header: string[] | null = null;
  let isHeaderBroken = false;

  function handle(text: string, out: ParseOutput, isLast: boolean) {
    lineNo++;
    const line = text.endsWith("\r") ? text.slice(0, -1) : text;
    const content = lineNo === 1 ? line.replace(/^\uFEFF/, "") : line;
    if (content.trim() === "") return;
    if (format === "ndjson") return ndjsonLine(content, out, isLast);
    return csvLine(content, out, isLast);
  }

  function ndjsonLine(text: string, out: ParseOutput, isLast: boolean) {
    let value: unknown;
    try {
      value = JSON.parse(text);
    } catch {
      out.errors.push({ line: lineNo, field: "line", message: isLast ? "This last line is not complete JSON: the file looks cut off." : "This line is not valid JSON." });
      return;
    }
    if (!value || typeof value !== "object" || Array.isArray(value)) {
      out.errors.push({ line: lineNo, field: "line", message: "Each line must be one JSON object with id, at, device, kind and value." });
      return;
    }
    out.items.push({ line: lineNo, item: value as Record<string, unknown> });
  }

  function csvLine(text: string, out: ParseOutput, isLast: boolean) {
    const parsed = Papa.parse<string[]>(text, { header: false, skipEmptyLines: false });
    const cells = parsed.data[0] ?? [];
    if (parsed.errors.length) {
      out.errors.push({ line: lineNo, field: "line", message: isLast ? "This last line ends inside quotes: the file looks cut off." : "This line has an unclosed quote." });
      return;
    }
    if (!header) {
      const names = cells.map((c) => c.trim().toLowerCase());
      header = names;
      const unknown = names.filter((n) => !(EVENT_COLUMNS as readonly string[]).includes(n));
      const missing = REQUIRED.filter((n) => !names.includes(n));
      const twice = names.filter((n, i) => names.indexOf(n) !== i);
      if (unknown.length || missing.length || twice.length) {
        isHeaderBroken = true;
        const parts = [
          missing.length ? `missing ${missing.join(", ")}` : "",
          unknown.length ? `unknown ${unknown.map((u) => `"${u}"`).join(", ")}` : "",
          twice.length ? `repeated ${twice.join(", ")}` : "",
        ].filter(Boolean);
        out.errors.push({ line: lineNo, field: "header", message: `The header must name the columns ${EVENT_COLUMNS.join(", ")} (value may be left out): ${parts.join("; ")}.` });
      }
      return;
    }
    if (isHeaderBroken) return;
    if (cells.length !== header.length) {
      const cut = isLast && cells.length < header.length ? " The file looks cut off." : "";
      out.errors.push({ line: lineNo, field: "line", message: `This line has ${cells.length} column${cells.length === 1 ? "" : "s"}; the header has ${header.length}.${cut}` });
      return;
    }
    const item: Record<string, unknown> = {};
    header.forEach((name, i) => (item[name] = csvCell(name, cells[i])));
    if (!("value" in item)) item.value = null;
    out.items.push({ line: lineNo, item });
  }

  return {
    /** Feeds decoded text; returns the complete lines' events and errors. */
    push(chunk: string): ParseOutput {
      const out: ParseOutput = { items: [], errors: [] };
      let start = 0;
      for (;;) {
        const nl = chunk.indexOf("\n", start);
        if (nl === -1) break;
        const piece = chunk.slice(start, nl);
        start = nl + 1;
        if (isOverlong) {
          isOverlong = false;
          buffer = "";
          continue;
        }
        const text = buffer + piece;
        buffer = "";
        handle(text, out, false);
      }
      const rest = chunk.slice(start);
      if (isOverlong) return out;
      buffer += rest;
      if (buffer.length > MAX_LINE_CHARS) {
        lineNo++;
        out.errors.push({ line: lineNo, field: "line", message: `This line is longer than ${MAX_LINE_CHARS} characters; it cannot be an event.` });
        // Counted now; its newline, when it comes, ends it without counting it again.
        isOverlong = true;
        buffer = "";
      }
      return out;
    },
    /** The end of the file: a last line without a newline is still read (and reported as cut off if broken). */
    end(): ParseOutput {
      const out: ParseOutput = { items: [], errors: [] };
      if (!isOverlong && buffer !== "") handle(buffer, out, true);
      buffer = "";
      if (format === "csv" && !header) out.errors.push({ line: 1, field: "header", message: `The file is empty: a CSV event log starts with the header ${EVENT_COLUMNS.join(",")}.` });
      return out;
    },
    get lines() {
      return lineNo;
    },
  };
}

/** CSV cells are text: turn `at` digits and `value` literals back into what NDJSON would carry. */
function csvCell(column: string, cell: string): unknown {
  const text = cell.trim();
  if (column === "at") return /^\d+$/.test(text) ? Number(text) : text;
  if (column === "value") return csvValue(text);
  return text;
}

/** "" → null, true/false → boolean, a number → number, anything else stays text ("open", "active"). */
export function csvValue(text: string): number | boolean | string | null {
  if (text === "") return null;
  if (text === "true") return true;
  if (text === "false") return false;
  if (/^-?\d+(\.\d+)?([eE][-+]?\d+)?$/.test(text)) return Number(text);
  return text;
}
