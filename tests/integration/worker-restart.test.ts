import { spawn } from "node:child_process";
import { createInterface } from "node:readline";
import { pathToFileURL } from "node:url";
import { and, asc, eq, gt } from "drizzle-orm";
import { describe, expect, it, vi } from "vitest";
import { engineStates, engineSteps, events, noticesOutbox } from "@/db/schema";
import type { DeviceEvent, GatewayCommand, TraceEntry } from "@/lib/bus/types";
import { seedDemoSite } from "./helpers";

const SITE = "larch-lane";
const dev = (key: string) => `larch-lane-dev-${key}`;
/** Local time at the demo site (zone WET, +1 h in summer) on Thursday 2024-06-20. */
const local = (hh: number, mm = 0) => Date.UTC(2024, 5, 20, hh - 1, mm);
/** The front path zone is the fifth in the seed: group 0xC000 + 4 (db/seed/demo-site.ts). */
const PATH_GROUP = 0xc004;
const VACANCY_RULE = "t-path-vacant";

type StepOutput = { commands: GatewayCommand[]; trace: TraceEntry[]; notices: unknown[]; changes: unknown[] };

/** Fresh copies of the worker, the store and the database handle, as a restarted process would have. */
async function restartedProcess() {
  const [{ getDb }, worker, live] = await Promise.all([import("@/db"), import("@/workers/engine-worker"), import("@/db/queries/live")]);
  return { db: getDb(), worker, live };
}

/** Drops every module and the database client: whatever an engine kept in memory is gone. */
async function crash() {
  const { getDb } = await import("@/db");
  getDb().$client.close();
  delete (globalThis as { joulepathDb?: unknown }).joulepathDb;
  vi.resetModules();
}

function event(id: string, at: number, device: string, kind: string, value: DeviceEvent["value"]): DeviceEvent {
  return { id, siteId: SITE, at, device: dev(device), kind, value };
}

async function stepsAfter(seq: number) {
  const { db } = await restartedProcess();
  const rows = await db.select().from(engineSteps).where(and(eq(engineSteps.siteId, SITE), gt(engineSteps.seq, seq))).orderBy(asc(engineSteps.seq));
  return rows.map((r) => ({ seq: r.seq, eventSeq: r.eventSeq, at: r.at, output: r.output as StepOutput }));
}

async function lastStepSeq(): Promise<number> {
  const { db } = await restartedProcess();
  const rows = await db.select({ seq: engineSteps.seq }).from(engineSteps).orderBy(asc(engineSteps.seq));
  return rows.at(-1)?.seq ?? 0;
}

const namesVacancyRule = (output: StepOutput) => output.trace.some((t) => t.rules.some((r) => r.ruleId === VACANCY_RULE) && t.actions.some((a) => a.ruleId === VACANCY_RULE));
const quiet = { info: () => undefined, error: () => undefined };

describe("engine worker: timers survive a restart and fire exactly once", () => {
  it("the worker process starts on DATABASE_URL and stops cleanly on SIGTERM", async () => {
    await seedDemoSite();
    // Nothing has run yet, so no site has a timer: the worker only ticks. Same command as scripts/run-app.ts.
    const child = spawn("node_modules/.bin/tsx", ["workers/engine-worker.ts"], { env: process.env, stdio: ["ignore", "pipe", "pipe"] });
    const out: string[] = [];
    let onLine = () => undefined as void;
    child.stderr.on("data", (b: Buffer) => out.push(b.toString()));
    createInterface({ input: child.stdout }).on("line", (line) => {
      out.push(line);
      onLine();
    });
    const exited = new Promise<number | null>((resolve) => child.on("exit", (code) => resolve(code)));
    await new Promise<void>((resolve) => {
      onLine = () => (out.some((l) => l.includes("firing due timers")) ? resolve() : undefined);
      child.on("exit", () => resolve());
    });
    child.kill("SIGTERM");
    expect(await exited, out.join("\n")).toBe(0);
    expect(out.join("\n")).toContain(process.env.DATABASE_URL!.split("?")[0]);
    expect(out.filter((l) => l.includes("SIGTERM: stopping") || l.includes("stopped.")).length, out.join("\n")).toBe(2);
  });

  it("a vacancy timer set before a crash fires once, at its time, from a fresh process", async () => {
    let { live, worker } = await restartedProcess();
    // 17:00: a light reading starts the site's engine (open, as every live site starts); 17:30 closes it.
    await live.ingestEvents({ siteId: SITE, batch: [event("lux-1700", local(17), "sensor-path", "light-level", 4)], source: "gateway" });
    const closing = await worker.fireDueOnce({ owner: "w-close", now: local(17, 31), log: quiet });
    expect(closing.advanced.map((a) => a.siteId)).toEqual([SITE]);
    expect((await live.getLiveState({ siteId: SITE }))?.mode).toBe("closed");

    // 17:40, after hours and dark: motion lights the path and leaves a notice for the flat.
    const visit = await live.ingestEvents({ siteId: SITE, batch: [event("motion-1740", local(17, 40), "sensor-path", "motion", true)], source: "gateway" });
    expect(visit.commands.map((c) => [c.destination, c.message])).toEqual([[PATH_GROUP, "light-lightness-set-unack"]]);
    const before = await lastStepSeq();
    const dueAt = (await live.getLiveState({ siteId: SITE }))!.timers.entries.find((t) => t.payload.kind === "vacancy")!.due;
    expect(dueAt).toBe(local(17, 43));

    await crash();
    ({ live, worker } = await restartedProcess());

    // 17:42: a minute early. Nothing is claimed, nothing stored.
    const early = await worker.fireDueOnce({ owner: "w-restarted", now: local(17, 42), log: quiet });
    expect(early).toEqual({ claimed: [], advanced: [], failed: [], returned: [] });
    expect(await stepsAfter(before)).toEqual([]);

    // 17:44: the timer is due. One step, for the vacancy rule, setting the path group to 0 %.
    const due = await worker.fireDueOnce({ owner: "w-restarted", now: local(17, 44), log: quiet });
    expect(due.advanced).toEqual([{ siteId: SITE, stepSeq: expect.any(Number), commands: 1 }]);
    const fired = await stepsAfter(before);
    expect(fired).toHaveLength(1);
    expect(fired[0].eventSeq).toBeNull();
    expect(namesVacancyRule(fired[0].output)).toBe(true);
    // Light Lightness Set Unacknowledged 82 4D, lightness 0x0000, then TID, then 10 s fade = 0x4A (Mesh Model 1.0.1 §6.3.1.3, §3.1.3).
    expect(fired[0].output.commands.map((c) => [c.at, c.addressing, c.destination, c.message, c.ruleId])).toEqual([[dueAt, "group", PATH_GROUP, "light-lightness-set-unack", VACANCY_RULE]]);
    expect(fired[0].output.commands[0].bytes).toMatch(/^82 4D 00 00 [0-9A-F]{2} 4A 00$/);
    const state = await live.getLiveState({ siteId: SITE });
    expect(state!.levels[dev("light-path-1")]).toBe(0);
    expect(state!.timers.entries.some((t) => t.payload.kind === "vacancy")).toBe(false);

    // Again, and later still: the vacancy rule never fires a second time.
    await crash();
    ({ live, worker } = await restartedProcess());
    expect((await worker.fireDueOnce({ owner: "w-again", now: local(17, 44), log: quiet })).claimed).toEqual([]);
    expect((await worker.fireDueOnce({ owner: "w-again", now: local(17, 50), log: quiet })).claimed).toEqual([]);
    // 17:56: the sensor's 15-min occupancy time ends; that step is the engine's own, not the rule's.
    const idle = await worker.fireDueOnce({ owner: "w-again", now: local(17, 56), log: quiet });
    expect(idle.advanced.map((a) => a.siteId)).toEqual([SITE]);
    const all = await stepsAfter(before);
    expect(all).toHaveLength(2);
    expect(all.filter((s) => namesVacancyRule(s.output))).toHaveLength(1);

    // The visitor notice waits in the outbox for the notices worker; this worker delivers nothing.
    const { db } = await restartedProcess();
    const notices = await db.select().from(noticesOutbox).where(eq(noticesOutbox.siteId, SITE));
    expect(notices.map((n) => [n.status, n.text])).toEqual([["pending", "Someone is on the front path (17:40)."]]);
  });

  it("two workers racing for the same due site advance it exactly once", async () => {
    const { live, worker } = await restartedProcess();
    await live.ingestEvents({ siteId: SITE, batch: [event("motion-1810", local(18, 10), "sensor-path", "motion", true)], source: "gateway" });
    const before = await lastStepSeq();

    const [a, b] = await Promise.all([
      worker.fireDueOnce({ owner: "w-a", now: local(18, 14), log: quiet }),
      worker.fireDueOnce({ owner: "w-b", now: local(18, 14), log: quiet }),
    ]);
    expect([...a.claimed, ...b.claimed]).toEqual([SITE]);
    expect([...a.advanced, ...b.advanced].map((x) => x.siteId)).toEqual([SITE]);
    expect([...a.failed, ...b.failed]).toEqual([]);
    const fired = await stepsAfter(before);
    expect(fired.filter((s) => namesVacancyRule(s.output))).toHaveLength(1);
    expect(fired).toHaveLength(1);
    // The lease was given back.
    const { db } = await restartedProcess();
    const [row] = await db.select().from(engineStates).where(eq(engineStates.siteId, SITE));
    expect([row.leaseOwner, row.leaseUntil]).toEqual([null, null]);
  });

  it("two worker processes racing for the same due site advance it exactly once", async () => {
    const { live } = await restartedProcess();
    await live.ingestEvents({ siteId: SITE, batch: [event("motion-1820", local(18, 20), "sensor-path", "motion", true)], source: "gateway" });
    const before = await lastStepSeq();

    // Each child loads the worker, says "ready", and fires once when told "go", so both claim within a millisecond or two.
    const code = `
      import { createInterface } from "node:readline";
      const { fireDueOnce } = await import(${JSON.stringify(pathToFileURL(`${process.cwd()}/workers/engine-worker.ts`).href)});
      await import("@/db/queries/live");
      const quiet = { info() {}, error(m) { console.error(m); } };
      console.log("ready");
      for await (const _ of createInterface({ input: process.stdin })) break;
      const result = await fireDueOnce({ owner: process.env.OWNER, now: ${local(18, 24)}, log: quiet });
      console.log(JSON.stringify(result));
      process.exit(0);
    `;
    const run = (owner: string) => {
      const child = spawn(process.execPath, ["--import", "tsx", "--conditions=react-server", "--input-type=module", "--eval", code], { env: { ...process.env, OWNER: owner }, stdio: ["pipe", "pipe", "pipe"] });
      const err: string[] = [];
      child.stderr.on("data", (b: Buffer) => err.push(b.toString()));
      const lines = createInterface({ input: child.stdout })[Symbol.asyncIterator]();
      return {
        child,
        ready: lines.next().then((l) => expect(l.value, err.join("")).toBe("ready")),
        result: lines.next().then((l) => {
          expect(l.value, err.join("")).toBeDefined();
          return JSON.parse(l.value as string) as { claimed: string[]; advanced: { siteId: string }[]; failed: unknown[] };
        }),
      };
    };
    const workers = [run("proc-a"), run("proc-b")];
    await Promise.all(workers.map((w) => w.ready));
    for (const w of workers) w.child.stdin.end("go\n");
    const [a, b] = await Promise.all(workers.map((w) => w.result));
    expect([...a.claimed, ...b.claimed]).toEqual([SITE]);
    expect([...a.advanced, ...b.advanced].map((x) => x.siteId)).toEqual([SITE]);
    expect([...a.failed, ...b.failed]).toEqual([]);
    const fired = await stepsAfter(before);
    expect(fired).toHaveLength(1);
    expect(namesVacancyRule(fired[0].output)).toBe(true);
  });

  it("a lease left by a crashed worker holds the site until it lapses, then the timer fires once", async () => {
    const { live, worker } = await restartedProcess();
    await live.ingestEvents({ siteId: SITE, batch: [event("motion-1830", local(18, 30), "sensor-path", "motion", true)], source: "gateway" });
    const before = await lastStepSeq();
    // A worker claims at 18:34 and dies before advancing or releasing.
    expect(await live.claimDueSites({ owner: "w-dead", now: local(18, 34), leaseMs: 15_000 })).toEqual([SITE]);

    expect((await worker.fireDueOnce({ owner: "w-live", now: local(18, 34) + 14_000, log: quiet })).claimed).toEqual([]);
    expect(await stepsAfter(before)).toEqual([]);
    const lapsed = await worker.fireDueOnce({ owner: "w-live", now: local(18, 34) + 15_001, log: quiet });
    expect(lapsed.advanced.map((a) => a.siteId)).toEqual([SITE]);
    const fired = await stepsAfter(before);
    expect(fired).toHaveLength(1);
    expect(namesVacancyRule(fired[0].output)).toBe(true);
  });

  it("a failing advance is logged and gives its lease back", async () => {
    const { db, live, worker } = await restartedProcess();
    await live.ingestEvents({ siteId: SITE, batch: [event("motion-1840", local(18, 40), "sensor-path", "motion", true)], source: "gateway" });
    const [saved] = await db.select().from(engineStates).where(eq(engineStates.siteId, SITE));
    // A state the engine cannot read (no timers): advancing throws.
    await db.update(engineStates).set({ state: { version: 1 } }).where(eq(engineStates.siteId, SITE));
    const before = await lastStepSeq();
    const errors: string[] = [];
    const result = await worker.fireDueOnce({ owner: "w-poisoned", now: local(18, 44), log: { info: () => undefined, error: (m) => errors.push(m) } });
    expect(result.claimed).toEqual([SITE]);
    expect(result.advanced).toEqual([]);
    expect(result.failed.map((f) => f.siteId)).toEqual([SITE]);
    expect(errors.some((m) => m.includes(`site ${SITE}`) && m.includes("failed"))).toBe(true);
    const [row] = await db.select().from(engineStates).where(eq(engineStates.siteId, SITE));
    expect([row.leaseOwner, row.leaseUntil, row.revision]).toEqual([null, null, saved.revision]);
    expect(await stepsAfter(before)).toEqual([]);

    // Repaired, the next round fires the timer once.
    await db.update(engineStates).set({ state: saved.state }).where(eq(engineStates.siteId, SITE));
    expect((await worker.fireDueOnce({ owner: "w-poisoned", now: local(18, 44), log: quiet })).advanced.map((a) => a.siteId)).toEqual([SITE]);
    expect((await stepsAfter(before)).filter((s) => namesVacancyRule(s.output))).toHaveLength(1);
  });

  it("a worker told to stop gives back what it claimed without advancing it", async () => {
    const { db, live, worker } = await restartedProcess();
    await live.ingestEvents({ siteId: SITE, batch: [event("motion-1845", local(18, 45), "sensor-path", "motion", true)], source: "gateway" });
    const before = await lastStepSeq();
    const controller = new AbortController();
    controller.abort();
    const result = await worker.fireDueOnce({ owner: "w-stopping", now: local(18, 49), signal: controller.signal, log: quiet });
    expect([result.claimed, result.returned, result.advanced]).toEqual([[SITE], [SITE], []]);
    const [row] = await db.select().from(engineStates).where(eq(engineStates.siteId, SITE));
    expect([row.leaseOwner, row.leaseUntil]).toEqual([null, null]);
    expect(await stepsAfter(before)).toEqual([]);
    // The next worker round fires it.
    expect((await worker.fireDueOnce({ owner: "w-next", now: local(18, 49), log: quiet })).advanced.map((a) => a.siteId)).toEqual([SITE]);
    expect((await stepsAfter(before)).filter((s) => namesVacancyRule(s.output))).toHaveLength(1);
  });

  it("the worker loop fires what falls due and stops when aborted", async () => {
    const { live, worker } = await restartedProcess();
    await live.ingestEvents({ siteId: SITE, batch: [event("motion-1850", local(18, 50), "sensor-path", "motion", true)], source: "gateway" });
    const before = await lastStepSeq();
    let clock = local(18, 52);
    const ticks: { at: number; advanced: string[] }[] = [];
    const controller = new AbortController();
    const loop = worker.runEngineWorker({
      owner: "w-loop",
      intervalMs: 5,
      clock: () => clock,
      signal: controller.signal,
      log: quiet,
      onTick: (r) => {
        ticks.push({ at: clock, advanced: r.advanced.map((a) => a.siteId) });
        if (ticks.length === 3) clock = local(18, 54);
        if (ticks.length === 6) controller.abort();
      },
    });
    await loop;
    expect(ticks.map((t) => t.advanced.length)).toEqual([0, 0, 0, 1, 0, 0]);
    const fired = await stepsAfter(before);
    expect(fired).toHaveLength(1);
    expect(namesVacancyRule(fired[0].output)).toBe(true);
  });

  it("ingesting the same event id twice stores one event and one step", async () => {
    const { db, live } = await restartedProcess();
    const press = event("press-1900", local(19), "rocker-flat", "press", 2);
    const before = await lastStepSeq();
    const first = await live.ingestEvents({ siteId: SITE, batch: [press], source: "gateway" });
    const second = await live.ingestEvents({ siteId: SITE, batch: [press], source: "gateway" });
    // And twice within one batch, with another new event beside it.
    const third = await live.ingestEvents({ siteId: SITE, batch: [press, { ...press, id: "press-1901", at: local(19, 1) }, press], source: "gateway" });
    expect([first.accepted.length, first.duplicates]).toEqual([1, []]);
    expect([second.accepted.length, second.duplicates, second.commands]).toEqual([0, ["press-1900"], []]);
    expect([third.accepted.map((a) => a.id), third.duplicates]).toEqual([["press-1901"], ["press-1900", "press-1900"]]);
    const stored = await db.select().from(events).where(and(eq(events.siteId, SITE), eq(events.eventId, "press-1900")));
    expect(stored).toHaveLength(1);
    const steps = await stepsAfter(before);
    expect(steps.filter((s) => s.eventSeq === stored[0].seq)).toHaveLength(1);
    expect(steps).toHaveLength(2);
  });
});

