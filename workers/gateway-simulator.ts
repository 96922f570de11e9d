/**
 * Gateway simulator: posts a realistic day of the demo site's switch and
 * sensor reports to a local console through the gateway API, the way a site's
 * gateway would, and prints what came back.
 *
 *   npx tsx workers/gateway-simulator.ts --url http://localhost:3000 --site larch-lane [--key jpk_…] [--speed 0|600] [--day 2026-06-20]
 *
 * Without --key it mints a key for the site straight in the database
 * (DATABASE_URL, default file:data/joulepath.db) and prints it once. The day is
 * generated from a PRNG seeded by site and day, so the same day always sends the
 * same events with the same ids: running it twice shows them as duplicates.
 * --speed 0 (the default) sends the whole day as one batch; --speed 600 paces it in
 * half-hour batches, ten simulated minutes per second — against a live console
 * whose timer worker runs, that lets the site's clock move past the rest of a past
 * day, so use it with a console whose worker is stopped. Only loopback URLs are accepted, and the run is bounded: at
 * most one day, one batch per half hour, a timeout on every request.
 */
import { createHash, randomBytes, randomUUID } from "node:crypto";
import { pathToFileURL } from "node:url";
import { parseArgs } from "node:util";
import { eq } from "drizzle-orm";
import { z } from "zod";
import { createDatabase } from "../db/client";
import { apiKeys, sites } from "../db/schema";
import { DEMO_SITE_ID, demoDevices, demoSite } from "../db/seed/demo-site";
import { env } from "../lib/env";
import { formatAddress } from "../lib/mesh/address";
import { addDays, formatLocalDate, localDateOf, localToInstant, type LocalDate } from "../lib/sun/local-time";
export { prng } from "../lib/random/prng";
import { prng } from "../lib/random/prng";

const LOOPBACK = new Set(["localhost", "127.0.0.1", "[::1]", "::1"]);
/** Below this the run would take hours; a day at 60× takes 18 minutes. */
const MIN_SPEED = 60;
const MAX_SPEED = 1_000_000;
const BATCH_MINUTES = 30;
const REQUEST_TIMEOUT_MS = 20_000;
/** The gateway API refuses more than this per batch (lib/gateway/validate-events.ts MAX_BATCH); a simulated half hour holds far fewer. */
const MAX_BATCH = 500;

export type SimEvent = { id: string; at: number; device: string; kind: string; value: number | boolean | string | null };
/** `day` null: yesterday where the site is (resolved once its time zone is known). */
export type SimOptions = { url: string; siteId: string; key: string | null; speed: number; day: LocalDate | null };

const optionsSchema = z.object({
  url: z
    .url("--url must be an http(s) URL")
    .refine((u) => /^https?:$/.test(new URL(u).protocol), "--url must be http or https")
    .refine((u) => LOOPBACK.has(new URL(u).hostname), "--url must be a loopback address (localhost, 127.0.0.1 or [::1]): this tool only talks to a console on this machine"),
  site: z.string().regex(/^[a-z0-9][a-z0-9-]*$/, "--site is a site id like larch-lane").max(64),
  key: z
    .string()
    .regex(/^jpk_[A-Za-z0-9_-]{43}$/, "--key is a gateway key: jpk_ and 43 more characters")
    .optional(),
  speed: z.coerce.number().refine((s) => s === 0 || (s >= MIN_SPEED && s <= MAX_SPEED), `--speed is 0 (all at once) or ${MIN_SPEED}–${MAX_SPEED}`),
  day: z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/, "--day is a date like 2026-06-20")
    .refine((d) => !Number.isNaN(Date.parse(`${d}T00:00:00Z`)) && new Date(`${d}T00:00:00Z`).toISOString().startsWith(d), "--day is not a real date")
    .optional(),
});

export function parseSimulatorArgs(argv: string[]): SimOptions {
  const { values } = parseArgs({
    args: argv,
    options: { url: { type: "string", default: "http://localhost:3000" }, site: { type: "string", default: DEMO_SITE_ID }, key: { type: "string" }, speed: { type: "string", default: "0" }, day: { type: "string" } },
    strict: true,
  });
  const parsed = optionsSchema.safeParse(values);
  if (!parsed.success) throw new Error(parsed.error.issues.map((i) => i.message).join("\n"));
  const o = parsed.data;
  const day = o.day ? { year: Number(o.day.slice(0, 4)), month: Number(o.day.slice(5, 7)), day: Number(o.day.slice(8, 10)) } : null;
  return { url: o.url.replace(/\/$/, ""), siteId: o.site, key: o.key ?? null, speed: o.speed, day };
}

/** A new gateway key exactly as db/queries/api-keys.ts makes one: "jpk_" + 256 random bits, stored as its SHA-256 (hex) and first 10 characters. */
export function mintGatewayKey(): { key: string; prefix: string; keyHash: string } {
  const key = `jpk_${randomBytes(32).toString("base64url")}`;
  return { key, prefix: key.slice(0, 10), keyHash: createHash("sha256").update(key).digest("hex") };
}

/**
 * Inserts a new key for the site (no user: createdBy null) and returns it with
 * the site's time zone. db/queries/api-keys.ts cannot be imported here: it
 * reaches the app's server-only database client.
 */
export async function mintKeyInDatabase({ url, authToken, siteId, name }: { url: string; authToken?: string; siteId: string; name: string }): Promise<{ key: string; timeZone: string }> {
  const db = createDatabase(url, authToken);
  try {
    const [site] = await db.select({ id: sites.id, timeZone: sites.timeZone }).from(sites).where(eq(sites.id, siteId));
    if (!site) throw new Error(`No site "${siteId}" in ${url}. Seed the demo site (npm run db:seed) or pass --key.`);
    const { key, prefix, keyHash } = mintGatewayKey();
    await db.insert(apiKeys).values({ id: randomUUID(), siteId, name, prefix, keyHash, createdBy: null });
    return { key, timeZone: site.timeZone };
  } finally {
    db.$client.close();
  }
}

/** FNV-1a, to turn "site|day" into a seed. */
function hash32(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
  return h >>> 0;
}

const round1 = (x: number) => Math.round(x * 10) / 10;

/** The demo device's first unicast address, as a gateway knows it ("0x0013"). */
function address(key: string): string {
  const device = demoDevices.find((d) => d.id === `${DEMO_SITE_ID}-dev-${key}`);
  if (!device) throw new Error(`the demo site has no device "${key}"`);
  return formatAddress(device.unicastAddress);
}

/**
 * One day at the demo site, in local time: daylight rising and falling at the
 * window and on the path, rocker presses at opening and closing, the workshop
 * warming past 28 °C in the afternoon and cooling, a call at the counter, the
 * back door left open for 12 minutes after hours, and a visitor on the dark path.
 */
export function buildDay({ siteId, day, timeZone }: { siteId: string; day: LocalDate; timeZone: string }): SimEvent[] {
  const random = prng(hash32(`${siteId}|${formatLocalDate(day)}`));
  const jitter = (spread: number) => (random() * 2 - 1) * spread;
  const at = (hh: number, mm: number, ss = 0) => localToInstant(day, hh * 60 + mm, timeZone) + Math.round(ss * 1000);
  const raw: Omit<SimEvent, "id">[] = [];
  const add = (time: number, device: string, kind: string, value: SimEvent["value"]) => raw.push({ at: time, device: address(device), kind, value });
  const press = (time: number, device: string, button: number, holdMs = 250) => {
    add(time, device, "press", button);
    add(time + holdMs, device, "release", button);
  };
  /** 0 before dawn and after dusk, 1 at midday: a smooth daylight curve (common practice, no source). */
  const daylight = (minute: number, dawn = 5 * 60 + 10, dusk = 21 * 60 + 35) => (minute <= dawn || minute >= dusk ? 0 : Math.sin((Math.PI * (minute - dawn)) / (dusk - dawn)) ** 1.5);

  // Shop window light sensor every 15 min: indoor daylight, up to ~1400 lx with passing cloud.
  for (let m = 5 * 60 + 30; m <= 22 * 60; m += 15) {
    const lux = 1.5 + 1400 * daylight(m) * (0.8 + 0.3 * random());
    add(at(0, m, jitter(20) + 20), "lux-window", "light-level", round1(lux));
  }
  // The path sensor is outdoors: tens of thousands of lux at noon, a few lux at night.
  for (let m = 5 * 60 + 30; m <= 23 * 60 + 30; m += 30) {
    const lux = 3 + 18_000 * daylight(m) * (0.7 + 0.4 * random());
    add(at(0, m, jitter(20) + 25), "sensor-path", "light-level", round1(lux));
  }
  // Workshop: 19 °C in the morning, the kiln and the sun push it past 28 °C mid-afternoon, then it cools.
  for (let m = 7 * 60; m <= 21 * 60; m += 15) {
    const warmth = Math.exp(-(((m - 15 * 60) / 140) ** 2));
    add(at(0, m, 5 + jitter(4)), "climate-workshop", "temperature", round1(19 + 11.5 * warmth + jitter(0.3)));
    if (m % 60 === 0) add(at(0, m, 9 + jitter(4)), "climate-workshop", "humidity", round1(48 + 8 * warmth + jitter(2)));
  }
  // Textile cases: steady, as display cases should be.
  for (let m = 7 * 60; m <= 21 * 60; m += 30) {
    add(at(0, m, 12 + jitter(4)), "climate-case-a", "temperature", round1(20.4 + jitter(0.3)));
    add(at(0, m, 14 + jitter(4)), "climate-case-b", "humidity", round1(50 + jitter(2)));
  }
  // Opening: shop lights on at the door, workshop lights on.
  press(at(8, 52, jitter(20) + 30), "rocker-shop-door", 1);
  press(at(9, 4, jitter(20) + 30), "rocker-workshop", 1);
  // Someone waiting at the counter.
  add(at(11, 47, 12), "call-counter", "press", null);
  // Closing: the shop's closed scene at the door, workshop lights off.
  press(at(17, 38, jitter(20) + 30), "rocker-shop-door", 2);
  press(at(17, 41, jitter(20) + 30), "rocker-workshop", 1);
  // After hours the back door is opened and left open for 12 minutes.
  add(at(18, 2, 10), "contact-back", "contact", "open");
  add(at(18, 14, 10), "contact-back", "contact", "closed");
  // The flat upstairs: evening scene, later lights off.
  press(at(19, 15, 3), "rocker-flat", 2);
  // A visitor on the dark front path, twice within two minutes.
  add(at(22, 10, 5), "sensor-path", "motion", true);
  add(at(22, 11, 40), "sensor-path", "motion", true);
  press(at(23, 5, 20), "rocker-flat", 1);

  raw.sort((a, b) => a.at - b.at);
  const date = formatLocalDate(day);
  return raw.map((e, i) => ({ id: `sim-${siteId}-${date}-${String(i + 1).padStart(4, "0")}`, ...e }));
}

export type Batch = { from: number; to: number; events: SimEvent[] };

/** Half-hour windows of simulated time; empty ones are skipped. */
export function batchesOf(events: SimEvent[], minutes = BATCH_MINUTES): Batch[] {
  const size = minutes * 60_000;
  const byWindow = new Map<number, SimEvent[]>();
  for (const e of events) {
    const start = Math.floor(e.at / size) * size;
    const list = byWindow.get(start) ?? [];
    list.push(e);
    byWindow.set(start, list);
  }
  return [...byWindow.entries()]
    .sort(([a], [b]) => a - b)
    .map(([from, list]) => {
      if (list.length > MAX_BATCH) throw new Error(`a ${minutes}-minute window holds ${list.length} events, more than a batch may carry`);
      return { from, to: from + size, events: list };
    });
}

type Answer = { accepted: number; duplicates: string[]; rejected: { index: number; field: string; message: string }[]; commands: unknown[] };
export type Summary = { batches: number; events: number; accepted: number; duplicates: number; rejected: number; commands: number; failed: number };
type Io = { fetch: typeof fetch; log: (line: string) => void; sleep: (ms: number) => Promise<void> };

const defaultIo: Io = { fetch: (...args) => fetch(...args), log: (line) => console.log(line), sleep: (ms) => new Promise((r) => setTimeout(r, ms)) };

/** Posts the batches in order, pacing them by --speed; stops at once on 401 (a wrong key makes every batch fail). */
export async function runSimulator(options: Omit<SimOptions, "key" | "day"> & { key: string; day: LocalDate; timeZone: string }, io: Io = defaultIo): Promise<Summary> {
  const events = buildDay({ siteId: options.siteId, day: options.day, timeZone: options.timeZone });
  // All at once (speed 0) goes as one batch: the live timer worker cannot step in
  // between and move the site's clock past the rest of the (earlier) day.
  const batches = batchesOf(events, options.speed === 0 ? 24 * 60 : BATCH_MINUTES);
  const endpoint = `${options.url}/api/v1/sites/${encodeURIComponent(options.siteId)}/events`;
  const clock = new Intl.DateTimeFormat("en-GB", { timeZone: options.timeZone, hour: "2-digit", minute: "2-digit", hourCycle: "h23" });
  const summary: Summary = { batches: 0, events: 0, accepted: 0, duplicates: 0, rejected: 0, commands: 0, failed: 0 };
  // The first batch goes at once; each later one after its half hour, compressed.
  let simulatedNow = batches[0]?.to ?? 0;

  for (const batch of batches) {
    if (options.speed > 0) await io.sleep(Math.max(0, (batch.to - simulatedNow) / options.speed));
    simulatedNow = batch.to;
    // The times of the first and last event it carries, in the site's local time.
    const label = `${clock.format(batch.events[0].at)}–${clock.format(batch.events[batch.events.length - 1].at)}`;
    let res: Response;
    try {
      res = await io.fetch(endpoint, {
        method: "POST",
        headers: { authorization: `Bearer ${options.key}`, "content-type": "application/json" },
        body: JSON.stringify({ events: batch.events }),
        signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
      });
    } catch (err) {
      summary.failed++;
      io.log(`${label}  ${String(batch.events.length).padStart(3)} events  not sent: ${err instanceof Error ? err.message : String(err)}`);
      if (summary.failed >= 3) throw new Error(`the console at ${options.url} did not answer three times; is it running?`);
      continue;
    }
    const body = (await res.json().catch(() => null)) as (Answer & { message?: string }) | null;
    if (res.status === 401) throw new Error(`the console refused the key (401): ${body?.message ?? ""}`.trim());
    if ((res.status !== 200 && res.status !== 422) || !body || !Array.isArray(body.rejected)) {
      summary.failed++;
      io.log(`${label}  ${String(batch.events.length).padStart(3)} events  failed: HTTP ${res.status} ${body?.message ?? ""}`.trimEnd());
      continue;
    }
    summary.batches++;
    summary.events += batch.events.length;
    summary.accepted += body.accepted;
    summary.duplicates += body.duplicates.length;
    summary.rejected += body.rejected.length;
    summary.commands += body.commands.length;
    io.log(`${label}  ${String(batch.events.length).padStart(3)} event${batch.events.length === 1 ? " " : "s"}  accepted ${body.accepted}, duplicates ${body.duplicates.length}, rejected ${body.rejected.length}, commands ${body.commands.length}`);
    for (const r of body.rejected.slice(0, 5)) io.log(`    rejected #${r.index} ${r.field}: ${r.message}`);
  }
  return summary;
}

async function main() {
  const started = Date.now();
  const options = parseSimulatorArgs(process.argv.slice(2));
  if (options.siteId !== DEMO_SITE_ID) console.warn(`gateway simulator: the day is written for the demo site's devices; "${options.siteId}" will reject what it has no device for.`);
  let key = options.key;
  let timeZone = demoSite.timeZone;
  if (!key) {
    const { DATABASE_URL, DATABASE_AUTH_TOKEN } = env();
    const minted = await mintKeyInDatabase({ url: DATABASE_URL, authToken: DATABASE_AUTH_TOKEN, siteId: options.siteId, name: "Gateway simulator" });
    key = minted.key;
    timeZone = minted.timeZone;
    console.log(`Minted a gateway key "Gateway simulator" for ${options.siteId} in ${DATABASE_URL}. It is shown once; revoke it under Gateway keys when done:\n  ${key}`);
  }
  const day = options.day ?? addDays(localDateOf(Date.now(), timeZone), -1);
  const dayStart = localToInstant(day, 0, timeZone);
  if (dayStart > Date.now()) throw new Error(`${formatLocalDate(day)} has not begun at the site; the gateway API refuses events from the future. Pick an earlier --day.`);
  if (localToInstant(addDays(day, 1), 0, timeZone) > Date.now()) console.warn("gateway simulator: the day is not over at the site, so its later events will be rejected as ahead of the server's clock.");

  console.log(`Posting ${formatLocalDate(day)} (${timeZone}) to ${options.url} for site ${options.siteId}, ${options.speed === 0 ? "all at once" : `${options.speed}× speed`}.`);
  const s = await runSimulator({ ...options, key, day, timeZone });
  console.log(
    `Done in ${((Date.now() - started) / 1000).toFixed(1)} s: ${s.batches} batches, ${s.events} events: ${s.accepted} accepted, ${s.duplicates} duplicates, ${s.rejected} rejected; ${s.commands} commands${s.failed ? `; ${s.failed} batches failed` : ""}.`,
  );
  if (s.failed) process.exitCode = 1;
}

const isDirectRun = process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href;
if (isDirectRun) {
  main().catch((error: unknown) => {
    console.error(`gateway simulator: ${error instanceof Error ? error.message : String(error)}`);
    process.exit(1);
  });
}
