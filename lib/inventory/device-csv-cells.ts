import { DEVICE_KINDS, type DeviceKind } from "@/lib/catalogue/device-kinds";
import { formatAddress, UNICAST_MAX, UNICAST_MIN } from "@/lib/mesh/address";

/**
 * Reading one cell of a device CSV: each function returns the value or a
 * message in plain words that names what to write instead. Kept apart from the
 * row and file logic so each rule can be read and tested on its own.
 */
export type Cell<T> = { value: T } | { error: string };

export const MAX_NAME_LENGTH = 100;
/** Number of Elements is one octet, 1–255, in the provisioning capabilities (Mesh Profile 1.0.1 §5.4.1.2, from memory). */
export const MAX_ELEMENTS = 255;
/** Positions beyond 1 km are a small building's plan only if the unit is wrong (usually millimetres). */
export const MAX_POSITION_M = 1000;

export type NamedRecord = { id: string; name: string };

// Spreadsheets run a cell starting with = + - @ as a formula (CSV injection, OWASP).
// The export puts an apostrophe in front, and the import takes exactly one off again.
const FORMULA_GUARDED = /^'*[=+\-@]/;
export const guardFormula = (text: string) => (FORMULA_GUARDED.test(text) ? `'${text}` : text);
export const unguardFormula = (text: string) => (/^'+[=+\-@]/.test(text) ? text.slice(1) : text);

export const cleanText = (raw: string) => unguardFormula(raw.trim()).normalize("NFC");

export function readName(raw: string): Cell<string> {
  const name = cleanText(raw);
  if (name === "") return { error: "is required" };
  if (name.length > MAX_NAME_LENGTH) return { error: `is longer than ${MAX_NAME_LENGTH} characters` };
  if (/[\u0000-\u001f\u007f]/.test(name)) return { error: "cannot contain line breaks, tabs or other control characters" };
  return { value: name };
}

export function readKind(raw: string): Cell<DeviceKind> {
  const kind = raw.trim().toLowerCase();
  if (kind === "") return { error: `is required; use one of: ${DEVICE_KINDS.join(", ")}` };
  if ((DEVICE_KINDS as readonly string[]).includes(kind)) return { value: kind as DeviceKind };
  return { error: `"${raw.trim()}" is not a device kind; use one of: ${DEVICE_KINDS.join(", ")}` };
}

/** Finds a zone or floor by name: an exact match first, then one that differs only in letter case. */
export function readNamed(raw: string, records: readonly NamedRecord[], what: "zone" | "floor"): Cell<string | null> {
  const name = cleanText(raw);
  if (name === "") return { value: null };
  const exact = records.find((r) => r.name === name);
  if (exact) return { value: exact.id };
  const loose = records.filter((r) => r.name.toLowerCase() === name.toLowerCase());
  if (loose.length === 1) return { value: loose[0].id };
  const known = records.length === 0 ? `this site has no ${what}s yet` : `${what}s here: ${records.map((r) => r.name).join(", ")}`;
  return { error: `no ${what} is named "${name}" (${known})` };
}

export function readAddress(raw: string): Cell<number | null> {
  const text = raw.trim();
  if (text === "") return { value: null };
  const address = /^0x[0-9a-f]+$/i.test(text) ? parseInt(text.slice(2), 16) : /^\d+$/.test(text) ? parseInt(text, 10) : NaN;
  if (Number.isNaN(address)) return { error: `"${text}" is not an address; write hex like 0x0012, a decimal number, or leave it empty to assign one` };
  if (address < UNICAST_MIN || address > UNICAST_MAX) {
    return { error: `${text} is outside the unicast range ${formatAddress(UNICAST_MIN)}–${formatAddress(UNICAST_MAX)} (Mesh Profile 1.0.1 §3.4.2)` };
  }
  return { value: address };
}

export function readElements(raw: string): Cell<number> {
  const text = raw.trim();
  if (text === "") return { value: 1 };
  const count = /^\d+$/.test(text) ? parseInt(text, 10) : NaN;
  if (!(count >= 1 && count <= MAX_ELEMENTS)) return { error: `must be a whole number from 1 to ${MAX_ELEMENTS}` };
  return { value: count };
}

export function readButtons(raw: string, kind: DeviceKind | undefined): Cell<2 | 4 | null> {
  const text = raw.trim();
  if (text === "") return { value: null };
  if (kind !== undefined && kind !== "kinetic-rocker") return { error: "only rockers have buttons; leave it empty" };
  if (text === "2" || text === "4") return { value: Number(text) as 2 | 4 };
  return { error: "must be 2 or 4" };
}

export function readMetres(raw: string): Cell<number | null> {
  const text = raw.trim();
  if (text === "") return { value: null };
  if (/^\d+,\d+$/.test(text)) return { error: `use a point for decimals (${text.replace(",", ".")}), not a comma` };
  if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(text)) return { error: `"${text}" is not a number of metres` };
  const metres = Number(text);
  if (metres < 0) return { error: "must be 0 or more (metres from the plan's top-left corner)" };
  if (metres > MAX_POSITION_M) return { error: `is more than ${MAX_POSITION_M} m — is it in millimetres?` };
  return { value: metres };
}
