import Papa from "papaparse";
import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import { formatAddress, UNICAST_MAX } from "@/lib/mesh/address";
import { formatRange, overlaps, rangeOf, type AddressedDevice } from "./address-ranges";
import { guardFormula, readAddress, readButtons, readElements, readKind, readMetres, readName, readNamed, type Cell, type NamedRecord } from "./device-csv-cells";

export { assignUnicastAddresses } from "./address-ranges";

/**
 * Device inventory as CSV, the way integrators keep it in a spreadsheet. Line
 * numbers are the spreadsheet's row numbers (header = 1), counting records, so a
 * quoted value with a line break inside is still one row.
 */
export const CSV_COLUMNS = ["name", "kind", "zone", "unicast_address", "elements", "buttons", "floor", "x_m", "y_m"] as const;
export type CsvColumn = (typeof CSV_COLUMNS)[number];
export const REQUIRED_COLUMNS: readonly CsvColumn[] = ["name", "kind"];

export const MAX_CSV_BYTES = 1024 * 1024;
export const MAX_CSV_ROWS = 2000;
/** Past this many, more messages only bury the first ones; the last error says how many were left out. */
export const MAX_REPORTED_ERRORS = 100;

export type InventoryDevice = {
  name: string;
  kind: DeviceKind;
  zoneId: string | null;
  /** null: assign automatically (assignUnicastAddresses). */
  unicastAddress: number | null;
  elementCount: number;
  /** Rockers only; null: the profile's default. */
  buttons: 2 | 4 | null;
  floorId: string | null;
  /** Metres from the floor plan's top-left corner, x to the right, y down. */
  x: number | null;
  y: number | null;
};
export type ParsedRow = InventoryDevice & { line: number };
/** line 0 means the whole file. */
export type CsvError = { line: number; field: string; message: string };
export type CsvContext = { zones: readonly NamedRecord[]; floors: readonly NamedRecord[]; existing: readonly (AddressedDevice & { name: string })[] };

/** `rows` holds only rows without any error; import when `errors` is empty. */
export function parseDeviceCsv(text: string, context: CsvContext): { rows: ParsedRow[]; errors: CsvError[] } {
  if (text.length > MAX_CSV_BYTES || new TextEncoder().encode(text).byteLength > MAX_CSV_BYTES) {
    return { rows: [], errors: [{ line: 0, field: "file", message: "is larger than 1 MiB; split it into several files" }] };
  }
  const body = text.replace(/^\uFEFF/, "");
  // Guessing from the header is reliable: column names contain neither ',' nor ';'.
  const headerLine = body.split(/\r\n|\n|\r/, 1)[0];
  const delimiter = headerLine.includes(",") ? "," : headerLine.includes(";") ? ";" : headerLine.includes("\t") ? "\t" : ",";
  const parsed = Papa.parse<string[]>(body, { delimiter, skipEmptyLines: false });
  const records = parsed.data.map((cells, index) => ({ line: index + 1, cells })).filter((r) => r.cells.some((c) => c.trim() !== ""));
  const errors: CsvError[] = parsed.errors.map((e) => ({
    line: (e.row ?? 0) + 1,
    field: "row",
    message: e.code === "MissingQuotes" ? "has a quote mark that is never closed" : "has a misplaced quote mark",
  }));
  if (records.length === 0) return { rows: [], errors: [{ line: 1, field: "file", message: "is empty; line 1 must be the header" }] };
  if (records.length - 1 > MAX_CSV_ROWS) {
    return { rows: [], errors: [{ line: records[MAX_CSV_ROWS + 1].line, field: "file", message: `has more than ${MAX_CSV_ROWS.toLocaleString("en")} devices; split it into several files` }] };
  }
  const [header, ...dataRecords] = records;
  const columns = readHeader(header.cells, header.line, errors);
  if (!columns) return { rows: [], errors: capErrors(errors) };

  const rows: ParsedRow[] = [];
  for (const record of dataRecords) {
    const row = readRow(record.cells, record.line, columns, context, errors);
    if (row) rows.push(row);
  }
  checkAcrossRows(rows, context, errors);
  const failed = new Set(errors.map((e) => e.line));
  return { rows: rows.filter((r) => !failed.has(r.line)), errors: capErrors(errors) };
}

function readHeader(cells: string[], line: number, errors: CsvError[]): Map<CsvColumn, number> | null {
  const columns = new Map<CsvColumn, number>();
  const before = errors.length;
  cells.forEach((cell, index) => {
    const name = cell.trim().toLowerCase().replace(/[\s-]+/g, "_");
    if (name === "") return;
    if (!(CSV_COLUMNS as readonly string[]).includes(name)) {
      errors.push({ line, field: cell.trim(), message: `is not a column we know; use: ${CSV_COLUMNS.join(", ")}` });
    } else if (columns.has(name as CsvColumn)) {
      errors.push({ line, field: name, message: "appears twice in the header" });
    } else columns.set(name as CsvColumn, index);
  });
  for (const required of REQUIRED_COLUMNS) if (!columns.has(required)) errors.push({ line, field: required, message: "column is missing from the header" });
  return errors.length === before ? columns : null;
}

function readRow(cells: string[], line: number, columns: Map<CsvColumn, number>, context: CsvContext, errors: CsvError[]): ParsedRow | null {
  const lastColumn = Math.max(...columns.values());
  if (cells.slice(lastColumn + 1).some((c) => c.trim() !== "")) {
    errors.push({ line, field: "row", message: `has more values than the header has columns (${cells.length} values)` });
    return null;
  }
  const raw = (column: CsvColumn) => {
    const index = columns.get(column);
    return index === undefined ? "" : (cells[index] ?? "");
  };
  let isValid = true;
  function take<T>(field: CsvColumn, cell: Cell<T>): T | undefined {
    if ("value" in cell) return cell.value;
    errors.push({ line, field, message: cell.error });
    isValid = false;
    return undefined;
  }
  const name = take("name", readName(raw("name")));
  const kind = take("kind", readKind(raw("kind")));
  const zoneId = take("zone", readNamed(raw("zone"), context.zones, "zone"));
  const unicastAddress = take("unicast_address", readAddress(raw("unicast_address")));
  const elementCount = take("elements", readElements(raw("elements")));
  const buttons = take("buttons", readButtons(raw("buttons"), kind));
  const floorId = take("floor", readNamed(raw("floor"), context.floors, "floor"));
  const x = take("x_m", readMetres(raw("x_m")));
  const y = take("y_m", readMetres(raw("y_m")));
  if (!isValid) return null;
  const row = { line, name, kind, zoneId, unicastAddress, elementCount, buttons, floorId, x, y } as ParsedRow;

  if (row.unicastAddress !== null && row.unicastAddress + row.elementCount - 1 > UNICAST_MAX) {
    errors.push({ line, field: "unicast_address", message: `with ${row.elementCount} elements the device would run past ${formatAddress(UNICAST_MAX)}, the last unicast address` });
    return null;
  }
  if ((row.x === null) !== (row.y === null)) {
    errors.push({ line, field: row.x === null ? "x_m" : "y_m", message: "give x_m and y_m together, or leave both empty" });
    return null;
  }
  if (row.x !== null && row.floorId === null) {
    errors.push({ line, field: "floor", message: "a position (x_m, y_m) needs the floor it is on" });
    return null;
  }
  return row;
}

/** Errors go on the later line and name the earlier one, which is where people look first. */
function checkAcrossRows(rows: readonly ParsedRow[], context: CsvContext, errors: CsvError[]): void {
  const existingNames = new Map(context.existing.map((d) => [d.name.trim().toLowerCase(), d.name]));
  const seenNames = new Map<string, number>();
  const addressed: { line: number; range: { first: number; last: number } }[] = [];
  const existingRanges = context.existing.map((d) => ({ name: d.name, range: rangeOf(d) }));
  for (const row of rows) {
    const key = row.name.toLowerCase();
    const earlier = seenNames.get(key);
    if (earlier !== undefined) errors.push({ line: row.line, field: "name", message: `"${row.name}" is already used on line ${earlier}` });
    else if (existingNames.has(key)) errors.push({ line: row.line, field: "name", message: `a device named "${existingNames.get(key)}" is already on this site` });
    if (earlier === undefined) seenNames.set(key, row.line);

    if (row.unicastAddress === null) continue;
    const range = rangeOf({ unicastAddress: row.unicastAddress, elementCount: row.elementCount });
    const clashRow = addressed.find((a) => overlaps(a.range, range));
    const clashDevice = existingRanges.find((d) => overlaps(d.range, range));
    if (clashRow) errors.push({ line: row.line, field: "unicast_address", message: `${formatRange(range)} overlaps line ${clashRow.line} (${formatRange(clashRow.range)})` });
    else if (clashDevice) errors.push({ line: row.line, field: "unicast_address", message: `${formatRange(range)} overlaps "${clashDevice.name}" on this site (${formatRange(clashDevice.range)})` });
    addressed.push({ line: row.line, range });
  }
}

function capErrors(errors: CsvError[]): CsvError[] {
  const sorted = [...errors].sort((a, b) => a.line - b.line);
  if (sorted.length <= MAX_REPORTED_ERRORS) return sorted;
  const shown = sorted.slice(0, MAX_REPORTED_ERRORS);
  return [...shown, { line: 0, field: "file", message: `and ${sorted.length - MAX_REPORTED_ERRORS} more problems not listed; fix these and import again` }];
}

export type ExportDevice = Omit<InventoryDevice, "buttons" | "floorId" | "x" | "y" | "unicastAddress"> &
  Partial<Pick<InventoryDevice, "buttons" | "floorId" | "x" | "y">> & { unicastAddress: number | null; profile?: unknown };

/** The CSV parseDeviceCsv reads back to the same devices (CRLF, RFC 4180 quoting). */
export function devicesToCsv(devices: readonly ExportDevice[], zones: readonly NamedRecord[], floors: readonly NamedRecord[]): string {
  const nameOf = (records: readonly NamedRecord[], id: string | null | undefined, what: string) => {
    if (id === null || id === undefined) return "";
    const record = records.find((r) => r.id === id);
    if (!record) throw new Error(`${what} ${id} is not in the list given to devicesToCsv`);
    return guardFormula(record.name);
  };
  const lines = devices.map((d) => [
    guardFormula(d.name),
    d.kind,
    nameOf(zones, d.zoneId, "zone"),
    d.unicastAddress === null ? "" : formatAddress(d.unicastAddress),
    String(d.elementCount),
    d.kind === "kinetic-rocker" ? String(d.buttons ?? buttonsInProfile(d.profile) ?? "") : "",
    nameOf(floors, d.floorId, "floor"),
    d.x === null || d.x === undefined ? "" : String(d.x),
    d.y === null || d.y === undefined ? "" : String(d.y),
  ]);
  return Papa.unparse({ fields: [...CSV_COLUMNS], data: lines }, { newline: "\r\n" });
}

function buttonsInProfile(profile: unknown): 2 | 4 | undefined {
  const buttons = typeof profile === "object" && profile !== null ? (profile as { buttons?: unknown }).buttons : undefined;
  return buttons === 2 || buttons === 4 ? buttons : undefined;
}
