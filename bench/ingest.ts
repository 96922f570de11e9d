/**
 * Ingest: how fast the live store (db/queries/live.ts `ingestEvents`) takes
 * device events, against the raw rate of the database underneath.
 *   A. baselines on a plain table: multi-row INSERTs of 1,000 rows per statement,
 *      single-row INSERTs in one transaction, and one commit per row (WAL);
 *   B. ingestEvents with batches of 500 realistic demo-site events (events/s and
 *      its ratio to A's multi-row rate; goal ≥ 0.33), then where a batch's time
 *      goes: the per-call load + engine construction (as the store does it), the
 *      engine alone with the closures the store runs and with json-rules-engine
 *      (the reference evaluator, for comparison), and the same writes replayed
 *      three ways on copy sites — one INSERT per row (the first pattern), Drizzle
 *      multi-row INSERTs with RETURNING (the previous one) and the store's own
 *      `writeIngested` (plain SQL, seqs numbered in the transaction) — each with
 *      the same state read and rewrite and one commit; then the JSON sizes written;
 *   C. single-event ingests at a steady ~200/s for 10 s: latency p50/p99 of the
 *      store call, in-process (no HTTP: starting the app is not part of a bench).
 * Input is seeded, so every run sees the same events. Everything runs on a
 * throwaway SQLite file under the OS temp folder, removed at the end.
 * Run: npx tsx bench/ingest.ts
 */
import { randomUUID } from "node:crypto";
import { mkdirSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import { eq, sql } from "drizzle-orm";
import { migrateDatabase } from "@/db/migrate";
import { engineStates, engineSteps, events, gatewayCommands, noticesOutbox, sites } from "@/db/schema";
import { seedDemo } from "@/db/seed";
import { createEngine, createReplayEngine } from "@/lib/bus/engine";
import type { DeviceEvent, Step } from "@/lib/bus/types";
import { allowServerOnly } from "@/workers/engine-worker";
import { prng } from "../lib/random/prng";

const SEED = 20240620;
const SITE = "larch-lane";
const BATCH = 500;
// A gateway API server runs for days: measure it warm (the engine reaches its steady JIT tier after a few thousand events).
const WARM_BATCHES = 10;
const MEASURED_BATCHES = 16;
const RAW_ROWS_PER_STATEMENT = 1000;
const RAW_MIN_MS = 2000;
const SINGLE_RATE = 200;
const SINGLE_SECONDS = 10;

const dir = path.join(os.tmpdir(), `joulepath-bench-ingest-${randomUUID()}`);
mkdirSync(dir, { recursive: true });
const dbFile = path.join(dir, "bench.db");
process.env.DATABASE_URL = `file:${dbFile}`;
process.env.UPLOAD_DIR = path.join(dir, "uploads");
const cleanup = () => rmSync(dir, { recursive: true, force: true });
process.once("SIGINT", () => {
  cleanup();
  process.exit(130);
});


/**
 * What the demo site's devices send during a day, from 07:00 local (Thursday
 * 2024-06-20, zone WET = UTC+1 in summer): readings dominate, then presses and
 * motion; the schedules (09:00 open, 17:30 close) fall inside. No fire alarm: a
 * latched emergency would hold every luminaire and make the rest of the day idle.
 */
function demoDay(count: number, seed: number, idPrefix: string, startAt = Date.UTC(2024, 5, 20, 6)): DeviceEvent[] {
  const rand = prng(seed);
  const dev = (key: string) => `${SITE}-dev-${key}`;
  const walk = { temp: 24, hum: 55, caseA: 20, caseB: 20, lux: 600, pathLux: 120 };
  const step = (v: number, d: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v + (rand() * 2 - 1) * d));
  const out: DeviceEvent[] = [];
  let at = startAt;
  for (let i = 0; i < count; i++) {
    at += 200 + Math.floor(rand() * 3_800);
    const r = rand();
    let device: string;
    let kind: string;
    let value: DeviceEvent["value"];
    if (r < 0.18) [device, kind, value] = [dev("climate-workshop"), "temperature", Math.round((walk.temp = step(walk.temp, 0.6, 18, 31)) * 10) / 10];
    else if (r < 0.28) [device, kind, value] = [dev("climate-workshop"), "humidity", Math.round((walk.hum = step(walk.hum, 2, 35, 75)) * 10) / 10];
    else if (r < 0.34) [device, kind, value] = [dev(rand() < 0.5 ? "climate-case-a" : "climate-case-b"), "temperature", Math.round((walk.caseA = step(walk.caseA, 0.3, 17, 24)) * 10) / 10];
    else if (r < 0.5) [device, kind, value] = [dev("lux-window"), "light-level", Math.round((walk.lux = step(walk.lux, 150, 50, 1500)))];
    else if (r < 0.58) [device, kind, value] = [dev("sensor-path"), "light-level", Math.round((walk.pathLux = step(walk.pathLux, 20, 0, 300)))];
    else if (r < 0.7) [device, kind, value] = [dev("sensor-path"), "motion", true];
    else if (r < 0.78) [device, kind, value] = [dev("rocker-shop-door"), rand() < 0.7 ? "press" : "release", 1 + Math.floor(rand() * 4)];
    else if (r < 0.86) [device, kind, value] = [dev("rocker-workshop"), rand() < 0.7 ? "press" : "release", 1 + Math.floor(rand() * 2)];
    else if (r < 0.93) [device, kind, value] = [dev("rocker-flat"), rand() < 0.7 ? "press" : "release", 1 + Math.floor(rand() * 3)];
    else if (r < 0.98) [device, kind, value] = [dev("contact-back"), "contact", rand() < 0.5 ? "open" : "closed"];
    else [device, kind, value] = [dev("call-counter"), "press", null];
    out.push({ id: `${idPrefix}${i}`, siteId: SITE, at, device, kind, value });
  }
  return out;
}

const fmt = (n: number, digits = 0) => n.toLocaleString("en-GB", { minimumFractionDigits: digits, maximumFractionDigits: digits });
const quantile = (xs: number[], q: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.max(0, Math.ceil(q * s.length) - 1))];
};
const median = (xs: number[]) => quantile(xs, 0.5);
/**
 * libsql frees a finished statement's native memory from a finaliser that runs
 * on the event loop: a loop that only awaits promises piles them up (≈4 KB per
 * statement) until it yields. Yield between rounds, as a server between requests.
 */
const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));
let peakRss = process.memoryUsage().rss;
const sampleRss = () => {
  peakRss = Math.max(peakRss, process.memoryUsage().rss);
};

type Row = { what: string; figure: string; unit: string; ratio: string };
const rows: Row[] = [];
const row = (what: string, value: number, unit: string, ratio = "", digits = 0) => rows.push({ what, figure: fmt(value, digits), unit, ratio });

async function main() {
  // db/index.ts (and so the store) imports "server-only"; this is a plain Node process.
  allowServerOnly();
  const [{ getDb }, live] = await Promise.all([import("@/db"), import("@/db/queries/live")]);
  const db = getDb();
  const client = db.$client;
  await migrateDatabase(db);
  await seedDemo(db, { withUsers: false });
  const pragma = async (name: string) => String((await client.execute(`PRAGMA ${name}`)).rows[0]?.[0]);
  const journal = await pragma("journal_mode");
  const synchronous = ["OFF", "NORMAL", "FULL", "EXTRA"][Number(await pragma("synchronous"))] ?? "?";

  // ——— A. baselines: a plain table with the event log's columns, no index ———
  await client.execute("CREATE TABLE raw_events (seq INTEGER PRIMARY KEY, site_id TEXT NOT NULL, event_id TEXT NOT NULL, at INTEGER NOT NULL, device TEXT NOT NULL, kind TEXT NOT NULL, value TEXT, source TEXT NOT NULL, received_at INTEGER NOT NULL)");
  const rawEvents = demoDay(RAW_ROWS_PER_STATEMENT, SEED + 1, "raw-");
  const rawArgs = (e: DeviceEvent, n: number) => [SITE, `${e.id}.${n}`, e.at, e.device, e.kind, JSON.stringify(e.value), "bench", e.at];
  const multiSql = `INSERT INTO raw_events (site_id, event_id, at, device, kind, value, source, received_at) VALUES ${Array(RAW_ROWS_PER_STATEMENT).fill("(?,?,?,?,?,?,?,?)").join(",")}`;
  const singleSql = "INSERT INTO raw_events (site_id, event_id, at, device, kind, value, source, received_at) VALUES (?,?,?,?,?,?,?,?)";
  let stmtNo = 0;
  const multiInsert = () => client.execute({ sql: multiSql, args: rawEvents.flatMap((e) => rawArgs(e, stmtNo++)) });

  const timeLoop = async (minMs: number, maxReps: number, fn: () => Promise<unknown>) => {
    let reps = 0;
    const t0 = performance.now();
    while (reps < maxReps && (reps < 3 || performance.now() - t0 < minMs)) {
      await fn();
      reps++;
      if (reps % 20 === 0) await yieldToEventLoop();
    }
    return { reps, ms: performance.now() - t0 };
  };

  for (let i = 0; i < 5; i++) await multiInsert();
  const multi = await timeLoop(RAW_MIN_MS, 400, multiInsert);
  const rawMultiRate = (multi.reps * RAW_ROWS_PER_STATEMENT) / (multi.ms / 1000);

  let singleNo = 0;
  const oneRowPerStatementInOneTx = async () => {
    const tx = await client.transaction("write");
    for (const e of rawEvents) await tx.execute({ sql: singleSql, args: rawArgs(e, 1e6 + singleNo++) });
    await tx.commit();
  };
  await oneRowPerStatementInOneTx();
  const perRowTx = await timeLoop(RAW_MIN_MS, 200, oneRowPerStatementInOneTx);
  const perRowTxRate = (perRowTx.reps * RAW_ROWS_PER_STATEMENT) / (perRowTx.ms / 1000);

  let commitNo = 0;
  const oneCommit = () => client.execute({ sql: singleSql, args: rawArgs(rawEvents[commitNo % rawEvents.length], 2e6 + commitNo++) });
  for (let i = 0; i < 50; i++) await oneCommit();
  const commits = await timeLoop(RAW_MIN_MS, 20_000, oneCommit);
  const commitRate = commits.reps / (commits.ms / 1000);
  sampleRss();

  row("A1 raw multi-row INSERT, 1,000 rows/statement, each its own commit (baseline)", rawMultiRate, "rows/s", "1.00");
  row("A2 raw single-row INSERTs, 1,000 per transaction", perRowTxRate, "rows/s", (perRowTxRate / rawMultiRate).toFixed(2));
  row(`A3 raw one commit per row (${journal}, synchronous=${synchronous})`, commitRate, "rows/s", (commitRate / rawMultiRate).toFixed(3));

  // ——— B. ingestEvents, batches of 500 ———
  const day = demoDay(BATCH * (WARM_BATCHES + MEASURED_BATCHES), SEED, "ev-");
  const batches = Array.from({ length: WARM_BATCHES + MEASURED_BATCHES }, (_, i) => day.slice(i * BATCH, (i + 1) * BATCH));
  const batchMs: number[] = [];
  let commands = 0;
  const countNotices = async () => Number((await db.select({ n: sql<number>`count(*)` }).from(noticesOutbox))[0].n);
  let noticesBefore = 0;
  for (const [i, batch] of batches.entries()) {
    if (i === WARM_BATCHES) noticesBefore = await countNotices();
    const t = performance.now();
    const result = await live.ingestEvents({ siteId: SITE, batch, source: "bench" });
    if (i >= WARM_BATCHES) {
      batchMs.push(performance.now() - t);
      commands += result.commands.length;
    }
    if (result.accepted.length !== batch.length) throw new Error(`batch ${i}: ${result.accepted.length} of ${batch.length} accepted`);
    sampleRss();
    await yieldToEventLoop();
  }
  const notices = (await countNotices()) - noticesBefore;
  const ingestTotalMs = batchMs.reduce((a, b) => a + b, 0);
  const ingestRate = (MEASURED_BATCHES * BATCH) / (ingestTotalMs / 1000);
  row(`B  ingestEvents, ${BATCH}-event batches (${MEASURED_BATCHES} measured)`, ingestRate, "events/s", (ingestRate / rawMultiRate).toFixed(3));
  row("   … one batch, median", median(batchMs), "ms", "", 1);

  // Where a batch's time goes. 1: what every call does before its first event (site input, cached while unchanged; state; engine).
  const setupMs: number[] = [];
  for (let i = 0; i < 20; i++) {
    const t = performance.now();
    await db.transaction(async (tx) => {
      live.createLiveEngine(await live.openLive(tx, SITE));
    });
    setupMs.push(performance.now() - t);
    await yieldToEventLoop();
  }
  const loadedForReplay = await live.loadEngineInput(SITE);
  // 2: the engine alone on the same events, from an empty state as the store started: closures (what the store runs), then json-rules-engine.
  const engine = createReplayEngine({ ...loadedForReplay.input, rules: loadedForReplay.rules });
  for (const e of batches[0]) engine.ingest(e);
  for (const e of batches[1]) engine.ingest(e);
  const steps: { event: DeviceEvent; step: Step }[] = [];
  const te = performance.now();
  for (const batch of batches.slice(WARM_BATCHES)) for (const e of batch) steps.push({ event: e, step: engine.ingest(e) });
  const engineMs = performance.now() - te;
  const engineRate = steps.length / (engineMs / 1000);
  const reference = createEngine({ ...loadedForReplay.input, rules: loadedForReplay.rules });
  for (const batch of batches.slice(0, WARM_BATCHES)) for (const e of batch) await reference.ingest(e);
  const tr = performance.now();
  for (const batch of batches.slice(WARM_BATCHES)) for (const e of batch) await reference.ingest(e);
  const referenceMs = performance.now() - tr;
  const stateBytes = Buffer.byteLength(JSON.stringify(engine.getState()));
  const recentIdsBytes = Buffer.byteLength(JSON.stringify(engine.getState().recentEventIds));
  const recentIdsCount = engine.getState().recentEventIds.length;
  const outputBytes = steps.map(({ step }) => Buffer.byteLength(JSON.stringify({ changes: step.changes, commands: step.commands, notices: step.notices, trace: step.trace })));
  sampleRss();

  // 3: the store's writes alone, replayed on copy sites: per row with RETURNING, Drizzle multi-row with RETURNING, and writeIngested.
  const copySite = (id: string) => db.insert(sites).values({ id, name: id, timeZone: "WET", latitude: 51.2, longitude: -2.1 });
  const stepBatches = Array.from({ length: MEASURED_BATCHES }, (_, i) => steps.slice(i * BATCH, (i + 1) * BATCH));
  const outputOf = (s: Step) => ({ changes: s.changes, commands: s.commands, notices: s.notices, trace: s.trace });
  const bigState = engine.getState();
  await copySite("copy-per-row");
  await db.insert(engineStates).values({ siteId: "copy-per-row", state: bigState, updatedAt: 0 });
  const perRowMs: number[] = [];
  let statements = 0;
  for (const batch of stepBatches) {
    const t = performance.now();
    await db.transaction(async (tx) => {
      await tx.select().from(engineStates).where(eq(engineStates.siteId, "copy-per-row"));
      for (const { event: e, step } of batch) {
        const [stored] = await tx.insert(events).values({ siteId: "copy-per-row", eventId: e.id, at: e.at, device: e.device, kind: e.kind, value: e.value, source: "bench", receivedAt: 0 }).onConflictDoNothing().returning({ seq: events.seq });
        const [st] = await tx.insert(engineSteps).values({ siteId: "copy-per-row", eventSeq: stored.seq, at: step.at, versionId: null, output: outputOf(step) }).returning({ seq: engineSteps.seq });
        statements += 2;
        for (const command of step.commands) {
          await tx.insert(gatewayCommands).values({ siteId: "copy-per-row", stepSeq: st.seq, at: command.at, command }).returning({ seq: gatewayCommands.seq });
          statements++;
        }
        if (step.notices.length) {
          await tx.insert(noticesOutbox).values(step.notices.map((n) => ({ siteId: "copy-per-row", dedupeKey: n.dedupeKey, recipient: n.recipient, channels: n.channels, text: n.text, at: n.at }))).onConflictDoNothing();
          statements++;
        }
      }
      await tx.update(engineStates).set({ state: bigState, updatedAt: 1 }).where(eq(engineStates.siteId, "copy-per-row"));
    });
    perRowMs.push(performance.now() - t);
    await yieldToEventLoop();
  }
  await copySite("copy-multi-row");
  await db.insert(engineStates).values({ siteId: "copy-multi-row", state: bigState, updatedAt: 0 });
  const multiRowMs: number[] = [];
  for (const batch of stepBatches) {
    const t = performance.now();
    await db.transaction(async (tx) => {
      await tx.select().from(engineStates).where(eq(engineStates.siteId, "copy-multi-row"));
      const stored = await tx
        .insert(events)
        .values(batch.map(({ event: e }) => ({ siteId: "copy-multi-row", eventId: e.id, at: e.at, device: e.device, kind: e.kind, value: e.value, source: "bench" as const, receivedAt: 0 })))
        .onConflictDoNothing()
        .returning({ seq: events.seq, eventId: events.eventId });
      const seqOf = new Map(stored.map((s) => [s.eventId, s.seq]));
      const stepRows = await tx
        .insert(engineSteps)
        .values(batch.map(({ event: e, step }) => ({ siteId: "copy-multi-row", eventSeq: seqOf.get(e.id)!, at: step.at, versionId: null, output: outputOf(step) })))
        .returning({ seq: engineSteps.seq });
      const cmds = batch.flatMap(({ step }, i) => step.commands.map((command) => ({ siteId: "copy-multi-row", stepSeq: stepRows[i].seq, at: command.at, command })));
      if (cmds.length) await tx.insert(gatewayCommands).values(cmds);
      const ns = batch.flatMap(({ step }) => step.notices.map((n) => ({ siteId: "copy-multi-row", dedupeKey: n.dedupeKey, recipient: n.recipient, channels: n.channels, text: n.text, at: n.at })));
      if (ns.length) await tx.insert(noticesOutbox).values(ns).onConflictDoNothing();
      await tx.update(engineStates).set({ state: bigState, updatedAt: 1 }).where(eq(engineStates.siteId, "copy-multi-row"));
    });
    multiRowMs.push(performance.now() - t);
    await yieldToEventLoop();
  }
  await copySite("copy-store");
  await db.insert(engineStates).values({ siteId: "copy-store", state: bigState, updatedAt: 0 });
  const storeMs: number[] = [];
  for (const batch of stepBatches) {
    const t = performance.now();
    await db.transaction(async (tx) => {
      await tx.select().from(engineStates).where(eq(engineStates.siteId, "copy-store"));
      await live.writeIngested(tx, { siteId: "copy-store", source: "bench", versionId: null, events: batch.map((b) => b.event), steps: batch.map((b) => b.step), receivedAt: 0 });
      await tx.update(engineStates).set({ state: bigState, updatedAt: 1 }).where(eq(engineStates.siteId, "copy-store"));
    });
    storeMs.push(performance.now() - t);
    await yieldToEventLoop();
  }
  sampleRss();
  const perBatch = (ms: number[]) => ms.reduce((a, b) => a + b, 0) / ms.length;
  const stepsPerBatchMs = engineMs / MEASURED_BATCHES;
  row("   … site input + state + build engine, once per call (median)", median(setupMs), "ms", "", 1);
  row(`   … engine alone, closures (what the store runs), ${BATCH} events`, stepsPerBatchMs, "ms", "", 1);
  row(`   … engine alone, json-rules-engine (reference evaluator), ${BATCH} events`, referenceMs / MEASURED_BATCHES, "ms", "", 1);
  row("   … the same writes one INSERT per row (the first pattern)", perBatch(perRowMs), "ms", "", 1);
  row("   … the same writes as Drizzle multi-row INSERTs + RETURNING (previous)", perBatch(multiRowMs), "ms", "", 1);
  row("   … the same writes through writeIngested (what ingestEvents does now)", perBatch(storeMs), "ms", "", 1);
  row("   engine alone, closures", engineRate, "events/s", (engineRate / rawMultiRate).toFixed(3));
  row("   SQL statements per batch (per-row pattern)", statements / MEASURED_BATCHES + 2, "", "");
  row("   engine_steps.output JSON per event, mean", outputBytes.reduce((a, b) => a + b, 0) / outputBytes.length, "bytes");
  row("   engine_steps.output JSON per event, p99", quantile(outputBytes, 0.99), "bytes");
  row("   engine_states.state JSON (read and rewritten every call)", stateBytes, "bytes");
  row(`   … of which recentEventIds (${recentIdsCount.toLocaleString("en")} ids)`, recentIdsBytes, "bytes");
  row(`   commands / notices produced in the measured batches`, commands, `/ ${notices} notices`);

  // What one single-event call writes, replayed alone: state read + event + step + state rewrite, one commit.
  const oneWriteMs: number[] = [];
  for (const [i, { event: e, step }] of steps.slice(0, 300).entries()) {
    const t = performance.now();
    await db.transaction(async (tx) => {
      await tx.select().from(engineStates).where(eq(engineStates.siteId, "copy-per-row"));
      const [stored] = await tx.insert(events).values({ siteId: "copy-per-row", eventId: `one-${e.id}`, at: e.at, device: e.device, kind: e.kind, value: e.value, source: "bench", receivedAt: 0 }).returning({ seq: events.seq });
      await tx.insert(engineSteps).values({ siteId: "copy-per-row", eventSeq: stored.seq, at: step.at, versionId: null, output: outputOf(step) }).returning({ seq: engineSteps.seq });
      await tx.update(engineStates).set({ state: bigState, updatedAt: i }).where(eq(engineStates.siteId, "copy-per-row"));
    });
    oneWriteMs.push(performance.now() - t);
    if (i % 20 === 0) await yieldToEventLoop();
  }

  // The same, with the state cut to its last 20 recent ids (the event log's unique index already drops repeats).
  const leanState = { ...bigState, recentEventIds: bigState.recentEventIds.slice(-20) };
  const leanWriteMs: number[] = [];
  for (const [i, { event: e, step }] of steps.slice(300, 600).entries()) {
    const t = performance.now();
    await db.transaction(async (tx) => {
      await tx.select().from(engineStates).where(eq(engineStates.siteId, "copy-multi-row"));
      const [stored] = await tx.insert(events).values({ siteId: "copy-multi-row", eventId: `one-${e.id}`, at: e.at, device: e.device, kind: e.kind, value: e.value, source: "bench", receivedAt: 0 }).returning({ seq: events.seq });
      await tx.insert(engineSteps).values({ siteId: "copy-multi-row", eventSeq: stored.seq, at: step.at, versionId: null, output: outputOf(step) }).returning({ seq: engineSteps.seq });
      await tx.update(engineStates).set({ state: leanState, updatedAt: i }).where(eq(engineStates.siteId, "copy-multi-row"));
    });
    leanWriteMs.push(performance.now() - t);
    if (i % 20 === 0) await yieldToEventLoop();
  }

  // ——— C. single-event ingests at a steady pace ———
  const singles = demoDay(SINGLE_RATE * SINGLE_SECONDS, SEED + 2, "one-", day[day.length - 1].at + 60_000);
  for (const e of singles.slice(0, 50)) await live.ingestEvents({ siteId: SITE, batch: [{ ...e, id: `warm-${e.id}` }], source: "bench" });
  const service: number[] = [];
  const response: number[] = [];
  const period = 1000 / SINGLE_RATE;
  const c0 = performance.now();
  for (const [i, e] of singles.slice(50).entries()) {
    const slot = c0 + i * period;
    const wait = slot - performance.now();
    if (wait > 0) await new Promise((r) => setTimeout(r, wait));
    const t = performance.now();
    await live.ingestEvents({ siteId: SITE, batch: [e], source: "bench" });
    const end = performance.now();
    service.push(end - t);
    response.push(end - slot);
    if (i % 100 === 0) sampleRss();
    if (wait <= 0) await yieldToEventLoop();
  }
  const cSeconds = (performance.now() - c0) / 1000;
  row(`C  single-event ingests, paced at ${SINGLE_RATE}/s for ${SINGLE_SECONDS} s: achieved`, service.length / cSeconds, "events/s", "", 1);
  row("   … store call p50", median(service), "ms", "", 2);
  row("   … store call p99", quantile(service, 0.99), "ms", "", 2);
  row("   … store call max", Math.max(...service), "ms", "", 2);
  row("   … from its scheduled time (with queueing) p99", quantile(response, 0.99), "ms", "", 2);
  row("   … of a call: site input + state + build engine (median, from B)", median(setupMs), "ms", "", 2);
  row("   … of a call: its writes replayed alone, one commit (median)", median(oneWriteMs), "ms", "", 2);
  row(`   … the same with a ${fmt(Buffer.byteLength(JSON.stringify(leanState)))}-byte state (20 recent ids)`, median(leanWriteMs), "ms", "", 2);
  sampleRss();
  row("peak RSS", peakRss / 2 ** 20, "MiB");

  client.close();

  const cpus = os.cpus();
  console.log(`bench/ingest.ts — node ${process.version}, ${cpus.length} CPU (${cpus[0]?.model ?? "?"}), ${os.platform()} ${os.arch()}; SQLite file under ${os.tmpdir()}`);
  const w = [Math.max(...rows.map((r) => r.what.length)), Math.max(...rows.map((r) => r.figure.length)), Math.max(...rows.map((r) => r.unit.length))];
  console.log(`${"".padEnd(w[0])}  ${"figure".padStart(w[1])}  ${"unit".padEnd(w[2])}  ratio to A1`);
  for (const r of rows) console.log(`${r.what.padEnd(w[0])}  ${r.figure.padStart(w[1])}  ${r.unit.padEnd(w[2])}  ${r.ratio}`);
}

const started = performance.now();
try {
  await main();
  console.log(`(ran ${fmt((performance.now() - started) / 1000, 1)} s)`);
} finally {
  cleanup();
}
