"use client";

import { useId, useState } from "react";
import { DALI_SOURCE, daliArcToPercent, percentToDaliArc } from "@/lib/dimming/dali";
import { ieee1789Risk } from "@/lib/dimming/flicker";
import { levelToZeroTen, ZERO_TEN_CURVE_NOTE, ZERO_TEN_SOURCE } from "@/lib/dimming/zero-ten";
import { actualToLinear, levelToActual } from "@/lib/mesh/lightness";

type Output = { interface?: string; minLevelPct?: number; flicker?: { pwmFrequencyHz: number; modulationDepthPct: number } | null };

const RISK_TEXT = { "no-observable-effect": "no observable effect", "low-risk": "low risk", "above-low-risk": "above the low-risk line" } as const;

/** What a level means on the wire for this luminaire: Lightness Actual/Linear, 0–10 V, or a DALI arc level. */
export function OutputMapping({ output }: { output: Output }) {
  const id = useId();
  const [level, setLevel] = useState(50);
  const actual = levelToActual(level);
  const zeroTen = output.interface === "0-10v" ? levelToZeroTen(level, output.minLevelPct ?? 0) : null;
  const arc = output.interface === "dali" ? percentToDaliArc(level) : null;
  const flicker = output.flicker ? ieee1789Risk(output.flicker.pwmFrequencyHz, output.flicker.modulationDepthPct) : null;
  const hex = (n: number) => `0x${n.toString(16).toUpperCase().padStart(4, "0")}`;
  return (
    <div className="space-y-2 text-sm">
      <div className="flex items-center gap-3">
        <label htmlFor={id} className="font-semibold">Level</label>
        <input id={id} type="range" min={0} max={100} value={level} onChange={(e) => setLevel(Number(e.target.value))} className="w-48 accent-harvest" />
        <span className="w-12 font-mono">{level} %</span>
      </div>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        <dt className="text-slate">Lightness Actual</dt>
        <dd className="font-mono">{actual} ({hex(actual)})</dd>
        <dt className="text-slate">Lightness Linear</dt>
        <dd className="font-mono">{actualToLinear(actual)} ({hex(actualToLinear(actual))}) <span className="font-sans text-xs text-slate">Mesh Model §6.1.2.2.1</span></dd>
        {zeroTen ? (
          <>
            <dt className="text-slate">0–10 V control</dt>
            <dd>
              <span className="font-mono">{zeroTen.relay === "open" ? "off (relay open), 1.00 V" : `${zeroTen.volts.toFixed(2)} V`}</span>{" "}
              <span className="text-xs text-slate">{ZERO_TEN_SOURCE}. {ZERO_TEN_CURVE_NOTE}</span>
            </dd>
          </>
        ) : null}
        {arc !== null ? (
          <>
            <dt className="text-slate">DALI arc power</dt>
            <dd>
              <span className="font-mono">{arc}</span> = {arc === 0 ? "off" : `${daliArcToPercent(arc).toFixed(3)} %`} <span className="text-xs text-slate">({DALI_SOURCE}, logarithmic)</span>
            </dd>
          </>
        ) : null}
        {flicker && output.flicker ? (
          <>
            <dt className="text-slate">Flicker</dt>
            <dd>
              {output.flicker.pwmFrequencyHz} Hz, {output.flicker.modulationDepthPct} % modulation: <strong>{RISK_TEXT[flicker.risk]}</strong> <span className="text-xs text-slate">({flicker.source})</span>
            </dd>
          </>
        ) : null}
      </dl>
    </div>
  );
}
