import { randomUUID } from "node:crypto";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import readline from "node:readline";
import { and, asc, count, desc, eq, gt, gte, inArray, lt, lte, or, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db";
import { serialisedWrite } from "@/db/write-lock";
import { devices, engineSteps, events } from "@/db/schema";
import type { DeviceEvent, StateChange, TraceEntry } from "@/lib/bus/types";
import { AppError } from "@/lib/errors";
import { createImportChecker, type ImportReport } from "@/lib/eventlog/check";
import type { EventFilter, EventRow } from "@/lib/validation/events";

export type { EventRow };


type StepOutput = { changes: StateChange[]; notices: unknown[]; commands: unknown[]; trace: TraceEntry[] };

async function deviceIdsOfZone(siteId: string, zoneId: string): Promise<string[]> {
  const rows = await getDb().select({ id: devices.id }).from(devices).where(and(eq(devices.siteId, siteId), eq(devices.zoneId, zoneId)));
  return rows.map((r) => r.id);
}

/** The WHERE of a filtered log; a zone becomes the list of its devices. */
async function whereOf(siteId: string, f: EventFilter): Promise<SQL> {
  const parts: SQL[] = [eq(events.siteId, siteId)];
  if (f.from !== undefined) parts.push(gte(events.at, f.from));
  if (f.to !== undefined) parts.push(lt(events.at, f.to));
  if (f.device) parts.push(eq(events.device, f.device));
  if (f.kind) parts.push(eq(events.kind, f.kind));
  if (f.zone) parts.push(inArray(events.device, await deviceIdsOfZone(siteId, f.zone)));
  return and(...parts)!;
}

function summarise(output: unknown): EventRow["outcome"] {
  const o = output as StepOutput | null;
  if (!o) return null;
  let fired = 0;
  let actions = 0;
  for (const e of o.trace) {
    for (const r of e.rules) if (r.passed) fired++;
    actions += e.actions.length;
  }
  return { fired, actions, changes: o.changes.length };
}

const rowColumns = { seq: events.seq, eventId: events.eventId, at: events.at, device: events.device, kind: events.kind, value: events.value, source: events.source, output: engineSteps.output };

/**
 * A page of the log, newest first, strictly before the cursor (at, seq) — a
 * keyset page on the (site, at) index, so page 500 costs what page 1 costs.
 */
export async function listEvents({ siteId, filter, before, limit }: { siteId: string; filter: EventFilter; before?: { at: number; seq: number }; limit: number }): Promise<EventRow[]> {
  let where = await whereOf(siteId, filter);
  // The plain `at <= ?` lets SQLite range-scan the (site, at) index; the OR alone would not.
  if (before) where = and(where, lte(events.at, before.at), or(lt(events.at, before.at), lt(events.seq, before.seq)))!;
  const rows = await getDb()
    .select(rowColumns)
    .from(events)
    .leftJoin(engineSteps, eq(engineSteps.eventSeq, events.seq))
    .where(where)
    .orderBy(desc(events.at), desc(events.seq))
    .limit(limit);
  return rows.map(({ output, ...r }) => ({ ...r, outcome: summarise(output) }));
}

/** Events stored after `afterSeq` (the live tail), oldest first. */
export async function tailEvents({ siteId, filter, afterSeq, limit }: { siteId: string; filter: EventFilter; afterSeq: number; limit: number }): Promise<EventRow[]> {
  const where = and(await whereOf(siteId, filter), gt(events.seq, afterSeq));
  const rows = await getDb().select(rowColumns).from(events).leftJoin(engineSteps, eq(engineSteps.eventSeq, events.seq)).where(where).orderBy(asc(events.seq)).limit(limit);
  return rows.map(({ output, ...r }) => ({ ...r, outcome: summarise(output) }));
}

export async function countEvents({ siteId, filter }: { siteId: string; filter: EventFilter }): Promise<number> {
  const [row] = await getDb().select({ n: count() }).from(events).where(await whereOf(siteId, filter));
  return row?.n ?? 0;
}

/** The largest seq of the site's log (where a live tail starts). */
export async function lastEventSeq({ siteId }: { siteId: string }): Promise<number> {
  const [row] = await getDb().select({ seq: sql<number | null>`max(${events.seq})` }).from(events).where(eq(events.siteId, siteId));
  return row?.seq ?? 0;
}

/** One event and what the live engine did with it (its Trace), if it ran it. */
export async function getEventTrace({ siteId, seq }: { siteId: string; seq: number }) {
  const [row] = await getDb()
    .select({ ...rowColumns, stepAt: engineSteps.at, versionId: engineSteps.versionId })
    .from(events)
    .leftJoin(engineSteps, eq(engineSteps.eventSeq, events.seq))
    .where(and(eq(events.siteId, siteId), eq(events.seq, seq)));
  if (!row) return undefined;
  const { output, stepAt, versionId, ...event } = row;
  const o = output as StepOutput | null;
  return { event, step: o ? { at: stepAt, versionId, trace: o.trace, changes: o.changes, notices: o.notices, commands: o.commands } : null };
}

export type LogPageRow = DeviceEvent & { seq: number };

/**
 * Reads a window of the log in time order, a keyset page at a time on
 * (site, at, seq) — the (site, at) index carries the rowid — so memory holds
 * one page however long the window. Straight through the libSQL client: this is
 * the hot loop of Replay and export.
 */
export async function* readLogPages({ siteId, from, to, device, devices: deviceIds, kind, pageSize = 2000 }: { siteId: string; from: number; to: number; device?: string; devices?: string[]; kind?: string; pageSize?: number }): AsyncGenerator<LogPageRow[]> {
  const client = getDb().$client;
  const extra: string[] = [];
  const extraArgs: (string | number)[] = [];
  if (device) {
    extra.push("device = ?");
    extraArgs.push(device);
  }
  if (deviceIds) {
    if (!deviceIds.length) return;
    extra.push(`device IN (${deviceIds.map(() => "?").join(",")})`);
    extraArgs.push(...deviceIds);
  }
  if (kind) {
    extra.push("kind = ?");
    extraArgs.push(kind);
  }
  const filter = extra.length ? ` AND ${extra.join(" AND ")}` : "";
  let at = from;
  let seq = -1;
  for (;;) {
    const rs = await client.execute({
      sql: `SELECT seq, event_id, at, device, kind, value FROM events WHERE site_id = ? AND at >= ? AND (at > ? OR seq > ?) AND at < ?${filter} ORDER BY at, seq LIMIT ?`,
      args: [siteId, at, at, seq, to, ...extraArgs, pageSize],
    });
    if (!rs.rows.length) return;
    const page: LogPageRow[] = new Array(rs.rows.length);
    for (let i = 0; i < rs.rows.length; i++) {
      const r = rs.rows[i];
      const value = r[5] as string | null;
      page[i] = { seq: Number(r[0]), id: r[1] as string, siteId, at: Number(r[2]), device: r[3] as string, kind: r[4] as string, value: value === null ? null : (JSON.parse(value) as DeviceEvent["value"]) };
    }
    yield page;
    if (rs.rows.length < pageSize) return;
    const last = page[page.length - 1];
    at = last.at;
    seq = last.seq;
  }
}

/** Rows per multi-row INSERT: 8 columns × 500 stays well under SQLite's bound-variable limit. */
const INSERT_CHUNK = 500;

/**
 * Stores imported events (history, for Replay): idempotent by (site, event id),
 * an id already in the log is skipped. The live engine does not run them — see
 * DEVELOPERS.md "Event log and Replay". One short transaction per call, so a
 * big import goes in slices and other writers get the lock between them.
 */
export async function insertImportedEvents({ siteId, batch, receivedAt }: { siteId: string; batch: DeviceEvent[]; receivedAt: number }): Promise<{ inserted: number; skipped: number }> {
  if (!batch.length) return { inserted: 0, skipped: 0 };
  return serialisedWrite(() => getDb().transaction(async (tx) => {
    let inserted = 0;
    for (let i = 0; i < batch.length; i += INSERT_CHUNK) {
      const rows = batch.slice(i, i + INSERT_CHUNK).map((e) => ({ siteId, eventId: e.id, at: e.at, device: e.device, kind: e.kind, value: e.value, source: "import" as const, receivedAt }));
      const done = await tx.insert(events).values(rows).onConflictDoNothing().returning({ seq: events.seq });
      inserted += done.length;
    }
    return { inserted, skipped: batch.length - inserted };
  }));
}

export type ImportOutcome = { report: ImportReport; inserted: number; skipped: number; isWritten: boolean };

/**
 * Imports an event log file from a byte stream without holding it in memory:
 * pass 1 parses and checks every line as it arrives and spools the valid
 * events to a temporary file; only when the whole file has been read — and
 * either no line had a problem or `acceptValid` is set — pass 2 writes the
 * spool in slices of 2,000 events. So a bad line anywhere means nothing is
 * written, and the server turns to other requests between chunks and slices.
 */
export async function importEventStream({ siteId, body, format, mode, acceptValid, maxBytes, now = Date.now() }: { siteId: string; body: ReadableStream<Uint8Array>; format: "ndjson" | "csv"; mode: "check" | "commit"; acceptValid: boolean; maxBytes: number; now?: number }): Promise<ImportOutcome> {
  const siteDevices = await getDb().select().from(devices).where(eq(devices.siteId, siteId));
  const checker = createImportChecker({ siteId, devices: siteDevices, now, format });
  const spoolPath = mode === "commit" ? path.join(os.tmpdir(), `joulepath-import-${randomUUID()}.ndjson`) : null;
  const spool = spoolPath ? fs.createWriteStream(spoolPath) : null;
  const write = async (batch: DeviceEvent[]) => {
    if (!spool || !batch.length) return;
    let text = "";
    for (const e of batch) text += `${JSON.stringify(e)}\n`;
    if (!spool.write(text)) await new Promise<void>((resolve) => spool.once("drain", () => resolve()));
  };
  const cleanup = () => {
    if (spoolPath) fs.rmSync(spoolPath, { force: true });
  };

  try {
    const reader = body.getReader();
    const decoder = new TextDecoder("utf-8");
    let bytes = 0;
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      bytes += value.byteLength;
      if (bytes > maxBytes) {
        await reader.cancel().catch(() => undefined);
        throw new AppError("too_large", `The file is larger than ${Math.round(maxBytes / 1024 / 1024)} MiB; split it by date and import the parts (repeated events are skipped, so overlaps do no harm).`);
      }
      await write(checker.push(decoder.decode(value, { stream: true })));
    }
    await write(checker.push(decoder.decode()));
    await write(checker.end());
    if (spool) await new Promise<void>((resolve, reject) => spool.end((err?: Error | null) => (err ? reject(err) : resolve())));
    const report = checker.report();
    if (mode === "check" || (report.errorCount > 0 && !acceptValid) || report.valid === 0) return { report, inserted: 0, skipped: 0, isWritten: false };

    let inserted = 0;
    let skipped = 0;
    let batch: DeviceEvent[] = [];
    const receivedAt = Date.now();
    const flush = async () => {
      const r = await insertImportedEvents({ siteId, batch, receivedAt });
      inserted += r.inserted;
      skipped += r.skipped;
      batch = [];
    };
    const lines = readline.createInterface({ input: fs.createReadStream(spoolPath!), crlfDelay: Infinity });
    for await (const line of lines) {
      if (!line) continue;
      batch.push(JSON.parse(line) as DeviceEvent);
      if (batch.length >= 2000) await flush();
    }
    await flush();
    return { report, inserted, skipped, isWritten: true };
  } finally {
    spool?.destroy();
    cleanup();
  }
}
