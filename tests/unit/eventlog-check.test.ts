import { describe, expect, it } from "vitest";
import { demoDevices } from "@/db/seed/demo-site";
import type { DeviceEvent } from "@/lib/bus/types";
import { createImportChecker, describeReport } from "@/lib/eventlog/check";
import { CSV_HEADER, exportFileName, toCsvLine, toNdjsonLine } from "@/lib/eventlog/format";
import { demoNightLog } from "@/lib/replay/demo-night";
import type { SiteDevice } from "@/lib/gateway/validate-events";

const devices = demoDevices.map((d) => ({ ...d, elementCount: d.elementCount ?? 1 })) as SiteDevice[];
const NOW = Date.UTC(2025, 0, 1);

function check(format: "ndjson" | "csv", text: string) {
  const c = createImportChecker({ siteId: "larch-lane", devices, now: NOW, format });
  const events: DeviceEvent[] = [];
  for (let i = 0; i < text.length; i += 100) events.push(...c.push(text.slice(i, i + 100)));
  events.push(...c.end());
  return { events, report: c.report() };
}

describe("import check", () => {
  it("an NDJSON export reads back as the same events", () => {
    const log = demoNightLog();
    const { events, report } = check("ndjson", log.map(toNdjsonLine).join(""));
    expect(report.errorCount).toBe(0);
    expect(events).toEqual(log);
    expect(report).toMatchObject({ valid: log.length, lines: log.length, earliest: log[0].at, latest: log[log.length - 1].at });
  });

  it("a CSV export (ISO times) reads back as the same events, to the millisecond", () => {
    const log = demoNightLog().map((e, i) => ({ ...e, at: e.at + i }));
    const { events, report } = check("csv", CSV_HEADER + log.map(toCsvLine).join(""));
    expect(report.errors).toEqual([]);
    expect(events).toEqual(log);
  });

  it("unknown devices, kinds a device does not report and bad values get their line; valid lines still count", () => {
    const lines = [
      { id: "ok", at: 1_700_000_000_000, device: "larch-lane-dev-sensor-path", kind: "motion", value: true },
      { id: "ghost", at: 1_700_000_000_001, device: "larch-lane-dev-nothing", kind: "motion", value: true },
      { id: "wrong-kind", at: 1_700_000_000_002, device: "larch-lane-dev-sensor-path", kind: "temperature", value: 20 },
      { id: "too-bright", at: 1_700_000_000_003, device: "larch-lane-dev-lux-window", kind: "light-level", value: 9_000_000 },
      { id: "extra", at: 1_700_000_000_004, device: "0x0001", kind: "press", value: 1, colour: "red" },
      { id: "future", at: NOW + 3_600_000, device: "larch-lane-dev-sensor-path", kind: "motion", value: true },
      { id: "by-address", at: 1_700_000_000_005, device: "0x0001", kind: "press", value: 1 },
    ];
    const { events, report } = check("ndjson", lines.map((l) => JSON.stringify(l)).join("\n"));
    expect(events.map((e) => e.id)).toEqual(["ok", "by-address"]);
    expect(events[1].device).toBe("larch-lane-dev-rocker-shop-door");
    expect(report.errors.map((e) => [e.line, e.field])).toEqual([
      [2, "device"],
      [3, "kind"],
      [4, "value"],
      [5, "event"],
      [6, "at"],
    ]);
    expect(report.errors[0].message).toMatch(/no device "larch-lane-dev-nothing"/);
    expect(describeReport(report)).toMatch(/^2 valid events in 7 lines; 5 lines with problems\.$/);
  });

  it("lines earlier than the line before are kept (sorted later) and named", () => {
    const log = demoNightLog();
    const shuffled = [log[0], log[2], log[1], log[3], log[5], log[4]];
    const { events, report } = check("ndjson", shuffled.map(toNdjsonLine).join(""));
    expect(events).toHaveLength(6);
    expect(report.outOfOrder).toEqual({ count: 2, lines: [3, 6] });
    expect(describeReport(report)).toMatch(/2 lines are earlier than the line before \(first: line 3\); they are sorted/);
  });

  it("a file name for the export", () => {
    expect(exportFileName("Larch Lane Studio", "csv", Date.UTC(2024, 10, 12), Date.UTC(2024, 10, 13))).toBe("larch-lane-studio-events-2024-11-12_2024-11-13.csv");
    expect(exportFileName("Larch Lane Studio", "ndjson")).toBe("larch-lane-studio-events.ndjson");
  });
});

import { formatSiteTime, instantToLocalInput, localInputToInstant } from "@/lib/eventlog/local-input";

describe("site-time inputs", () => {
  it("reads a datetime-local value on the site's clock, summer time included", () => {
    // WET is UTC+0 in November and UTC+1 in June (EU summer-time rules; common practice, no source).
    expect(localInputToInstant("2024-11-12T03:12", "WET")).toBe(Date.UTC(2024, 10, 12, 3, 12));
    expect(localInputToInstant("2024-06-20T03:12", "WET")).toBe(Date.UTC(2024, 5, 20, 2, 12));
    expect(localInputToInstant("yesterday", "WET")).toBeNull();
    expect(instantToLocalInput(Date.UTC(2024, 5, 20, 2, 12), "WET")).toBe("2024-06-20T03:12");
    expect(formatSiteTime(Date.UTC(2024, 10, 13, 3, 12, 5), "WET")).toBe("13 Nov 2024 03:12:05");
  });
});
