import { and, asc, desc, eq } from "drizzle-orm";
import { randomUUID } from "node:crypto";
import { getDb } from "@/db";
import { serialisedWrite } from "@/db/write-lock";
import { benchScenarios, benchSessions, benchSteps, noticesOutbox, type BenchSession } from "@/db/schema";
import { buttonsOf } from "@/lib/bench/actions";
import { createSandbox, type Sandbox } from "@/lib/bench/sandbox";
import { benchStateOf } from "@/lib/bench/state";
import type { EngineState } from "@/lib/bus/types";
import { AppError } from "@/lib/errors";
import { compileGraph, type RuleJson } from "@/lib/rules/compile";
import { parseRuleGraph } from "@/lib/rules/graph";
import { buildRuleIndex } from "@/lib/rules/rule-index";
import type { BenchAction, BenchScenarioDto, BenchSource, BenchStepDto, BenchStepInput, BenchView } from "@/lib/validation/bench";
import { listFloors } from "./floors";
import { getLiveState, loadEngineInput } from "./live";
import { getRuleSet, validateDraftGraph } from "./rule-sets";
import { getSite } from "./sites";
import { listZones } from "./zones";

type Who = { siteId: string; userId: string };
const FEED_LENGTH = 40;

/** The site as the engine sees it, with the rules the bench runs: the active version's, or the draft compiled now. */
async function loadContext(siteId: string, source: BenchSource) {
  const loaded = await loadEngineInput(siteId);
  let rules: RuleJson[] = loaded.rules;
  let draftRevision: number | null = null;
  if (source === "draft") {
    const ruleSet = await getRuleSet({ siteId });
    draftRevision = ruleSet.draftRevision;
    try {
      rules = compileGraph(parseRuleGraph(ruleSet.draftGraph));
    } catch {
      const problems = (await validateDraftGraph({ siteId, graph: ruleSet.draftGraph })).filter((p) => p.severity === "error");
      throw new AppError("bad_request", "The draft cannot run on the bench until the Canvas shows no errors; switch to the active rule set meanwhile.", { problems });
    }
  }
  return { ...loaded, rules: buildRuleIndex(rules), versionId: source === "active" ? loaded.versionId : null, draftRevision };
}

type Context = Awaited<ReturnType<typeof loadContext>>;

function sandboxFor(ctx: Context, siteId: string, person: string, delivered: boolean, state: EngineState | undefined): Sandbox {
  return createSandbox({ siteId, input: ctx.input, rules: ctx.rules, devices: ctx.devices, person, newId: () => `bench-${randomUUID()}`, delivered }, state);
}

async function findSession({ siteId, userId }: Who): Promise<BenchSession | undefined> {
  const [row] = await getDb().select().from(benchSessions).where(and(eq(benchSessions.siteId, siteId), eq(benchSessions.userId, userId)));
  return row;
}

/**
 * Stores what a sandbox did: its state, the steps (replacing the old feed after a
 * reset), and — only when the person asked — its notices in the outbox, marked as
 * a test. One transaction, guarded by the session's last update time so two tabs
 * cannot interleave. Never touches events, engine_states or gateway_commands.
 */
async function saveSandbox({ siteId, session, sandbox, ctx, source, deliverNotices }: { siteId: string; session: BenchSession; sandbox: Sandbox; ctx: Context; source: BenchSource; deliverNotices: boolean }) {
  const updatedAt = new Date(Math.max(Date.now(), session.updatedAt.getTime() + 1));
  await serialisedWrite(() =>
    getDb().transaction(async (tx) => {
      const done = await tx
        .update(benchSessions)
        .set({ state: sandbox.state(), source, versionId: ctx.versionId, draftRevision: ctx.draftRevision, updatedAt })
        .where(and(eq(benchSessions.id, session.id), eq(benchSessions.updatedAt, session.updatedAt)))
        .returning({ id: benchSessions.id });
      if (!done.length) throw new AppError("conflict", "The bench changed in another tab while this ran; reload and try again.");
      if (sandbox.isCleared()) await tx.delete(benchSteps).where(eq(benchSteps.sessionId, session.id));
      const steps = sandbox.steps();
      if (steps.length) await tx.insert(benchSteps).values(steps.map((s) => ({ sessionId: session.id, at: s.at, input: s.input, output: s.output })));
      const notices = deliverNotices ? steps.flatMap((s) => s.output.notices) : [];
      if (notices.length) {
        const sentAt = Date.now();
        await tx
          .insert(noticesOutbox)
          .values(
            notices.map((n) => ({
              siteId,
              dedupeKey: `bench:${session.id}:${n.dedupeKey}`,
              recipient: n.recipient,
              channels: n.channels,
              text: `[Test bench] ${n.text}`,
              // The real time it is sent; the text carries the bench clock's time.
              at: sentAt,
              kind: n.kind,
              zoneId: n.zoneId,
              url: `/sites/${siteId}/bench`,
            })),
          )
          .onConflictDoNothing();
      }
    }),
  );
}

/** The person's bench session, made (as a reset) the first time they open the bench. */
async function ensureSession({ siteId, userId, person, source }: Who & { person: string; source: BenchSource }): Promise<BenchSession> {
  const existing = await findSession({ siteId, userId });
  if (existing) return existing;
  const ctx = await loadContext(siteId, source);
  const sandbox = sandboxFor(ctx, siteId, person, false, undefined);
  await sandbox.reset(await getLiveState({ siteId }), Date.now());
  const id = randomUUID();
  const created = new Date(0);
  await getDb().insert(benchSessions).values({ id, siteId, userId, source, versionId: ctx.versionId, draftRevision: ctx.draftRevision, state: sandbox.state(), updatedAt: created }).onConflictDoNothing();
  const session = (await findSession({ siteId, userId }))!;
  // Only the request that made the row writes its first feed (a second tab found the row made).
  if (session.id === id) await saveSandbox({ siteId, session, sandbox, ctx, source, deliverNotices: false });
  return (await findSession({ siteId, userId }))!;
}

export async function getBenchView({ siteId, userId, person, source, canClearEmergency }: Who & { person: string; source?: BenchSource; canClearEmergency: boolean }): Promise<BenchView> {
  const session = await ensureSession({ siteId, userId, person, source: source ?? "active" });
  const db = getDb();
  const [site, loaded, zoneRows, floors, ruleSet, stepRows] = await Promise.all([
    getSite({ siteId }),
    loadEngineInput(siteId),
    listZones({ siteId }),
    listFloors({ siteId }),
    getRuleSet({ siteId }),
    db.select().from(benchSteps).where(eq(benchSteps.sessionId, session.id)).orderBy(desc(benchSteps.seq)).limit(FEED_LENGTH),
  ]);
  if (!site) throw new AppError("not_found", "No such site.");
  const names = new Map<string, string>([...loaded.devices.map((d) => [d.id, d.name] as const), ...zoneRows.map((z) => [z.id, z.name] as const)]);
  const active = ruleSet.activeVersionId ? ruleSet.versions.find((v) => v.id === ruleSet.activeVersionId) ?? null : null;
  const ran = session.versionId ? ruleSet.versions.find((v) => v.id === session.versionId) ?? null : null;
  return {
    site: { id: site.id, name: site.name, timeZone: site.timeZone },
    session: { id: session.id, source: session.source, versionId: session.versionId, versionNumber: ran?.number ?? null, draftRevision: session.draftRevision, updatedAt: session.updatedAt.getTime() },
    rules: { activeVersion: active ? { id: active.id, number: active.number } : null, draftRevision: ruleSet.draftRevision },
    state: benchStateOf(session.state as EngineState, (id) => names.get(id) ?? id),
    devices: loaded.devices.map((d) => ({ id: d.id, name: d.name, kind: d.kind, zoneId: d.zoneId, floorId: d.floorId, x: d.x, y: d.y, unicastAddress: d.unicastAddress, buttons: buttonsOf(d) })),
    zones: zoneRows.map((z) => ({ id: z.id, name: z.name, groupAddress: z.groupAddress })),
    floors: floors.map((f) => ({ id: f.id, name: f.name, sortOrder: f.sortOrder, pixelsPerMetre: f.pixelsPerMetre, plan: f.plan })),
    steps: stepRows.reverse().map((r) => ({ seq: r.seq, at: r.at, input: r.input as BenchStepInput, output: r.output as BenchStepDto["output"] })),
    canClearEmergency,
  };
}

type RunArgs = Who & { person: string; deliverNotices: boolean };

/** Reset: the sandbox becomes a copy of the live state again (or a fresh one), optionally on the other rules. */
export async function resetBench({ siteId, userId, person, source }: Who & { person: string; source?: BenchSource }): Promise<void> {
  const session = await ensureSession({ siteId, userId, person, source: source ?? "active" });
  const next = source ?? session.source;
  const ctx = await loadContext(siteId, next);
  const sandbox = sandboxFor(ctx, siteId, person, false, undefined);
  await sandbox.reset(await getLiveState({ siteId }), Date.now());
  await saveSandbox({ siteId, session, sandbox, ctx, source: next, deliverNotices: false });
}

/** Switches the rules the sandbox runs without touching its state. */
export async function setBenchSource({ siteId, userId, person, source }: Who & { person: string; source: BenchSource }): Promise<void> {
  const session = await ensureSession({ siteId, userId, person, source });
  const ctx = await loadContext(siteId, source);
  const sandbox = sandboxFor(ctx, siteId, person, false, session.state as EngineState);
  await saveSandbox({ siteId, session, sandbox, ctx, source, deliverNotices: false });
}

export async function runBenchAction({ siteId, userId, person, deliverNotices, action }: RunArgs & { action: BenchAction }): Promise<void> {
  const session = await ensureSession({ siteId, userId, person, source: "active" });
  const ctx = await loadContext(siteId, session.source);
  const sandbox = sandboxFor(ctx, siteId, person, deliverNotices, session.state as EngineState);
  await sandbox.run(action);
  await saveSandbox({ siteId, session, sandbox, ctx, source: session.source, deliverNotices });
}

/** The devices a bench action may name, for checking it against the site (422 on a bad one). */
export async function listBenchDevices({ siteId }: { siteId: string }) {
  return (await loadEngineInput(siteId)).devices;
}

/* ---- Scenarios ---- */

function toScenarioDto(row: typeof benchScenarios.$inferSelect): BenchScenarioDto {
  return { id: row.id, name: row.name, steps: row.steps as BenchAction[], updatedAt: row.updatedAt.getTime() };
}

export async function listScenarios({ siteId }: { siteId: string }): Promise<BenchScenarioDto[]> {
  const rows = await getDb().select().from(benchScenarios).where(eq(benchScenarios.siteId, siteId)).orderBy(asc(benchScenarios.name));
  return rows.map(toScenarioDto);
}

export async function getScenario({ siteId, scenarioId }: { siteId: string; scenarioId: string }): Promise<BenchScenarioDto> {
  const [row] = await getDb().select().from(benchScenarios).where(and(eq(benchScenarios.siteId, siteId), eq(benchScenarios.id, scenarioId)));
  if (!row) throw new AppError("not_found", "No such scenario on this site.");
  return toScenarioDto(row);
}

/** The actions the person's bench ran since its last reset, in order: what "save as scenario" keeps. */
export async function sessionActions({ siteId, userId }: Who): Promise<BenchAction[]> {
  const session = await findSession({ siteId, userId });
  if (!session) return [];
  const rows = await getDb().select({ input: benchSteps.input }).from(benchSteps).where(eq(benchSteps.sessionId, session.id)).orderBy(asc(benchSteps.seq));
  const seen = new Set<string>();
  const out: BenchAction[] = [];
  for (const { input } of rows) {
    const i = input as BenchStepInput;
    if (seen.has(i.actionId) || i.action.type === "reset") continue;
    seen.add(i.actionId);
    out.push(i.action);
  }
  return out;
}

function isNameTaken(err: unknown): boolean {
  const text = `${(err as { message?: string })?.message ?? ""} ${String((err as { cause?: unknown })?.cause ?? "")}`;
  return /UNIQUE constraint failed: bench_scenarios\.site_id, bench_scenarios\.name/.test(text);
}

const nameTaken = () => new AppError("conflict", "A scenario with this name already exists on this site; pick another name.", { fields: { name: ["A scenario with this name already exists."] } });

export async function createScenario({ siteId, userId, name, steps }: Who & { name: string; steps: BenchAction[] }): Promise<BenchScenarioDto> {
  try {
    const [row] = await getDb().insert(benchScenarios).values({ id: randomUUID(), siteId, name, steps, createdBy: userId }).returning();
    return toScenarioDto(row);
  } catch (err) {
    if (isNameTaken(err)) throw nameTaken();
    throw err;
  }
}

export async function updateScenario({ siteId, scenarioId, name, steps }: { siteId: string; scenarioId: string; name: string; steps: BenchAction[] }): Promise<BenchScenarioDto> {
  try {
    const [row] = await getDb()
      .update(benchScenarios)
      .set({ name, steps, updatedAt: new Date() })
      .where(and(eq(benchScenarios.siteId, siteId), eq(benchScenarios.id, scenarioId)))
      .returning();
    if (!row) throw new AppError("not_found", "No such scenario on this site.");
    return toScenarioDto(row);
  } catch (err) {
    if (isNameTaken(err)) throw nameTaken();
    throw err;
  }
}

export async function deleteScenario({ siteId, scenarioId }: { siteId: string; scenarioId: string }): Promise<void> {
  const gone = await getDb().delete(benchScenarios).where(and(eq(benchScenarios.siteId, siteId), eq(benchScenarios.id, scenarioId))).returning({ id: benchScenarios.id });
  if (!gone.length) throw new AppError("not_found", "No such scenario on this site.");
}

/**
 * Plays a scenario on the person's bench with its current rules (active or draft):
 * a reset first (unless the scenario starts by setting the date), then each step.
 * A step naming a device the site no longer has stops it; what ran is kept.
 */
export async function playScenario({ siteId, userId, person, deliverNotices, scenarioId }: RunArgs & { scenarioId: string }): Promise<{ played: number; stopped: { step: number; message: string } | null }> {
  const scenario = await getScenario({ siteId, scenarioId });
  const session = await ensureSession({ siteId, userId, person, source: "active" });
  const ctx = await loadContext(siteId, session.source);
  const sandbox = sandboxFor(ctx, siteId, person, deliverNotices, undefined);
  if (scenario.steps[0]?.type !== "set-date") await sandbox.reset(await getLiveState({ siteId }), Date.now());
  const result = await sandbox.play(scenario.steps);
  await saveSandbox({ siteId, session, sandbox, ctx, source: session.source, deliverNotices });
  return result;
}
