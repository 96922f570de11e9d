/**
 * Replay throughput over a year of one site, against the raw read rate.
 *   - builds a synthetic 60-device site (30 luminaires in 10 zones, 12 rockers,
 *     8 light sensors, 4 climate sensors, 6 motion sensors) with 200 rules and a
 *     seeded year of about a million events, stored in a throwaway SQLite file;
 *   - baseline: reads every row back in time order through the libSQL client in
 *     keyset pages of 2,000 on (site, at, seq) — the raw rate, touching each value;
 *   - Replay: the same window through `replayLog` (db/queries/replay-log.ts: the
 *     worker's code path — pages, JSON values, the replay engine, timeline,
 *     series), events/s and its ratio to the raw rate; then a Compare (two rule
 *     sets at once) the same way;
 *   - peak RSS and the heap at each quarter of the replay, to show memory stays flat.
 * Run: npx tsx bench/replay.ts            (~2–3 min on 2 cores)
 *      npx tsx bench/replay.ts --events 200000   (a smaller year, for a quick look)
 */
import { randomUUID } from "node:crypto";
import { mkdirSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { performance } from "node:perf_hooks";
import type { DeviceKind } from "@/lib/catalogue/device-kinds";
import { compileGraph, type RuleJson } from "@/lib/rules/compile";
import { chainEdges, parseRuleGraph, type RuleGraphInput } from "@/lib/rules/graph";
import { allowServerOnly } from "@/workers/engine-worker";
import { prng } from "../lib/random/prng";
import { synthRuleGraph } from "./synthetic-rules";

const SEED = 20241112;
const SITE = "bench-year";
const RULES = 200;
const argEvents = process.argv.indexOf("--events");
const EVENTS = argEvents > 0 ? Number(process.argv[argEvents + 1]) : 1_000_000;
const PAGE = 2000;
const YEAR_START = Date.UTC(2024, 0, 1);
const YEAR_MS = 366 * 86_400_000;

const dir = path.join(os.tmpdir(), `joulepath-bench-replay-${randomUUID()}`);
mkdirSync(dir, { recursive: true });
process.env.DATABASE_URL = `file:${path.join(dir, "bench.db")}`;
process.env.UPLOAD_DIR = path.join(dir, "uploads");
const cleanup = () => rmSync(dir, { recursive: true, force: true });
process.once("SIGINT", () => {
  cleanup();
  process.exit(130);
});

type Dev = { id: string; kind: DeviceKind; zone: string };
const zones = Array.from({ length: 10 }, (_, i) => `${SITE}-z${i}`);
const devs: Dev[] = [];
const add = (n: number, prefix: string, kind: DeviceKind) => {
  for (let i = 0; i < n; i++) devs.push({ id: `${SITE}-${prefix}-${i}`, kind, zone: zones[i % zones.length] });
};
add(30, "lum", "mesh-luminaire");
add(12, "rocker", "kinetic-rocker");
add(8, "lux", "light-sensor");
add(4, "climate", "climate-sensor");
add(6, "motion", "solar-motion-light");
const byKind = (k: DeviceKind) => devs.filter((d) => d.kind === k).map((d) => d.id);

function synthGraph(rand: () => number): RuleGraphInput {
  const site = { rockers: byKind("kinetic-rocker"), luxSensors: byKind("light-sensor"), climateSensors: byKind("climate-sensor"), motionSensors: byKind("solar-motion-light"), occupiedZones: zones, actionZones: zones };
  const { nodes, edges } = synthRuleGraph(RULES, rand, site, { rocker: 0.5, lux: 0.25, temperature: 0.1, motion: 0.1, vacancy: 0.05 });
  // The site mode follows the clock, as at a real shop.
  nodes.push({ id: "t-open", kind: "trigger", type: "time-of-day", params: { at: { kind: "fixed", time: "09:00" } } }, { id: "a-open", kind: "action", type: "set-site-mode", params: { mode: "open" } });
  nodes.push({ id: "t-close", kind: "trigger", type: "time-of-day", params: { at: { kind: "fixed", time: "18:00" } } }, { id: "a-close", kind: "action", type: "set-site-mode", params: { mode: "closed" } });
  edges.push(...chainEdges("t-open", "a-open"), ...chainEdges("t-close", "a-close"));
  return { nodes, edges };
}

/** The year's events in time order, a chunk at a time (never all in memory). */
function* yearOfEvents(rand: () => number): Generator<[string, number, string, string, string]> {
  const gap = YEAR_MS / EVENTS;
  let at = YEAR_START;
  const rockers = byKind("kinetic-rocker");
  const luxes = byKind("light-sensor");
  const climates = byKind("climate-sensor");
  const motions = byKind("solar-motion-light");
  for (let i = 0; i < EVENTS; i++) {
    at += Math.max(1, Math.floor(rand() * 2 * gap));
    const r = rand();
    let device: string, kind: string, value: unknown;
    if (r < 0.45) [device, kind, value] = [luxes[Math.floor(rand() * luxes.length)], "light-level", Math.floor(rand() * 1100)];
    else if (r < 0.65) [device, kind, value] = [climates[Math.floor(rand() * climates.length)], rand() < 0.5 ? "temperature" : "humidity", rand() < 0.5 ? 18 + Math.floor(rand() * 140) / 10 : 35 + Math.floor(rand() * 40)];
    else if (r < 0.85) [device, kind, value] = [motions[Math.floor(rand() * motions.length)], "motion", true];
    else [device, kind, value] = [rockers[Math.floor(rand() * rockers.length)], "press", 1 + Math.floor(rand() * 4)];
    if (kind === "humidity" && (value as number) > 100) value = 100;
    yield [`y${i}`, at, device, kind, JSON.stringify(value)];
  }
}

async function startProfile() {
  const { Session } = await import("node:inspector/promises");
  const session = new Session();
  session.connect();
  await session.post("Profiler.enable");
  await session.post("Profiler.start");
  return {
    async stop(file: string) {
      const { profile } = await session.post("Profiler.stop");
      (await import("node:fs")).writeFileSync(file, JSON.stringify(profile));
      session.disconnect();
    },
  };
}

const mib = (b: number) => (b / 1024 / 1024).toFixed(0);
const fmt = (n: number) => Math.round(n).toLocaleString("en-GB");

async function main() {
  allowServerOnly();
  const { getDb } = await import("@/db");
  const { migrateDatabase } = await import("@/db/migrate");
  const schema = await import("@/db/schema");
  const { resolveRuleSet } = await import("@/db/queries/replays");
  const { replayLog } = await import("@/db/queries/replay-log");
  const db = getDb();
  await migrateDatabase(db);
  const client = db.$client;

  console.log(`Replay bench — node ${process.version}, ${os.cpus().length} CPUs, seed ${SEED}, ${fmt(EVENTS)} events, ${RULES} rules, ${devs.length} devices`);
  const rand = prng(SEED);
  await db.insert(schema.sites).values({ id: SITE, name: "Bench year site", timeZone: "WET", latitude: 51.2, longitude: -2.1 });
  await db.insert(schema.zones).values(zones.map((id, i) => ({ id, siteId: SITE, name: `Zone ${i}`, groupAddress: 0xc000 + i, sortOrder: i })));
  await db.insert(schema.devices).values(devs.map((d, i) => ({ id: d.id, siteId: SITE, zoneId: d.zone, name: d.id, kind: d.kind, unicastAddress: i * 2 + 1, elementCount: 1, profile: d.kind === "kinetic-rocker" ? { buttons: 4 } : {} })));
  const rulesA: RuleJson[] = compileGraph(parseRuleGraph(synthGraph(rand)));
  const rulesB: RuleJson[] = compileGraph(parseRuleGraph(synthGraph(prng(SEED + 1))));
  await db.insert(schema.ruleSetVersions).values([
    { id: "bench-v1", siteId: SITE, number: 1, graph: {}, rules: rulesA },
    { id: "bench-v2", siteId: SITE, number: 2, graph: {}, rules: rulesB },
  ]);
  await db.insert(schema.ruleSets).values({ siteId: SITE, draftGraph: { nodes: [], edges: [] }, draftRevision: 1, activeVersionId: "bench-v1" });

  // ——— store the year ———
  const t0 = performance.now();
  const ROWS = 400;
  let batch: (string | number)[] = [];
  let rows = 0;
  const placeholders = (n: number) => Array.from({ length: n }, () => "(?, ?, ?, ?, ?, ?, 'import', 0)").join(",");
  let tx = await client.transaction("write");
  const flush = async () => {
    if (!rows) return;
    await tx.execute({ sql: `INSERT INTO events (site_id, event_id, at, device, kind, value, source, received_at) VALUES ${placeholders(rows)}`, args: batch });
    batch = [];
    rows = 0;
  };
  let n = 0;
  for (const [id, at, device, kind, value] of yearOfEvents(rand)) {
    batch.push(SITE, id, at, device, kind, value);
    rows++;
    if (rows === ROWS) {
      await flush();
      // libSQL frees a finished statement's native memory from a finaliser on the event loop: let it run.
      await new Promise((resolve) => setImmediate(resolve));
    }
    if (++n % 100_000 === 0) {
      await tx.commit();
      tx = await client.transaction("write");
    }
  }
  await flush();
  await tx.commit();
  const stored = Number((await client.execute({ sql: "SELECT count(*) FROM events WHERE site_id = ?", args: [SITE] })).rows[0][0]);
  console.log(`stored ${fmt(stored)} events in ${((performance.now() - t0) / 1000).toFixed(1)} s (${mib((await import("node:fs")).statSync(path.join(dir, "bench.db")).size)} MiB file); RSS now ${mib(process.memoryUsage().rss)} MiB`);

  // ——— baseline: raw keyset read ———
  const rawRead = async () => {
    const start = performance.now();
    let at = -1;
    let seq = -1;
    let count = 0;
    let touch = 0;
    for (;;) {
      const rs = await client.execute({ sql: "SELECT seq, event_id, at, device, kind, value FROM events WHERE site_id = ? AND at >= ? AND (at > ? OR seq > ?) AND at < ? ORDER BY at, seq LIMIT ?", args: [SITE, at, at, seq, YEAR_START + YEAR_MS + 1, PAGE] });
      for (const r of rs.rows) touch += (r[1] as string).length + (r[5] as string).length;
      count += rs.rows.length;
      if (rs.rows.length < PAGE) break;
      // As any server loop would: lets libSQL's finalisers free finished statements (faster than piling them up).
      await new Promise((resolve) => setImmediate(resolve));
      const last = rs.rows[rs.rows.length - 1];
      at = Number(last[2]);
      seq = Number(last[0]);
    }
    return { count, ms: performance.now() - start, touch };
  };
  await rawRead(); // warm the page cache
  const raw = await rawRead();
  const rawRate = raw.count / (raw.ms / 1000);
  console.log(`\nA. raw read in time order (libSQL client, keyset pages of ${PAGE} on (site, at, seq)): ${fmt(raw.count)} rows in ${(raw.ms / 1000).toFixed(2)} s = ${fmt(rawRate)} rows/s  [baseline 1.00]`);
  // What Replay's reader thread hands over when nothing runs the pages: its ceiling.
  const { readLogPagesAhead } = await import("@/db/queries/replay-log");
  let tAhead = performance.now();
  let ahead = 0;
  let firstPage = 0;
  for await (const page of readLogPagesAhead({ siteId: SITE, from: YEAR_START, to: YEAR_START + YEAR_MS + 1, pageSize: PAGE })) {
    if (!ahead) firstPage = performance.now() - tAhead;
    ahead += page.length;
  }
  tAhead = performance.now() - tAhead;
  console.log(`    (first page after ${firstPage.toFixed(0)} ms: the thread's start)`);
  console.log(`    RSS after A: ${mib(process.memoryUsage().rss)} MiB`);
  console.log(`A2. the same rows through Replay's reader thread, pages not run: ${fmt(ahead)} in ${(tAhead / 1000).toFixed(2)} s = ${fmt(ahead / (tAhead / 1000))} rows/s  [${(ahead / (tAhead / 1000) / rawRate).toFixed(2)} of raw]`);

  // ——— Replay through the worker's code path ———
  const window = { from: YEAR_START, to: YEAR_START + YEAR_MS + 1 };
  const active = await resolveRuleSet({ siteId: SITE, choice: { kind: "active" } });
  const other = await resolveRuleSet({ siteId: SITE, choice: { kind: "version", versionId: "bench-v2" } });
  let peakRss = process.memoryUsage().rss;
  const sampler = setInterval(() => (peakRss = Math.max(peakRss, process.memoryUsage().rss)), 50);
  const replayOnce = async (runs: typeof active[]) => {
    global.gc?.();
    const heaps: string[] = [];
    const marks = [0.25, 0.5, 0.75, 1].map((f) => Math.floor(f * stored));
    const start = performance.now();
    const result = await replayLog({
      siteId: SITE,
      params: { ...window, filter: {}, runs },
      pageSize: PAGE,
      onPage: async (processed) => {
        while (marks.length && processed >= marks[0]) {
          marks.shift();
          heaps.push(mib(process.memoryUsage().heapUsed));
        }
        return true;
      },
    });
    return { result: result!, ms: performance.now() - start, heaps };
  };
  const measure = async (label: string, runs: typeof active[]) => {
    const { result, ms, heaps } = await replayOnce(runs);
    const rate = result.events / (ms / 1000);
    const counts = result.runs.map((r) => `${fmt(r.counts.firings)} firings, ${fmt(r.counts.changes)} changes`).join(" | ");
    console.log(`${label}: ${fmt(result.events)} events in ${(ms / 1000).toFixed(2)} s = ${fmt(rate)} events/s  [${(rate / rawRate).toFixed(2)} of raw]  (${counts}; result ${mib(JSON.stringify(result).length)} MiB JSON)`);
    console.log(`   heap used at 25/50/75/100 % of the log: ${heaps.join(" / ")} MiB; RSS after: ${mib(process.memoryUsage().rss)} MiB`);
    return result;
  };
  console.log("");
  // BENCH_ONLY=B or C runs one of the two; BENCH_PROFILE=file.cpuprofile profiles what runs (open it in a browser's devtools).
  const only = process.env.BENCH_ONLY ?? "";
  const profile = process.env.BENCH_PROFILE ? await startProfile() : null;
  if (only !== "C") await measure("B. Replay, 200 rules (replayLog: pages + engine + timeline + series)", [active]);
  if (only === "B") {
    if (profile) await profile.stop(process.env.BENCH_PROFILE!);
    clearInterval(sampler);
    client.close();
    return;
  }
  const cmp = await measure("C. Compare, 200 rules vs another 200", [active, other]);
  if (profile) await profile.stop(process.env.BENCH_PROFILE!);
  clearInterval(sampler);
  console.log(`   Compare found ${fmt(cmp.compare!.root)} steps deciding differently, ${fmt(cmp.compare!.knockOn)} following from them.`);
  // This machine's speed drifts by a third between phases a few seconds apart, so
  // one A and one B can put the ratio either side of the goal. Pairs run back to
  // back share the drift; the median of their ratios is the figure to go by.
  const rounds = Number(process.env.BENCH_ROUNDS ?? 3);
  if (rounds > 0 && !profile) {
    console.log(`\nD. A and B again, back to back, ${rounds} times (set BENCH_ROUNDS; 0 skips):`);
    const ratios: number[] = [];
    for (let i = 0; i < rounds; i++) {
      const a = await rawRead();
      const aRate = a.count / (a.ms / 1000);
      const { result, ms } = await replayOnce([active]);
      const bRate = result.events / (ms / 1000);
      ratios.push(bRate / aRate);
      console.log(`   round ${i + 1}: raw ${fmt(aRate)} rows/s, Replay ${fmt(bRate)} events/s  [${(bRate / aRate).toFixed(2)} of raw]`);
    }
    const sorted = [...ratios].sort((x, y) => x - y);
    const median = sorted.length % 2 ? sorted[(sorted.length - 1) / 2] : (sorted[sorted.length / 2 - 1] + sorted[sorted.length / 2]) / 2;
    console.log(`   median: Replay at ${median.toFixed(2)} of the raw read rate (goal ≥ 0.80); range ${sorted[0].toFixed(2)}–${sorted[sorted.length - 1].toFixed(2)}`);
  }
  console.log(`\npeak RSS ${mib(peakRss)} MiB over the whole run; the timeline, differences and series are capped, and one page of ${PAGE} rows is in memory at a time.`);
  client.close();
}

main()
  .then(cleanup)
  .catch((err) => {
    cleanup();
    console.error(err);
    process.exit(1);
  });
