/**
 * Canvas speed in Chromium: time to open the Canvas with 50, 200 and 500 nodes,
 * and frame time while dragging a node, each with its ratio to a baseline taken
 * in the same run (opening an empty Canvas; idle frame time on the same page).
 *
 * Needs a production build (`next build`, made under the e2e lock because it
 * writes .next). It starts `next start` on a free port (never 3000/3100) on a
 * throwaway SQLite file seeded with the demo site, puts each synthetic draft in
 * through the real API as the demo manager, and measures in Debian Chromium.
 * Run: cd /work/main && flock /tmp/jp-e2e.lock sh -c 'NEXT_TELEMETRY_DISABLED=1 npx next build >/tmp/build.log 2>&1 && npx tsx bench/canvas.ts'
 */
import { spawn } from "node:child_process";
import { rmSync } from "node:fs";
import { createServer } from "node:net";
import os from "node:os";
import path from "node:path";
import { chromium, type Page } from "playwright-core";
import { createDatabase } from "../db/client";
import { migrateDatabase } from "../db/migrate";
import { seedDemo } from "../db/seed";
import { autoLayout } from "../lib/rules/layout";
import type { RuleGraphInput } from "../lib/rules/graph";

const SIZES = [50, 200, 500];
const OPEN_RUNS = 3;
const DRAG_STEPS = 90;
const SIZE = { trigger: { width: 212, height: 84 }, gate: { width: 164, height: 84 }, action: { width: 212, height: 84 } };

const dev = (k: string) => `larch-lane-dev-${k}`;
const zone = (k: string) => `larch-lane-zone-${k}`;

/** Trigger → gate → action chains on the demo site's devices, thresholds varied so trigger keys differ; laid out with dagre. */
function synthGraph(count: number): RuleGraphInput {
  type N = RuleGraphInput["nodes"][number];
  const nodes: N[] = [];
  const edges: RuleGraphInput["edges"] = [];
  const zones = ["shop", "window", "workshop", "textile", "path", "flat"];
  const chains = Math.floor(count / 3);
  for (let i = 0; i < chains; i++) {
    const r = i % 4;
    const trigger: N =
      r === 0 ? { id: `t${i}`, kind: "trigger", type: "temperature-above", params: { device: dev("climate-workshop"), celsius: 20 + (i % 60) / 4, hysteresis: 0.5 } }
      : r === 1 ? { id: `t${i}`, kind: "trigger", type: "light-level-below", params: { device: dev("lux-window"), lux: 10 + i, hysteresisLux: 5 } }
      : r === 2 ? { id: `t${i}`, kind: "trigger", type: "vacancy", params: { device: dev("sensor-path"), minutes: 1 + (i % 200) } }
      : { id: `t${i}`, kind: "trigger", type: "contact-left-open", params: { device: dev("contact-back"), minutes: 1 + (i % 1000) } };
    const gate: N = i % 2 ? { id: `g${i}`, kind: "gate", type: "site-mode-is", params: { modes: ["closed"] } } : { id: `g${i}`, kind: "gate", type: "days-of-week", params: { days: ["mon", "tue", "wed"] } };
    const action: N = i % 3 ? { id: `a${i}`, kind: "action", type: "set-level", params: { target: { zone: zone(zones[i % zones.length]) }, level: i % 101 } } : { id: `a${i}`, kind: "action", type: "notice", params: { to: { role: "manager" }, channels: ["in-app"], text: `Rule ${i}` } };
    nodes.push(trigger, gate, action);
    edges.push({ id: `e${i}a`, source: trigger.id, target: gate.id }, { id: `e${i}b`, source: gate.id, target: action.id });
  }
  for (let j = nodes.length; j < count; j++) {
    nodes.push({ id: `x${j}`, kind: "action", type: "relay-on", params: { device: dev("fan-workshop") } });
    edges.push({ id: `ex${j}`, source: `g${chains - 1}`, target: `x${j}` });
  }
  const pos = autoLayout(
    nodes.map((n) => ({ id: n.id, ...SIZE[n.kind] })),
    edges,
  );
  return { nodes: nodes.map((n) => ({ ...n, position: pos.get(n.id) })), edges };
}

async function freePort(): Promise<number> {
  for (;;) {
    const port = await new Promise<number>((resolve, reject) => {
      const s = createServer();
      s.once("error", reject);
      s.listen(0, () => {
        const p = (s.address() as { port: number }).port;
        s.close(() => resolve(p));
      });
    });
    if (port !== 3000 && port !== 3100) return port;
  }
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
const pct = (xs: number[], p: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor((p / 100) * xs.length))];
const fmt = (n: number) => n.toFixed(1).padStart(8);

async function openTime(page: Page, url: string): Promise<number> {
  await page.goto(`${url}/sites/larch-lane/canvas`, { waitUntil: "commit" });
  await page.waitForFunction(
    () => {
      // The Canvas marks itself ready once its nodes are measured and the first view is placed.
      if (!document.querySelector('[data-view-ready="true"]')) return false;
      return [...document.querySelectorAll<HTMLElement>(".react-flow__node")].every((el) => el.style.visibility !== "hidden");
    },
    undefined,
    { timeout: 60_000, polling: "raf" },
  );
  return page.evaluate(() => performance.now());
}

/** rAF intervals (ms) while `work` runs. */
async function frameTimes(page: Page, work: () => Promise<void>): Promise<number[]> {
  // Strings, not functions: tsx would wrap named inner functions in a helper the page does not have.
  await page.evaluate(`(() => {
    window.__frames = [];
    window.__stop = false;
    const tick = (t) => { window.__frames.push(t); if (!window.__stop) requestAnimationFrame(tick); };
    requestAnimationFrame(tick);
  })()`);
  await work();
  const stamps = (await page.evaluate("(() => { window.__stop = true; return window.__frames; })()")) as number[];
  return stamps.slice(1).map((t, i) => t - stamps[i]);
}

async function main() {
  const port = await freePort();
  const url = `http://localhost:${port}`;
  const file = path.join(os.tmpdir(), `joulepath-bench-canvas-${process.pid}.db`);
  const databaseUrl = `file:${file}`;
  const db = createDatabase(databaseUrl);
  await migrateDatabase(db);
  await seedDemo(db);

  const server = spawn("node_modules/.bin/next", ["start", "-p", String(port)], {
    env: { ...process.env, NODE_ENV: "production", DATABASE_URL: databaseUrl, APP_URL: url, NEXT_TELEMETRY_DISABLED: "1", UPLOAD_DIR: path.join(os.tmpdir(), `joulepath-bench-uploads-${process.pid}`) },
    stdio: ["ignore", "ignore", "inherit"],
  });
  const stop = () => {
    if (server.exitCode === null) server.kill("SIGTERM");
    for (const s of ["", "-wal", "-shm"]) rmSync(file + s, { force: true });
  };
  try {
    for (let i = 0; i < 240; i++) {
      const ok = await fetch(`${url}/api/health`).then((r) => r.ok).catch(() => false);
      if (ok) break;
      await new Promise((r) => setTimeout(r, 250));
    }
    const browser = await chromium.launch({
      executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium",
      args: ["--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"],
    });
    const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
    const api = context.request;
    const signIn = await api.post(`${url}/api/auth/sign-in`, { data: { email: "manager@larch-lane.invalid", password: "larch-lane-demo" }, headers: { origin: url } });
    if (!signIn.ok()) throw new Error(`sign-in failed: ${signIn.status()}`);
    const putGraph = async (graph: RuleGraphInput) => {
      const current = (await (await api.get(`${url}/api/sites/larch-lane/rules`)).json()) as { draft: { revision: number } };
      const res = await api.put(`${url}/api/sites/larch-lane/rules/draft`, { data: { graph, revision: current.draft.revision }, headers: { origin: url } });
      if (!res.ok()) throw new Error(`saving the draft failed: ${res.status()} ${await res.text()}`);
    };
    const page = await context.newPage();

    // Warm the server and browser caches once.
    await putGraph({ nodes: [], edges: [] });
    await openTime(page, url);

    const empties: number[] = [];
    for (let i = 0; i < OPEN_RUNS; i++) empties.push(await openTime(page, url));
    const baselineOpen = median(empties);
    const idle = await frameTimes(page, () => page.waitForTimeout(1000));
    const idleMean = idle.reduce((a, b) => a + b, 0) / idle.length;

    console.log(`Canvas benchmark — node ${process.version}, ${os.cpus().length} CPUs, Chromium headless (--disable-gpu), viewport 1280×800`);
    console.log(`baseline: open an empty Canvas ${baselineOpen.toFixed(0)} ms (median of ${OPEN_RUNS}); idle frame ${idleMean.toFixed(1)} ms\n`);
    console.log("nodes | in view | open ms (median) | × empty | drag frame ms mean | p95 | max | × idle | ms per pointer move");
    for (const n of SIZES) {
      await putGraph(synthGraph(n));
      const opens: number[] = [];
      for (let i = 0; i < OPEN_RUNS; i++) opens.push(await openTime(page, url));
      const open = median(opens);
      const shown = await page.locator(".react-flow__node").count();
      // Drag a node in view 300 px right in DRAG_STEPS pointer moves.
      const box = await page.locator(".react-flow__node").nth(Math.floor(shown / 2)).boundingBox();
      if (!box) throw new Error("node to drag not found");
      const [x, y] = [box.x + box.width / 2, box.y + box.height / 2];
      let moveMs = 0;
      const frames = await frameTimes(page, async () => {
        await page.mouse.move(x, y);
        await page.mouse.down();
        const t0 = Date.now();
        await page.mouse.move(x + 300, y + 40, { steps: DRAG_STEPS });
        moveMs = (Date.now() - t0) / DRAG_STEPS;
        await page.mouse.up();
      });
      const mean = frames.reduce((a, b) => a + b, 0) / frames.length;
      console.log(`${String(n).padStart(5)} | ${String(shown).padStart(7)} | ${fmt(open)}         | ${(open / baselineOpen).toFixed(2).padStart(6)} | ${fmt(mean)}           | ${fmt(pct(frames, 95))} | ${fmt(Math.max(...frames))} | ${(mean / idleMean).toFixed(2).padStart(6)} | ${moveMs.toFixed(1)}`);
    }
    await browser.close();
  } finally {
    stop();
  }
}

main().catch((err) => {
  console.error(err);
  process.exit(1);
});
