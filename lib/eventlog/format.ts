import Papa from "papaparse";
import { EVENT_COLUMNS } from "./parse";

/** A stored event as exported: what the import reads back unchanged. */
export type ExportEvent = { id: string; at: number; device: string; kind: string; value: number | boolean | string | null };

export function toNdjsonLine(e: ExportEvent): string {
  return `${JSON.stringify({ id: e.id, at: e.at, device: e.device, kind: e.kind, value: e.value })}\n`;
}

export const CSV_HEADER = `${EVENT_COLUMNS.join(",")}\n`;

/** `at` as ISO 8601 UTC so a spreadsheet shows a time; the import reads it back to the millisecond. */
export function toCsvLine(e: ExportEvent): string {
  const value = e.value === null ? "" : String(e.value);
  return `${Papa.unparse([[e.id, new Date(e.at).toISOString(), e.device, e.kind, value]], { header: false, newline: "\n" })}\n`;
}

export function exportFileName(siteName: string, format: "ndjson" | "csv", from?: number, to?: number): string {
  const base = siteName.replace(/[^A-Za-z0-9-]+/g, "-").replace(/^-|-$/g, "").toLowerCase() || "site";
  const day = (ms: number) => new Date(ms).toISOString().slice(0, 10);
  const span = from !== undefined || to !== undefined ? `-${from !== undefined ? day(from) : "start"}_${to !== undefined ? day(to) : "now"}` : "";
  return `${base}-events${span}.${format}`;
}
