"use client";

import { useQuery } from "@tanstack/react-query";
import Link from "next/link";
import { useMemo, useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import { ErrorPanel } from "@/components/ui/error-panel";
import { LoadingPanel } from "@/components/ui/loading-panel";
import { PowerBadge } from "@/components/ui/power-badge";
import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import { evaluateDevice, hourlyLux } from "@/lib/energy/model";
import type { DeviceEnergyResponse } from "@/lib/energy/summary";
import type { DeviceEnergyInput, DeviceEnergyResult } from "@/lib/energy/types";
import type { EnergyQuery } from "@/lib/validation/energy";
import { energyHref } from "./energy-panel";
import { ExplanationList } from "./explanation-list";
import { formatHours, formatInterval, formatJoules, formatMargin, sig } from "./format";
import { StoreChart } from "./store-chart";
import { VERDICT_LABEL, VerdictBadge } from "./verdict-badge";
import { parseWhatIf, WhatIfForm, type WhatIfKey, type WhatIfText } from "./what-if-form";

export function DeviceEnergy({ siteId, deviceId, query }: { siteId: string; deviceId: string; query: EnergyQuery }) {
  const res = useQuery({
    queryKey: ["sites", siteId, "energy", query.source, query.week, deviceId],
    queryFn: () => fetchJson<DeviceEnergyResponse>(`/api/sites/${siteId}/energy/${deviceId}?source=${query.source}&week=${query.week}`),
  });
  if (res.isPending) return <LoadingPanel label="Working out this device's budget…" />;
  if (res.isError) return <ErrorPanel title="This device's budget could not be worked out." detail={res.error.message} onRetry={() => void res.refetch()} />;
  return <DeviceEnergyView siteId={siteId} query={query} data={res.data} />;
}

function currentValues(input: DeviceEnergyInput): Record<WhatIfKey, number | null> {
  const periodic = input.messages.find((m) => m.intervalS !== undefined);
  return {
    luxAtFull: input.power === "solar" ? input.light.luxAtFull : null,
    cellAreaCm2: input.power === "solar" ? input.energy.harvester.cellAreaCm2 : null,
    reportingIntervalS: periodic?.intervalS ?? null,
    repeats: input.energy.radio.repeats,
  };
}

function DeviceEnergyView({ siteId, query, data }: { siteId: string; query: EnergyQuery; data: DeviceEnergyResponse }) {
  const { input } = data;
  const [text, setText] = useState<WhatIfText>({});
  const { values, errors } = parseWhatIf(text);
  const key = JSON.stringify(values);
  // The same model the server ran, rerun here on every change: a few milliseconds at most.
  const result = useMemo(() => evaluateDevice(input, JSON.parse(key)), [input, key]);
  const lux = useMemo(() => (input.power === "solar" ? hourlyLux(applyLux(input, values.luxAtFull)) : []), [input, values.luxAtFull]);
  const isWhatIf = Object.keys(values).length > 0;

  return (
    <div className="space-y-5">
      <p className="text-sm">
        <Link href={energyHref(siteId, query)} className="font-semibold underline underline-offset-2">
          ← Energy budget
        </Link>
      </p>
      <header className="flex flex-wrap items-center gap-3">
        <h1 className="text-2xl font-extrabold">{input.name}</h1>
        <VerdictBadge verdict={result.verdict} />
        <PowerBadge power={input.power} />
        <span className="text-sm text-slate">
          {DEVICE_KIND_INFO[input.kind].label}
          {input.zoneName ? ` · ${input.zoneName}` : ""} · {data.source === "draft" ? "draft rules" : "active rules"} · {data.weekLabel}
        </span>
      </header>
      <Verdict result={result} isWhatIf={isWhatIf} isKinetic={input.power === "kinetic"} />
      {data.notes.map((n) => (
        <p key={n} role="note" className="rounded-md border border-harvest/60 bg-harvest/10 px-3 py-2 text-sm">{n}</p>
      ))}
      {input.typicalSections.length ? (
        <div role="note" className="rounded-md border border-line bg-paper px-3 py-2 text-sm">
          <p className="font-semibold">Parts of this verdict rest on typical values, not the installed device — enter yours in its profile on the Devices page:</p>
          <ul className="ml-5 list-disc text-slate">
            {input.typicalSections.map((s) => (
              <li key={s.section}>
                <strong className="text-ink">{s.section}</strong>: {s.source}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {input.observed ? (
        <p className="text-sm">
          Event log: {input.observed.messages} reports over {sig(input.observed.days)} day(s), {sig(input.observed.messagesPerDay)} a day
          {input.observed.messagesPerDay > result.messagesPerDay * 1.2 ? <strong className="text-clay"> — more than the rules explain ({sig(result.messagesPerDay)} a day): check the device&apos;s own settings.</strong> : "."}
        </p>
      ) : null}
      <Figures result={result} />
      <div className="grid gap-4 lg:grid-cols-[2fr_1fr]">
        {result.week && input.power === "solar" ? (
          <StoreChart storedJ={result.week.storedJ} lux={lux} brownoutHours={result.week.brownoutHours} usableJ={result.usableStorageJ} hourStarts={input.light.hourStarts} timeZone={data.timeZone} />
        ) : (
          <KineticBars result={result} />
        )}
        <div className="space-y-2">
          <WhatIfForm text={text} errors={errors} current={currentValues(input)} isKinetic={input.power === "kinetic"} onChange={(k, v) => setText((t) => ({ ...t, [k]: v }))} onReset={() => setText({})} />
          <p className="text-xs text-slate" aria-live="polite">
            {isWhatIf ? "What-if: recomputed in your browser as you type. Nothing is saved." : "Showing the device as configured."}
          </p>
        </div>
      </div>
      <ExplanationList explanations={result.explanations} />
    </div>
  );
}

function applyLux(input: DeviceEnergyInput & { power: "solar" }, luxAtFull: number | undefined) {
  return luxAtFull === undefined ? input : { ...input, light: { ...input.light, luxAtFull } };
}

function Verdict({ result, isWhatIf, isKinetic }: { result: DeviceEnergyResult; isWhatIf: boolean; isKinetic: boolean }) {
  const head = `${isWhatIf ? "With these what-ifs it is" : "It is"} ${VERDICT_LABEL[result.verdict]}: margin ${formatMargin(Number.isFinite(result.margin) ? result.margin : null)}.`;
  return (
    <div role="status" className={`rounded-xl border px-4 py-3 ${result.verdict === "short" ? "border-clay/50 bg-clay/5" : result.verdict === "tight" ? "border-harvest/60 bg-harvest/10" : "border-moss/40 bg-moss/5"}`}>
      <p className="font-bold">{head}</p>
      {result.ruleImpact ? (
        <p className="text-sm">
          Because of rule <strong>{result.ruleImpact.ruleNodeIds.join(", ")}</strong>: without what it asks of this device the verdict would be {VERDICT_LABEL[result.ruleImpact.verdictWithout]}.{" "}
          {isKinetic ? "Change it on the Canvas, or send each message with fewer repeats." : "Relax it on the Canvas (a longer report interval), or give the device more light or a larger cell."}
        </p>
      ) : null}
    </div>
  );
}

function Figures({ result }: { result: DeviceEnergyResult }) {
  const items: [string, string][] = [
    ["Harvested per day", formatJoules(result.harvestPerDayJ)],
    ["Spent per day", formatJoules(result.spendPerDayJ)],
    ["Messages per day", sig(result.messagesPerDay)],
    ["Energy per message", `${sig(result.messageEnergyUj)} µJ`],
    ["Usable store", formatJoules(result.usableStorageJ)],
  ];
  if (result.kinetic) {
    items.push(["One press pays for", `${result.kinetic.affordablePerActuation} messages`], ["The rules send per press", `${result.kinetic.neededPerActuation} messages`]);
  } else {
    items.push(
      ["In darkness from full", formatHours(result.darkHours)],
      ["Least illuminance", result.leastLux ? `${sig(result.leastLux.lux)} lx for ${sig(result.leastLux.hoursPerDay)} h/day` : "—"],
      ["Most reports it can afford", result.maxMessagesPerDay ? `${sig(result.maxMessagesPerDay)} a day (every ${formatInterval(result.shortestIntervalS)})` : "none"],
      ["Brown-out hours in the week", `${result.week?.brownoutHours.length ?? 0} h`],
    );
  }
  return (
    <dl className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-5">
      {items.map(([k, v]) => (
        <div key={k} className="rounded-lg border border-line bg-paper px-3 py-2">
          <dt className="text-xs text-slate">{k}</dt>
          <dd className="font-bold tabular-nums">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

/** For a kinetic switch: the energy one press delivers beside what the rules' messages need. */
function KineticBars({ result }: { result: DeviceEnergyResult }) {
  if (!result.kinetic) return null;
  const have = result.kinetic.energyPerActuationUj;
  const need = result.kinetic.neededPerActuation * result.messageEnergyUj;
  const max = Math.max(have, need);
  const bar = (label: string, uj: number, className: string) => (
    <div>
      <div className="flex justify-between text-sm">
        <span>{label}</span>
        <span className="tabular-nums font-semibold">{sig(uj)} µJ</span>
      </div>
      <div className="h-4 w-full rounded bg-fog" aria-hidden="true">
        <div className={`h-4 rounded ${className}`} style={{ width: `${(uj / max) * 100}%` }} />
      </div>
    </div>
  );
  return (
    <figure className="space-y-3 rounded-xl border border-line bg-paper p-3">
      <figcaption className="text-sm font-bold">One press: energy delivered vs energy the rules&apos; messages need</figcaption>
      {bar("Delivered by one press", have, "bg-harvest")}
      {bar(`Needed: ${result.kinetic.neededPerActuation} message(s) × ${sig(result.messageEnergyUj)} µJ`, need, need > have ? "bg-clay" : "bg-moss")}
    </figure>
  );
}
