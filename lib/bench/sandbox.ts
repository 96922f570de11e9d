import { createEngine, type Engine } from "@/lib/bus/engine";
import type { SiteInput } from "@/lib/bus/site-model";
import type { EngineState, Step } from "@/lib/bus/types";
import type { RuleIndex } from "@/lib/rules/rule-index";
import { localDateOf, localToInstant } from "@/lib/sun/local-time";
import type { BenchAction, BenchStepAction, BenchStepInput } from "@/lib/validation/bench";
import { checkAction, engineInputsFor, setDateSpan, type CheckDevice, type EngineInput } from "./actions";

export type SandboxStep = { at: number; input: BenchStepInput; output: Pick<Step, "changes" | "commands" | "notices" | "trace"> };

type Options = {
  siteId: string;
  input: SiteInput;
  rules: RuleIndex;
  devices: CheckDevice[];
  /** Who acts (named in the Trace when the emergency is cleared). */
  person: string;
  newId: () => string;
  delivered: boolean;
};

const MINUTE_MS = 60_000;

function isEmpty(step: Step): boolean {
  return !step.changes.length && !step.commands.length && !step.notices.length && !step.trace.length;
}

/**
 * The bench's sandbox: the live engine's loop on a copy of the site state. It
 * never touches the database; the caller stores `steps` and `state()` together.
 * `cleared` says the earlier steps belong to a sandbox that was thrown away
 * (a reset or a set-date), so the feed should start again.
 */
export function createSandbox(options: Options, state: EngineState | undefined) {
  let engine: Engine = createEngine({ ...options.input, rules: options.rules, state });
  const steps: SandboxStep[] = [];
  let cleared = false;

  async function feed(inputs: EngineInput[], action: BenchStepAction, actionId: string, keepEmpty: boolean) {
    for (const part of inputs) {
      const step = "event" in part ? await engine.ingest(part.event) : await engine.advanceTo(part.advanceTo);
      if (!keepEmpty && isEmpty(step)) continue;
      const stored = "event" in part ? { event: { id: part.event.id, at: part.event.at, kind: part.event.kind, value: part.event.value, device: part.event.device } } : { advanceTo: part.advanceTo };
      steps.push({ at: step.at, input: { actionId, action, part: stored, delivered: options.delivered }, output: { changes: step.changes, commands: step.commands, notices: step.notices, trace: step.trace } });
    }
  }

  /** A fresh sandbox whose clock starts at local midnight and runs to `to`, so that day's schedules fire in order. */
  async function startFresh(to: number, action: BenchStepAction, actionId: string) {
    engine = createEngine({ ...options.input, rules: options.rules });
    steps.length = 0;
    cleared = true;
    const midnight = localToInstant(localDateOf(to, options.input.site.timeZone), 0, options.input.site.timeZone);
    await feed([{ advanceTo: midnight }, { advanceTo: to }], action, actionId, false);
  }

  /** Runs one bench action on the sandbox's clock. */
  async function run(action: BenchAction) {
    const actionId = options.newId();
    if (action.type === "set-date") {
      const span = setDateSpan(action, options.input.site);
      return startFresh(span.to, action, actionId);
    }
    const now = engine.getState().now ?? Math.floor(Date.now() / MINUTE_MS) * MINUTE_MS;
    const inputs = engineInputsFor(action, { siteId: options.siteId, now, site: options.input.site, newId: options.newId, person: options.person });
    await feed(inputs, action, actionId, true);
  }

  return {
    run,

    /** Reset: a copy of the live state brought up to `wallClock`, or a fresh state for today when the site has none. */
    async reset(live: EngineState | null, wallClock: number) {
      const to = Math.floor(wallClock / MINUTE_MS) * MINUTE_MS;
      const actionId = options.newId();
      if (live && live.now !== null) {
        engine = createEngine({ ...options.input, rules: options.rules, state: live });
        steps.length = 0;
        cleared = true;
        await feed([{ advanceTo: Math.max(to, live.now) }], { type: "reset", from: "live" }, actionId, false);
      } else {
        await startFresh(to, { type: "reset", from: "fresh" }, actionId);
      }
    },

    /**
     * Plays a scenario's steps in order. A step the site no longer allows (a
     * deleted device, a button it lacks) stops playback there and says which.
     */
    async play(actions: BenchAction[]): Promise<{ played: number; stopped: { step: number; message: string } | null }> {
      for (let i = 0; i < actions.length; i++) {
        const problem = checkAction(actions[i], options.devices);
        if (problem) return { played: i, stopped: { step: i + 1, message: `Step ${i + 1} stopped the playback: ${problem.message}` } };
        await run(actions[i]);
      }
      return { played: actions.length, stopped: null };
    },

    state: () => engine.getState(),
    steps: () => steps,
    isCleared: () => cleared,
  };
}

export type Sandbox = ReturnType<typeof createSandbox>;
