import type { DeviceEvent } from "@/lib/bus/types";
import { validateGatewayEvents, type SiteDevice } from "@/lib/gateway/validate-events";
import { createLogParser, type LineError, type LogFormat, type RawLine } from "./parse";

/** Problems listed in full; past this only counted, so a file of garbage cannot fill memory. */
export const MAX_REPORTED_ERRORS = 200;
const MAX_REPORTED_ORDER = 20;

export type ImportReport = {
  /** Lines read, blank ones included. */
  lines: number;
  valid: number;
  errorCount: number;
  errors: LineError[];
  /**
   * Lines whose time is earlier than the valid line before them. They are kept
   * and sorted (the log is stored and replayed in time order), not rejected.
   */
  outOfOrder: { count: number; lines: number[] };
  earliest: number | null;
  latest: number | null;
};

/**
 * Parses and checks an event log file as it streams: each line against the
 * site's devices (the same rules as the gateway API: device by id or unicast
 * address, a kind it reports, a value in range, not in the future).
 * `push`/`end` hand back the valid events of the lines read so far.
 */
export function createImportChecker({ siteId, devices, now, format }: { siteId: string; devices: SiteDevice[]; now: number; format: LogFormat }) {
  const parser = createLogParser(format);
  const report: ImportReport = { lines: 0, valid: 0, errorCount: 0, errors: [], outOfOrder: { count: 0, lines: [] }, earliest: null, latest: null };
  let lastAt = -Infinity;

  const fail = (e: LineError) => {
    report.errorCount++;
    if (report.errors.length < MAX_REPORTED_ERRORS) report.errors.push(e);
  };

  function check(items: RawLine[], errors: LineError[]): DeviceEvent[] {
    for (const e of errors) fail(e);
    if (!items.length) return [];
    const { events, errors: itemErrors } = validateGatewayEvents(
      items.map((i) => i.item),
      { siteId, devices, now },
    );
    const bad = new Set<number>();
    for (const e of itemErrors) {
      bad.add(e.index);
      fail({ line: items[e.index].line, field: e.field, message: e.message });
    }
    const lines = items.filter((_, i) => !bad.has(i)).map((i) => i.line);
    events.forEach((ev, i) => {
      if (ev.at < lastAt) {
        report.outOfOrder.count++;
        if (report.outOfOrder.lines.length < MAX_REPORTED_ORDER) report.outOfOrder.lines.push(lines[i]);
      } else lastAt = ev.at;
      if (report.earliest === null || ev.at < report.earliest) report.earliest = ev.at;
      if (report.latest === null || ev.at > report.latest) report.latest = ev.at;
    });
    report.valid += events.length;
    return events;
  }

  return {
    push(text: string): DeviceEvent[] {
      const { items, errors } = parser.push(text);
      return check(items, errors);
    },
    end(): DeviceEvent[] {
      const { items, errors } = parser.end();
      const events = check(items, errors);
      report.lines = parser.lines;
      return events;
    },
    report(): ImportReport {
      return { ...report, lines: parser.lines, errors: [...report.errors].sort((a, b) => a.line - b.line) };
    },
  };
}

/** One paragraph for people: what was found and what happens next. */
export function describeReport(r: ImportReport): string {
  const parts = [`${r.valid} valid event${r.valid === 1 ? "" : "s"} in ${r.lines} line${r.lines === 1 ? "" : "s"}`];
  if (r.errorCount) parts.push(`${r.errorCount} line${r.errorCount === 1 ? "" : "s"} with problems`);
  if (r.outOfOrder.count) parts.push(`${r.outOfOrder.count} line${r.outOfOrder.count === 1 ? " is" : "s are"} earlier than the line before (first: line ${r.outOfOrder.lines[0]}); they are sorted into time order, not rejected`);
  return `${parts.join("; ")}.`;
}
