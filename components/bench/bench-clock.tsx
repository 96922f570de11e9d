"use client";

import { useId, useState } from "react";
import { MAX_SKIP_MINUTES } from "@/lib/validation/bench";
import { formatBenchTime, localInputs } from "./format";

type Props = {
  now: number | null;
  timeZone: string;
  isBusy: boolean;
  onSkip: (minutes: number) => void;
  onSkipTo: (time: string) => void;
  onSetDate: (date: string, time: string) => void;
};

const btn = "rounded-md border border-line bg-paper px-2.5 py-1 text-sm font-semibold hover:border-ink disabled:opacity-50";

/** The sandbox's virtual clock: it only moves when someone acts or skips ahead, and never runs backwards. */
export function BenchClock({ now, timeZone, isBusy, onSkip, onSkipTo, onSetDate }: Props) {
  const minutesId = useId();
  const toId = useId();
  const dateId = useId();
  const timeId = useId();
  const [minutes, setMinutes] = useState("10");
  const [to, setTo] = useState("07:00");
  const initial = localInputs(now, timeZone);
  const [date, setDate] = useState(initial.date);
  const [time, setTime] = useState(initial.time);
  const m = Number(minutes);
  const minutesProblem = !Number.isInteger(m) || m < 1 || m > MAX_SKIP_MINUTES ? `Skip a whole number of minutes, 1 to ${MAX_SKIP_MINUTES}.` : null;

  return (
    <section aria-labelledby={`${minutesId}-title`} className="rounded-xl border border-line bg-paper p-4">
      <div className="flex flex-wrap items-baseline gap-x-3">
        <h2 id={`${minutesId}-title`} className="font-bold">Bench clock</h2>
        <p className="text-lg font-extrabold tabular-nums" aria-live="polite" data-testid="bench-time">
          {formatBenchTime(now, timeZone)}
        </p>
        <p className="text-sm text-slate">({timeZone}) · moves only when you act or skip</p>
      </div>
      <div className="mt-3 flex flex-wrap items-end gap-x-6 gap-y-3">
        <div className="flex flex-wrap items-end gap-2">
          {[1, 10, 60].map((n) => (
            <button key={n} type="button" className={btn} disabled={isBusy} onClick={() => onSkip(n)}>
              +{n} min
            </button>
          ))}
          <form
            className="flex items-end gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              if (!minutesProblem) onSkip(m);
            }}
          >
            <div className="flex flex-col">
              <label htmlFor={minutesId} className="text-xs text-slate">Skip ahead (min)</label>
              <input id={minutesId} type="number" min={1} max={MAX_SKIP_MINUTES} value={minutes} onChange={(e) => setMinutes(e.target.value)} aria-invalid={minutesProblem ? true : undefined} className="w-20 rounded-md border border-line bg-paper px-2 py-1 text-sm" />
            </div>
            <button type="submit" className={btn} disabled={isBusy || minutesProblem !== null}>Skip</button>
          </form>
        </div>
        <form
          className="flex items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (to) onSkipTo(to);
          }}
        >
          <div className="flex flex-col">
            <label htmlFor={toId} className="text-xs text-slate">Skip ahead to</label>
            <input id={toId} type="time" value={to} required onChange={(e) => setTo(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-1 text-sm" />
          </div>
          <button type="submit" className={btn} disabled={isBusy || !to}>Go</button>
        </form>
        <form
          className="flex flex-wrap items-end gap-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (date && time) onSetDate(date, time);
          }}
        >
          <div className="flex flex-col">
            <label htmlFor={dateId} className="text-xs text-slate">Date</label>
            <input id={dateId} type="date" min="2000-01-01" max="2100-12-31" value={date} required onChange={(e) => setDate(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-1 text-sm" />
          </div>
          <div className="flex flex-col">
            <label htmlFor={timeId} className="text-xs text-slate">Time</label>
            <input id={timeId} type="time" value={time} required onChange={(e) => setTime(e.target.value)} className="rounded-md border border-line bg-paper px-2 py-1 text-sm" />
          </div>
          <button type="submit" className={btn} disabled={isBusy || !date || !time} title="Starts a fresh sandbox that day: its schedules run from midnight to this time">
            Set date
          </button>
        </form>
      </div>
      {minutesProblem ? <p role="alert" className="mt-2 text-xs font-semibold text-clay">{minutesProblem}</p> : null}
      <p className="mt-2 text-xs text-slate">Timers fire in order as the clock passes them. Setting the date starts a fresh sandbox on that day: the day runs from midnight, so its schedules (opening, closing, sunset) fire first.</p>
    </section>
  );
}
