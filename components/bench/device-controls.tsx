"use client";

import { useId, useState } from "react";
import { ShortMark } from "@/components/energy/short-mark";
import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import { READING_MEASURES, type BenchAction, type BenchDevice, type BenchSource, type BenchStateDto, type ReadingMeasure } from "@/lib/validation/bench";
import type { ShortDeviceDto } from "@/lib/validation/energy";

type Props = { device: BenchDevice; state: BenchStateDto; isBusy: boolean; onAct: (action: BenchAction) => void };
/** The device runs short of energy under the rules the bench runs (shown, never enforced: the bench still sends its events). */
type EnergyMark = { siteId: string; source: BenchSource; short?: ShortDeviceDto };

const btn = "rounded-md border border-line bg-paper px-2.5 py-1 text-sm font-semibold hover:border-ink disabled:opacity-50";

function ReadingControl({ device, measure, current, isBusy, onAct }: { device: BenchDevice; measure: ReadingMeasure; current: number | undefined; isBusy: boolean; onAct: Props["onAct"] }) {
  const id = useId();
  const r = READING_MEASURES[measure];
  const [text, setText] = useState(String(current ?? (measure === "light-level" ? 5 : measure === "temperature" ? 21 : 50)));
  const value = Number(text);
  const problem = text.trim() === "" || !Number.isFinite(value) ? "Enter a number." : value < r.min || value > r.max ? `${value} ${r.unit} is outside what the sensor reports (${r.min}–${r.max} ${r.unit}).` : null;
  const sliderMax = measure === "light-level" ? 2000 : r.max;
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        if (!problem) onAct({ type: "reading", device: device.id, measure, value });
      }}
    >
      <div className="flex min-w-0 flex-col">
        <label htmlFor={id} className="text-xs text-slate">
          {r.label} ({r.unit}){current !== undefined ? ` · now ${current} ${r.unit}` : ""}
        </label>
        <div className="flex items-center gap-2">
          <input
            type="range"
            aria-label={`${r.label} slider, ${device.name}`}
            min={r.min}
            max={sliderMax}
            step={r.step}
            value={Number.isFinite(value) ? Math.min(Math.max(value, r.min), sliderMax) : r.min}
            onChange={(e) => setText(e.target.value)}
            className="w-28 accent-harvest"
          />
          <input
            id={id}
            type="number"
            inputMode="decimal"
            min={r.min}
            max={r.max}
            step={r.step}
            value={text}
            aria-invalid={problem ? true : undefined}
            aria-describedby={problem ? `${id}-error` : undefined}
            onChange={(e) => setText(e.target.value)}
            className={`w-24 rounded-md border bg-paper px-2 py-1 text-sm ${problem ? "border-clay" : "border-line"}`}
          />
        </div>
      </div>
      <button type="submit" className={btn} disabled={isBusy || problem !== null}>
        Send {r.unit}
      </button>
      {problem ? (
        <p id={`${id}-error`} role="alert" className="basis-full text-xs font-semibold text-clay">
          {problem}
        </p>
      ) : null}
    </form>
  );
}

function RockerControl({ device, isBusy, onAct }: Omit<Props, "state">) {
  const id = useId();
  const [button, setButton] = useState(1);
  return (
    <div className="flex flex-wrap items-end gap-2">
      <div className="flex flex-col">
        <label htmlFor={id} className="text-xs text-slate">Button</label>
        <select id={id} value={button} onChange={(e) => setButton(Number(e.target.value))} className="rounded-md border border-line bg-paper px-2 py-1 text-sm">
          {Array.from({ length: device.buttons }, (_, i) => (
            <option key={i + 1} value={i + 1}>{i + 1}</option>
          ))}
        </select>
      </div>
      <button type="button" className={btn} disabled={isBusy} onClick={() => onAct({ type: "press", device: device.id, button })}>Press</button>
      <button type="button" className={btn} disabled={isBusy} onClick={() => onAct({ type: "release", device: device.id, button })}>Release</button>
      <button type="button" className={btn} disabled={isBusy} onClick={() => onAct({ type: "long-press", device: device.id, button })}>Long press</button>
    </div>
  );
}

/** One device as something to operate by hand; outputs (luminaires, relays) have no control here. */
export function DeviceControl({ device, state, isBusy, onAct, energy }: Props & { energy?: EnergyMark }) {
  const info = DEVICE_KIND_INFO[device.kind];
  const s = state.sensors;
  let body: React.ReactNode = null;
  switch (device.kind) {
    case "kinetic-rocker":
      body = <RockerControl device={device} isBusy={isBusy} onAct={onAct} />;
      break;
    case "kinetic-call-button":
      body = <button type="button" className={btn} disabled={isBusy} onClick={() => onAct({ type: "call", device: device.id })}>Press</button>;
      break;
    case "kinetic-door-handle":
      body = <button type="button" className={btn} disabled={isBusy} onClick={() => onAct({ type: "turn", device: device.id })}>Turn the handle</button>;
      break;
    case "solar-motion-light":
      body = (
        <div className="space-y-2">
          <button type="button" className={btn} disabled={isBusy} onClick={() => onAct({ type: "walk-past", device: device.id })}>
            Walk past
          </button>
          <span className="ml-2 text-xs text-slate">{s.occupied[device.id] ? "sees motion" : "no motion"}</span>
          <ReadingControl device={device} measure="light-level" current={s.lux[device.id]} isBusy={isBusy} onAct={onAct} />
        </div>
      );
      break;
    case "light-sensor":
      body = <ReadingControl device={device} measure="light-level" current={s.lux[device.id]} isBusy={isBusy} onAct={onAct} />;
      break;
    case "climate-sensor":
      body = (
        <div className="space-y-2">
          <ReadingControl device={device} measure="temperature" current={s.temperature[device.id]} isBusy={isBusy} onAct={onAct} />
          <ReadingControl device={device} measure="humidity" current={s.humidity[device.id]} isBusy={isBusy} onAct={onAct} />
        </div>
      );
      break;
    case "solar-contact":
      body = (
        <div className="flex flex-wrap items-center gap-2">
          <button type="button" className={btn} disabled={isBusy} onClick={() => onAct({ type: "contact", device: device.id, state: "open" })}>Open</button>
          <button type="button" className={btn} disabled={isBusy} onClick={() => onAct({ type: "contact", device: device.id, state: "closed" })}>Close</button>
          <span className="text-xs text-slate">now {s.contacts[device.id] ?? "unknown"}</span>
        </div>
      );
      break;
    case "fire-alarm-input": {
      const isActive = s.fireAlarms[device.id] === true;
      body = (
        <div className="space-y-1">
          <div className="flex flex-wrap items-center gap-2">
            <button type="button" className={`${btn} border-clay text-clay`} disabled={isBusy} onClick={() => onAct({ type: "fire-alarm", device: device.id, state: "active" })}>Trip the fire input</button>
            <button type="button" className={btn} disabled={isBusy} onClick={() => onAct({ type: "fire-alarm", device: device.id, state: "cleared" })}>Clear the input</button>
            <span className="text-xs font-semibold">{isActive ? "◆ active" : "clear"}</span>
          </div>
          <p className="text-xs text-slate">Simulated only. Testing a real fire-alarm interface is for qualified installers under local codes.</p>
        </div>
      );
      break;
    }
    default:
      return null;
  }
  return (
    <li className="rounded-lg border border-line bg-paper p-3" id={`bench-device-${device.id}`} aria-label={device.name}>
      <p className="font-semibold leading-tight">{device.name}</p>
      <p className="mb-2 text-xs text-slate">{info.label}</p>
      {energy?.short ? <ShortMark siteId={energy.siteId} device={energy.short} source={energy.source} className="-mt-1 mb-2" /> : null}
      {body}
    </li>
  );
}

export function isOperable(device: BenchDevice): boolean {
  return DEVICE_KIND_INFO[device.kind].reports.length > 0;
}
