"use client";

import { useEffect, useId, useRef, useState } from "react";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import { useShortDevices } from "@/components/energy/short-mark";
import type { BenchAction, BenchSource, BenchView } from "@/lib/validation/bench";
import { BenchClock } from "./bench-clock";
import { BenchPlan } from "./bench-plan";
import { DeviceControl, isOperable } from "./device-controls";
import { ScenariosPanel } from "./scenarios-panel";
import { ModeAndLatch, ZoneLevels } from "./site-state";
import { BenchNotices, StepFeed } from "./step-feed";
import { useAnimatedLevels } from "./use-animated-levels";
import { errorText, useBench, useBenchCall } from "./use-bench";

function RulesChoice({ view, isBusy, onChoose }: { view: BenchView; isBusy: boolean; onChoose: (s: BenchSource) => void }) {
  const name = useId();
  const active = view.rules.activeVersion;
  const options: { value: BenchSource; label: string }[] = [
    { value: "active", label: active ? `Active rule set (version ${active.number})` : "Active rule set (none yet)" },
    { value: "draft", label: `Draft (revision ${view.rules.draftRevision})` },
  ];
  return (
    <fieldset className="flex flex-wrap items-center gap-x-4 gap-y-1">
      <legend className="sr-only">Rules the bench runs</legend>
      <span className="text-sm text-slate" aria-hidden="true">Runs:</span>
      {options.map((o) => (
        <label key={o.value} className="flex items-center gap-1.5 text-sm font-semibold">
          <input type="radio" name={name} value={o.value} checked={view.session.source === o.value} disabled={isBusy} onChange={() => onChoose(o.value)} className="accent-ink" />
          {o.label}
        </label>
      ))}
    </fieldset>
  );
}

export function BenchPanel({ siteId, source }: { siteId: string; source?: BenchSource }) {
  const bench = useBench(siteId, source);
  const call = useBenchCall(siteId);
  const [deliver, setDeliver] = useState(false);
  const deliverId = useId();
  const switched = useRef(false);
  const { levels, moving } = useAnimatedLevels(bench.data);
  // Devices that run short of energy under the rules this bench runs (asked again when it switches).
  const energy = useShortDevices(siteId, bench.data?.session.source ?? "active", !!bench.data);

  // "Try on bench" opens ?source=draft: switch an existing sandbox to the rules asked for, once.
  const { mutate } = call;
  const sessionSource = bench.data?.session.source;
  useEffect(() => {
    if (!source || !sessionSource || switched.current) return;
    switched.current = true;
    if (sessionSource !== source) mutate({ path: "", method: "PATCH", body: { source } });
  }, [source, sessionSource, mutate]);

  if (bench.isPending) return <LoadingPanel label="Preparing the bench…" />;
  if (bench.isError) return <ErrorPanel title="The bench could not be opened." detail={errorText(bench.error) ?? undefined} onRetry={() => void bench.refetch()} />;

  const view = bench.data;
  const names = new Map<string, string>([...view.devices.map((d) => [d.id, d.name] as const), ...view.zones.map((z) => [z.id, z.name] as const)]);
  const nameOf = (id: string) => names.get(id) ?? id;
  const isBusy = call.isPending;
  const act = (action: BenchAction) => call.mutate({ path: "/actions", body: { action, deliverNotices: deliver } });
  const operable = view.devices.filter(isOperable);
  const zonesWithControls = [...view.zones.map((z) => ({ id: z.id as string | null, name: z.name })), { id: null, name: "Not in a zone" }]
    .map((z) => ({ ...z, devices: operable.filter((d) => d.zoneId === z.id) }))
    .filter((z) => z.devices.length);
  const recorded = new Set(view.steps.filter((s) => s.input.action.type !== "reset").map((s) => s.input.actionId)).size;

  return (
    <div className="space-y-5" data-testid="bench">
      <header className="space-y-2">
        <div className="flex flex-wrap items-center gap-x-6 gap-y-2">
          <h1 className="mr-auto text-2xl font-extrabold">Test bench</h1>
          <RulesChoice view={view} isBusy={isBusy} onChoose={(s) => call.mutate({ path: "", method: "PATCH", body: { source: s } })} />
          <button type="button" disabled={isBusy} onClick={() => call.mutate({ path: "/reset", body: {} })} className="rounded-md bg-ink px-3 py-1.5 text-sm font-semibold text-fog disabled:opacity-50">
            Reset to live state
          </button>
        </div>
        <p className="rounded-lg border border-line bg-paper px-3 py-2 text-sm">
          A sandbox copy of the site: nothing here changes the live state or sends commands to the mesh. Notices show as <strong>would send</strong>.
        </p>
      </header>

      <BenchClock now={view.state.now} timeZone={view.site.timeZone} isBusy={isBusy} onSkip={(minutes) => call.mutate({ path: "/clock", body: { minutes, deliverNotices: deliver } })} onSkipTo={(time) => call.mutate({ path: "/clock", body: { time, deliverNotices: deliver } })} onSetDate={(date, time) => call.mutate({ path: "/date", body: { date, time } })} />

      <div className="flex flex-wrap items-start gap-2 rounded-lg border border-harvest/60 bg-paper px-3 py-2">
        <input id={deliverId} type="checkbox" checked={deliver} onChange={(e) => setDeliver(e.target.checked)} className="mt-1 accent-harvest" aria-describedby={`${deliverId}-hint`} />
        <div>
          <label htmlFor={deliverId} className="text-sm font-semibold">Deliver notices for real (marked as a test)</label>
          <p id={`${deliverId}-hint`} className="text-xs text-slate">Off by default. When on, notices from your next actions go to people&apos;s phones and inboxes, starting with &ldquo;[Test bench]&rdquo;.</p>
        </div>
      </div>

      <p role={call.isError ? "alert" : "status"} aria-live="polite" className={`-my-3 min-h-5 text-sm font-semibold ${call.isError ? "text-clay" : "text-slate"}`}>
        {call.isError ? errorText(call.error) : isBusy ? "Running…" : ""}
      </p>

      <div className="grid gap-6 lg:grid-cols-[minmax(0,24rem)_minmax(0,1fr)]">
        <section aria-labelledby="bench-devices-title" className="space-y-3">
          <h2 id="bench-devices-title" className="font-bold">Devices to operate</h2>
          {zonesWithControls.map((z) => (
            <div key={z.id ?? "none"} className="space-y-2">
              <h3 className="text-sm font-bold text-slate">{z.name}</h3>
              <ul className="space-y-2">
                {z.devices.map((d) => <DeviceControl key={d.id} device={d} state={view.state} isBusy={isBusy} onAct={act} energy={{ siteId, source: view.session.source, short: energy.byDevice.get(d.id) }} />)}
              </ul>
            </div>
          ))}
          {zonesWithControls.length === 0 ? <p className="text-sm text-slate">This site has no switches or sensors yet.</p> : null}
        </section>
        <div className="min-w-0 space-y-6">
          <ModeAndLatch view={view} isBusy={isBusy} onClear={() => act({ type: "clear-emergency" })} />
          <BenchPlan
            view={view}
            levels={levels}
            onPick={(id) => {
              const el = document.getElementById(`bench-device-${id}`);
              el?.scrollIntoView({ block: "center" });
              el?.querySelector<HTMLElement>("button, input, select")?.focus();
            }}
          />
          <ZoneLevels view={view} levels={levels} moving={moving} />
          <BenchNotices view={view} />
          <StepFeed view={view} nameOf={nameOf} />
        </div>
      </div>

      <ScenariosPanel siteId={siteId} nameOf={nameOf} deliverNotices={deliver} recorded={recorded} isBusy={isBusy} />
    </div>
  );
}
