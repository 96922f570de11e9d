import { and, asc, eq, gt, inArray, isNull, lt, lte, or } from "drizzle-orm";
import { getDb } from "@/db";
import { serialisedWrite } from "@/db/write-lock";
import { devices, engineStates, engineSteps, gatewayCommands, noticesOutbox, ruleSets, ruleSetVersions, scenes, sites, zones } from "@/db/schema";
import type { InValue, Transaction as LibsqlTransaction } from "@libsql/client";
import { createReplayEngine, type ReplayEngine } from "@/lib/bus/engine";
import { toSiteInput } from "@/lib/bus/site-input";
import type { SiteInput } from "@/lib/bus/site-model";
import type { DeviceEvent, EngineState, GatewayCommand, Notice, SceneConfig, Step } from "@/lib/bus/types";
import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import { buildRuleIndex, type RuleIndex } from "@/lib/rules/rule-index";
import type { RuleJson } from "@/lib/rules/compile";
import { AppError } from "@/lib/errors";

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

/**
 * The libSQL transaction under a Drizzle transaction, for the hot multi-row
 * INSERTs in plain SQL. It must be this one — the same connection and the same
 * BEGIN IMMEDIATE — or a failure part-way would leave rows behind (a second
 * connection would not even get the write lock). Drizzle keeps it on the
 * transaction's session (`LibSQLSession.tx`, drizzle-orm/libsql/session.js);
 * that is not public API, so an upgrade that moves it fails here, loudly.
 */
function rawTx(tx: Tx): LibsqlTransaction {
  const raw = (tx as unknown as { session?: { tx?: Partial<LibsqlTransaction> } }).session?.tx;
  if (!raw || typeof raw.execute !== "function" || typeof raw.commit !== "function") throw new Error("drizzle-orm/libsql no longer keeps its libSQL transaction at tx.session.tx: see rawTx in db/queries/live.ts.");
  return raw as LibsqlTransaction;
}

/** The site as the engine sees it, and the active version's rules (none active: no rules). */
export async function loadEngineInput(siteId: string) {
  const db = getDb();
  const [site] = await db.select().from(sites).where(eq(sites.id, siteId));
  if (!site) throw new AppError("not_found", "No such site.");
  const [deviceRows, zoneRows, sceneRows, [ruleSet]] = await Promise.all([
    // Explicit orders (the ones the unique indexes gave before): the engine keeps the order it is given (lib/bus/site-model.ts).
    db.select().from(devices).where(eq(devices.siteId, siteId)).orderBy(asc(devices.unicastAddress)),
    db.select().from(zones).where(eq(zones.siteId, siteId)).orderBy(asc(zones.name)),
    db.select().from(scenes).where(eq(scenes.siteId, siteId)).orderBy(asc(scenes.name)),
    db.select().from(ruleSets).where(eq(ruleSets.siteId, siteId)),
  ]);
  // Only the compiled rules: the version's graph is for the Canvas, not the engine.
  const [version] = ruleSet?.activeVersionId ? await db.select({ id: ruleSetVersions.id, rules: ruleSetVersions.rules }).from(ruleSetVersions).where(eq(ruleSetVersions.id, ruleSet.activeVersionId)) : [];
  const input = toSiteInput({ site, devices: deviceRows, zones: zoneRows, scenes: sceneRows.map((s) => ({ number: s.number, name: s.name, fadeMs: s.fadeMs, levels: s.levels })) });
  return { input, rules: (version?.rules ?? []) as RuleJson[], versionId: version?.id ?? null, devices: deviceRows };
}

type LiveInput = { input: SiteInput; rules: RuleIndex; versionId: string | null };
type LiveInputCacheEntry = LiveInput & { texts: unknown[] };

/** Built inputs per site, reused only while every text they were built from reads back identical. */
const liveInputs = new Map<string, LiveInputCacheEntry>();
const LIVE_INPUT_SITES = 32;

/**
 * What `loadEngineInput` reads (same columns, same order), in one statement on
 * the write transaction, as raw JSON text. Parsing it and indexing the rules is
 * what costs, so the built input is kept and reused while the texts read back
 * byte-identical: a change to the site, a device, zone, scene or the active
 * version shows up in them, and there is nothing else to invalidate. The
 * rules' text is read only when the active version is not the cached one:
 * a version is never rewritten (db/queries/rule-sets.ts inserts a new one for
 * every activation), and reading it each call was a third of this statement.
 * `tests/integration/ingest-atomic.test.ts` checks it equals loadEngineInput's.
 */
async function loadLiveInput(raw: LibsqlTransaction, siteId: string): Promise<LiveInput> {
  const cached = liveInputs.get(siteId);
  const rs = await raw.execute({
    sql: `select s.time_zone, s.latitude, s.longitude,
      (select json_group_array(json_array(d.id, d.kind, d.zone_id, d.unicast_address, d.name) order by d.unicast_address) from devices d where d.site_id = s.id),
      (select json_group_array(json_array(z.id, z.group_address, z.name) order by z.name) from zones z where z.site_id = s.id),
      (select json_group_array(json_array(c.number, c.name, c.fade_ms, json(c.levels)) order by c.name) from scenes c where c.site_id = s.id),
      v.id, case when v.id = ? then null else v.rules end
      from sites s left join rule_sets r on r.site_id = s.id left join rule_set_versions v on v.id = r.active_version_id
      where s.id = ?`,
    args: [cached?.versionId ?? null, siteId],
  });
  const row = rs.rows[0];
  if (!row) throw new AppError("not_found", "No such site.");
  const texts = Array.from({ length: 7 }, (_, i) => row[i]);
  if (cached && cached.texts.every((t, i) => t === texts[i])) return cached;
  const [timeZone, latitude, longitude, deviceJson, zoneJson, sceneJson, versionId] = texts as [string, number, number, string, string, string, string | null];
  const rulesJson = row[7] as string | null;
  const sameVersion = cached !== undefined && versionId !== null && cached.versionId === versionId;
  const input = toSiteInput({
    site: { timeZone, latitude, longitude },
    devices: (JSON.parse(deviceJson) as [string, DeviceKind, string | null, number, string][]).map(([id, kind, zoneId, unicastAddress, name]) => ({ id, kind, zoneId, unicastAddress, name })),
    zones: (JSON.parse(zoneJson) as [string, number, string][]).map(([id, groupAddress, name]) => ({ id, groupAddress, name })),
    scenes: (JSON.parse(sceneJson) as [number, string, number, SceneConfig["levels"]][]).map(([number, name, fadeMs, levels]) => ({ number, name, fadeMs, levels })),
  });
  const entry = { input, rules: sameVersion ? cached.rules : buildRuleIndex(rulesJson === null ? [] : (JSON.parse(rulesJson) as RuleJson[])), versionId, texts };
  liveInputs.delete(siteId);
  liveInputs.set(siteId, entry);
  if (liveInputs.size > LIVE_INPUT_SITES) liveInputs.delete(liveInputs.keys().next().value!);
  return entry;
}

/** A click on a notice opens the site's overview. */
const outboxUrl = (siteId: string) => `/sites/${siteId}`;

/** An outbox row for one notice. */
function outboxRow(siteId: string, n: Notice) {
  return { siteId, dedupeKey: n.dedupeKey, recipient: n.recipient, channels: n.channels, text: n.text, at: n.at, kind: n.kind, zoneId: n.zoneId, url: outboxUrl(siteId) };
}

function nextDue(state: EngineState): number | null {
  let min: number | null = null;
  for (const t of state.timers.entries) if (min === null || t.due < min) min = t.due;
  return min;
}

/** Stores one step and what it produced; returns the commands with their sequence numbers. */
async function storeStep(tx: Tx, siteId: string, step: Step, eventSeq: number | null, versionId: string | null) {
  const [row] = await tx
    .insert(engineSteps)
    .values({ siteId, eventSeq, at: step.at, versionId, output: outputOf(step) })
    .returning({ seq: engineSteps.seq });
  const commands: (GatewayCommand & { seq: number })[] = [];
  for (const command of step.commands) {
    const [c] = await tx.insert(gatewayCommands).values({ siteId, stepSeq: row.seq, at: command.at, command }).returning({ seq: gatewayCommands.seq });
    commands.push({ ...command, seq: c.seq });
  }
  if (step.notices.length) {
    await tx
      .insert(noticesOutbox)
      .values(step.notices.map((n) => outboxRow(siteId, n)))
      .onConflictDoNothing();
  }
  return { stepSeq: row.seq, commands };
}

/**
 * Runs `work` on the site's live engine inside one write transaction: state,
 * events, steps, commands and notices go in together or not at all, so a crash
 * mid-way loses nothing and applies nothing twice. Writers are serialised by the
 * database's write lock; the revision check guards against a stale read anyway.
 */
async function withLiveEngine<T>(siteId: string, work: (engine: LiveEngine, tx: Tx, versionId: string | null) => Promise<T>): Promise<T> {
  return serialisedWrite(() => runLive(siteId, work));
}

/**
 * The live store runs the engine with the rules compiled to closures
 * (`createReplayEngine`, with its trace): the same loop as `createEngine`,
 * synchronous, and `tests/unit/engine-differential.test.ts` holds the two
 * evaluators to identical steps on recorded and random streams. The rule JSON
 * stays the stored and reference form, and the Test bench still runs it through
 * json-rules-engine (`createEngine`); here that evaluator was a third of a
 * 500-event batch (bench/ingest.ts).
 */
type LiveEngine = ReplayEngine;

/** The site's input and its engine state, read on the write transaction; `createLiveEngine` builds the engine from them. */
export async function openLive(tx: Tx, siteId: string) {
  const raw = rawTx(tx);
  const loaded = await loadLiveInput(raw, siteId);
  const rs = await raw.execute({ sql: "select state, revision from engine_states where site_id = ?", args: [siteId] });
  const row = rs.rows[0] ? { state: JSON.parse(rs.rows[0][0] as string) as EngineState, revision: Number(rs.rows[0][1]) } : null;
  return { ...loaded, row };
}

export function createLiveEngine(opened: Awaited<ReturnType<typeof openLive>>): LiveEngine {
  return createReplayEngine({ ...opened.input, rules: opened.rules, state: opened.row?.state });
}

async function runLive<T>(siteId: string, work: (engine: LiveEngine, tx: Tx, versionId: string | null) => Promise<T>): Promise<T> {
  return getDb().transaction(async (tx) => {
    const opened = await openLive(tx, siteId);
    const engine = createLiveEngine(opened);
    const result = await work(engine, tx, opened.versionId);
    const state = engine.getState();
    const { row } = opened;
    const values = [JSON.stringify(state), opened.versionId, nextDue(state), Date.now(), (row?.revision ?? 0) + 1, siteId];
    if (row) {
      const updated = await rawTx(tx).execute({ sql: "update engine_states set state = ?, version_id = ?, next_timer_at = ?, updated_at = ?, revision = ? where site_id = ? and revision = ?", args: [...values, row.revision] });
      if (!updated.rowsAffected) throw new AppError("conflict", "The site's state changed while this ran; try again.");
    } else {
      await rawTx(tx).execute({ sql: "insert into engine_states (state, version_id, next_timer_at, updated_at, revision, site_id) values (?, ?, ?, ?, ?, ?)", args: values });
    }
    return result;
  });
}

export type IngestResult = { accepted: { id: string; stepSeq: number }[]; duplicates: string[]; commands: (GatewayCommand & { seq: number })[] };

/** Bound parameters per statement: SQLite allows 32,766. */
const MAX_ARGS = 32_000;

/** A cell written into the SQL text instead of bound: a seq numbered in this transaction. */
type Seq = { seq: number };
const sqlInteger = ({ seq }: Seq) => {
  if (!Number.isSafeInteger(seq)) throw new Error(`Not a sequence number: ${seq}`);
  return String(seq);
};

/**
 * Multi-row INSERT of `rows` in as few statements as the parameter limit
 * allows. The values every row shares (`shared`) are bound once, as ?1, ?2 …
 * (their columns come first, so that the plain ? after them number on from
 * there); seqs are written into the SQL; the rest is bound per row. Against
 * binding every cell this is ≈20 % less for the steps (fewer values for the
 * driver to convert and SQLite to bind); `then` ends each statement (an ON
 * CONFLICT clause).
 */
async function insertRows(raw: LibsqlTransaction, table: string, shared: [string, InValue][], columns: string[], rows: (InValue | Seq)[][], then = "") {
  const head = shared.map((_, i) => `?${i + 1}`);
  const names = [...shared.map(([c]) => c), ...columns].map((c) => `"${c}"`).join(", ");
  const per = Math.floor((MAX_ARGS - shared.length) / Math.max(1, columns.length));
  for (let i = 0; i < rows.length; i += per) {
    const args: InValue[] = shared.map(([, v]) => v);
    const tuples: string[] = [];
    for (const row of rows.slice(i, i + per)) {
      const cells = [...head];
      for (const cell of row) {
        if (cell !== null && typeof cell === "object" && "seq" in cell) cells.push(sqlInteger(cell));
        else {
          cells.push("?");
          args.push(cell);
        }
      }
      tuples.push(`(${cells.join(",")})`);
    }
    await raw.execute({ sql: `insert into "${table}" (${names}) values ${tuples.join(", ")}${then}`, args });
  }
}

/**
 * Text as the driver binds it: a lone UTF-16 surrogate (JSON.parse of a
 * request body can make one) becomes U+FFFD. Text sent to SQLite inside a JSON
 * argument must be made so first: json_each would decode "\ud800" into bytes
 * that are not UTF-8, which no other path stores and which libsql cannot read
 * back (it panics).
 */
const asBound = (text: string) => text.toWellFormed();

/**
 * The seq the next row of each AUTOINCREMENT table gets: one past the largest
 * ever used (sqlite_sequence) or present, as SQLite itself picks it. Valid only
 * inside the write transaction, where no one else can insert.
 */
async function nextSeqs(raw: LibsqlTransaction) {
  const one = (t: string) => `max(coalesce((select seq from sqlite_sequence where name = '${t}'), 0), coalesce((select max(seq) from "${t}"), 0)) + 1`;
  const r = (await raw.execute(`select ${one("events")}, ${one("engine_steps")}, ${one("gateway_commands")}`)).rows[0];
  return { events: Number(r[0]), steps: Number(r[1]), commands: Number(r[2]) };
}

/** What Drizzle writes for a `mode: "json"` text column (db/schema.ts): JSON.stringify, and NULL for null. */
const jsonText = (v: unknown): string | null => (v === null || v === undefined ? null : JSON.stringify(v));

/**
 * The ids of `ids` already in the site's event log: one bound JSON array, each
 * id looked up in the (site_id, event_id) index: a third of the time of binding
 * 500 ids as parameters (≈0.16 against 0.45 ms), and no parameter limit.
 */
async function storedEventIds(tx: Tx, siteId: string, ids: string[]): Promise<Set<string>> {
  const rs = await rawTx(tx).execute({ sql: "select event_id from events where site_id = ? and event_id in (select value from json_each(?))", args: [siteId, JSON.stringify(ids.map(asBound))] });
  return new Set(rs.rows.map((r) => r[0] as string));
}

const NOTICE_COLUMNS = ["dedupe_key", "recipient", "channels", "text", "at", "kind", "zone_id"];

/** An outbox row's own values as Drizzle binds them (db/schema.ts; kind's JS-side default "other"), in NOTICE_COLUMNS order. */
function noticeValues(n: Notice): InValue[] {
  return [n.dedupeKey, n.recipient, jsonText(n.channels), n.text, n.at, n.kind === undefined ? "other" : n.kind, n.zoneId ?? null];
}

/**
 * Writes new events, the step each produced and what the steps produced, on
 * the write transaction `tx`: events, steps and commands as multi-row INSERTs
 * in plain SQL with their seqs numbered here in VALUES order, exactly as
 * AUTOINCREMENT would number them (no RETURNING, no per-value mapping), and
 * notices as a plain multi-row INSERT … ON CONFLICT DO NOTHING with the values
 * Drizzle would bind (a third of the time of Drizzle's builder). Exported for
 * bench/ingest.ts, which times it alone.
 *
 * Events go in as one bound JSON array unpacked by json_each (SQLite unpacks
 * small values faster than the driver binds them). Steps and commands do not:
 * their large JSON texts, nested as strings in an array, took SQLite longer to
 * parse and unescape (≈1.3–2× for steps) than binding them one by one.
 */
export async function writeIngested(tx: Tx, { siteId, source, versionId, events: fresh, steps, receivedAt }: { siteId: string; source: IngestSource; versionId: string | null; events: DeviceEvent[]; steps: Step[]; receivedAt: number }): Promise<Omit<IngestResult, "duplicates">> {
  const raw = rawTx(tx);
  const result: Omit<IngestResult, "duplicates"> = { accepted: [], commands: [] };
  const next = await nextSeqs(raw);
  const eventRows: [string, number, string, string, string | null][] = [];
  const stepRows: (InValue | Seq)[][] = [];
  const commandRows: (InValue | Seq)[][] = [];
  fresh.forEach((e, i) => {
    const eventSeq = next.events + i;
    const stepSeq = next.steps + i;
    const step = steps[i];
    eventRows.push([asBound(e.id), e.at, asBound(e.device), asBound(e.kind), jsonText(e.value)]);
    stepRows.push([{ seq: stepSeq }, { seq: eventSeq }, step.at, JSON.stringify(outputOf(step))]);
    for (const command of step.commands) {
      const seq = next.commands + result.commands.length;
      commandRows.push([{ seq }, { seq: stepSeq }, command.at, JSON.stringify(command)]);
      result.commands.push({ ...command, seq });
    }
    result.accepted.push({ id: e.id, stepSeq });
  });
  if (eventRows.length) {
    // One bound JSON array rather than 9 values a row: SQLite unpacks it faster than the driver binds them (bench/ingest.ts).
    // Each row's seq is given (? + key), so the rows are the same in any order: no ORDER BY (its sort cost ≈15 %).
    await raw.execute({
      sql: "insert into events (seq, site_id, event_id, at, device, kind, value, source, received_at) select ? + key, ?, value ->> 0, value ->> 1, value ->> 2, value ->> 3, value ->> 4, ?, ? from json_each(?)",
      args: [next.events, siteId, source, receivedAt, JSON.stringify(eventRows)],
    });
  }
  await insertRows(raw, "engine_steps", [["site_id", siteId], ["version_id", versionId]], ["seq", "event_seq", "at", "output"], stepRows);
  await insertRows(raw, "gateway_commands", [["site_id", siteId]], ["seq", "step_seq", "at", "command"], commandRows);
  // The columns Drizzle fills in JS get the values it would bind (status, created_at: db/schema.ts); url as outboxRow makes it.
  const outbox: [string, InValue][] = [["site_id", siteId], ["status", "pending"], ["url", outboxUrl(siteId)], ["created_at", Date.now()]];
  await insertRows(raw, "notices_outbox", outbox, NOTICE_COLUMNS, steps.flatMap((st) => st.notices.map(noticeValues)), " on conflict do nothing");
  return result;
}

type IngestSource = "gateway" | "bench" | "import" | "console";

/**
 * Stores new events (ids already seen are skipped) and runs each through the
 * active rules in time order, then writes them all at once (`writeIngested`),
 * in the one transaction.
 */
export async function ingestEvents({ siteId, batch, source }: { siteId: string; batch: DeviceEvent[]; source: IngestSource }): Promise<IngestResult> {
  const ordered = [...batch].sort((a, b) => a.at - b.at || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return withLiveEngine(siteId, async (engine, tx, versionId) => {
    const duplicates: string[] = [];
    const seen = await storedEventIds(tx, siteId, [...new Set(ordered.map((e) => e.id))]);
    const fresh: DeviceEvent[] = [];
    for (const event of ordered) {
      if (seen.has(event.id)) duplicates.push(event.id);
      else {
        seen.add(event.id);
        fresh.push(event);
      }
    }
    if (!fresh.length) return { accepted: [], duplicates, commands: [] };
    const steps = fresh.map((event) => engine.ingest(event));
    const written = await writeIngested(tx, { siteId, source, versionId, events: fresh, steps, receivedAt: Date.now() });
    return { accepted: written.accepted, duplicates, commands: written.commands };
  });
}

function outputOf(step: Step) {
  return { changes: step.changes, commands: step.commands, notices: step.notices, trace: step.trace };
}

/** Fires every timer due up to `to` (the worker, or a gateway heartbeat). */
export async function advanceSite({ siteId, to }: { siteId: string; to: number }): Promise<{ stepSeq: number | null; commands: (GatewayCommand & { seq: number })[] }> {
  return withLiveEngine(siteId, async (engine, tx, versionId) => {
    const step = engine.advanceTo(to);
    if (!step.changes.length && !step.commands.length && !step.notices.length && !step.trace.length) return { stepSeq: null, commands: [] };
    return storeStep(tx, siteId, step, null, versionId);
  });
}

export async function listCommandsAfter({ siteId, after, limit = 500 }: { siteId: string; after: number; limit?: number }) {
  return getDb()
    .select({ seq: gatewayCommands.seq, at: gatewayCommands.at, command: gatewayCommands.command })
    .from(gatewayCommands)
    .where(and(eq(gatewayCommands.siteId, siteId), gt(gatewayCommands.seq, after)))
    .orderBy(asc(gatewayCommands.seq))
    .limit(limit);
}

export async function getLiveState({ siteId }: { siteId: string }): Promise<EngineState | null> {
  const [row] = await getDb().select({ state: engineStates.state }).from(engineStates).where(eq(engineStates.siteId, siteId));
  return (row?.state as EngineState | undefined) ?? null;
}

/**
 * Claims sites with a timer due, with a lease so that several workers never fire
 * the same site at once; a lease left by a crashed worker expires.
 */
export async function claimDueSites({ owner, now, leaseMs, limit = 20 }: { owner: string; now: number; leaseMs: number; limit?: number }): Promise<string[]> {
  const db = getDb();
  // A limit, so that with many sites due at once (09:00) several workers share them.
  const due = await db
    .select({ siteId: engineStates.siteId })
    .from(engineStates)
    .where(and(lte(engineStates.nextTimerAt, now), or(isNull(engineStates.leaseUntil), lt(engineStates.leaseUntil, now))))
    .orderBy(asc(engineStates.nextTimerAt))
    .limit(limit);
  if (!due.length) return [];
  const claimed = await db
    .update(engineStates)
    .set({ leaseOwner: owner, leaseUntil: now + leaseMs })
    .where(and(inArray(engineStates.siteId, due.map((d) => d.siteId)), lte(engineStates.nextTimerAt, now), or(isNull(engineStates.leaseUntil), lt(engineStates.leaseUntil, now))))
    .returning({ siteId: engineStates.siteId });
  return claimed.map((c) => c.siteId);
}

export async function releaseSite({ siteId, owner }: { siteId: string; owner: string }): Promise<void> {
  await getDb()
    .update(engineStates)
    .set({ leaseOwner: null, leaseUntil: null })
    .where(and(eq(engineStates.siteId, siteId), eq(engineStates.leaseOwner, owner)));
}


/**
 * After a new version goes live: let the worker run the site now, so the new
 * rules' schedules are set without waiting for the next device event. A site with
 * no live state yet starts with its first event (so a gateway replaying an
 * earlier day is not refused as late).
 */
export async function wakeSite({ siteId, now }: { siteId: string; now: number }): Promise<void> {
  await getDb().update(engineStates).set({ nextTimerAt: now }).where(eq(engineStates.siteId, siteId));
}
