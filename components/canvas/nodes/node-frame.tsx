"use client";

import { Handle, Position } from "@xyflow/react";
import { demandWords, ShortMark } from "@/components/energy/short-mark";
import type { RuleNode } from "@/lib/rules/graph";
import { typeLabel } from "@/lib/rules/palette";
import { nodeSubject } from "@/lib/rules/sentence";
import { useCanvasContext } from "../canvas-context";
import { NODE_SIZE } from "../flow";

const KIND_WORD = { trigger: "Trigger", gate: "Only if", action: "Action" } as const;

/**
 * The look of a node, told apart by outline and words, not colour alone:
 * a Trigger has a notched left edge, a Gate is narrow under an "Only if"
 * band, an Action ends in a solid bar on its right edge.
 */
function Outline({ kind, isSelected, hasError }: { kind: RuleNode["kind"]; isSelected: boolean; hasError: boolean }) {
  const { width: w, height: h } = NODE_SIZE[kind];
  const stroke = hasError ? "var(--color-clay)" : isSelected ? "var(--color-harvest)" : "var(--color-slate)";
  const common = { fill: "var(--color-paper)", stroke, strokeWidth: isSelected ? 3 : 1.5, strokeDasharray: hasError && !isSelected ? "6 3" : undefined };
  return (
    <svg aria-hidden="true" width={w} height={h} className="pointer-events-none absolute inset-0 overflow-visible">
      {kind === "trigger" ? <path d={`M1,1 H${w - 9} Q${w - 1},1 ${w - 1},9 V${h - 9} Q${w - 1},${h - 1} ${w - 9},${h - 1} H1 L15,${h / 2} Z`} {...common} /> : null}
      {kind === "gate" ? (
        <>
          <rect x={1} y={1} width={w - 2} height={h - 2} rx={6} {...common} />
          <path d={`M1,7 Q1,1 7,1 H${w - 7} Q${w - 1},1 ${w - 1},7 V20 H1 Z`} fill="var(--color-slate)" />
        </>
      ) : null}
      {kind === "action" ? (
        <>
          <path d={`M9,1 H${w - 1} V${h - 1} H9 Q1,${h - 1} 1,${h - 9} V9 Q1,1 9,1 Z`} {...common} />
          <rect x={w - 9} y={1} width={8} height={h - 2} fill="var(--color-ink)" />
        </>
      ) : null}
    </svg>
  );
}

export function NodeFrame({ rule, isSelected }: { rule: RuleNode; isSelected: boolean }) {
  const { siteId, names, problemsByNode, shortByDevice } = useCanvasContext();
  const problems = problemsByNode.get(rule.id) ?? [];
  const errors = problems.filter((p) => p.severity === "error").length;
  const warnings = problems.length - errors;
  const { subject, detail } = nodeSubject(rule, names);
  const { width, height } = NODE_SIZE[rule.kind];
  const deviceId = rule.kind === "trigger" ? (rule.params as { device?: unknown }).device : undefined;
  const short = typeof deviceId === "string" ? shortByDevice.get(deviceId) : undefined;
  const pad = rule.kind === "trigger" ? "pl-6 pr-3" : rule.kind === "action" ? "pl-3 pr-5" : "px-2.5";
  return (
    <div style={{ width, height }} className="relative text-ink" title={problems.map((p) => p.message).join("\n") || undefined}>
      <Outline kind={rule.kind} isSelected={isSelected} hasError={errors > 0} />
      {rule.kind !== "trigger" ? <Handle type="target" position={Position.Left} className="!h-3 !w-3 !border-2 !border-paper !bg-slate" /> : null}
      {rule.kind !== "action" ? <Handle type="source" position={Position.Right} className="!h-3 !w-3 !border-2 !border-paper !bg-ink" /> : null}
      <div className={`relative flex h-full flex-col justify-center ${pad} ${rule.kind === "gate" ? "pt-4" : ""}`}>
        <p className={`truncate text-[11px] font-bold uppercase tracking-wide ${rule.kind === "gate" ? "absolute left-2.5 top-0.5 text-paper" : "text-slate"}`}>
          {KIND_WORD[rule.kind]}
          {rule.kind !== "gate" ? <span className="normal-case tracking-normal"> · {typeLabel(rule.kind, rule.type)}</span> : null}
        </p>
        {rule.kind === "gate" ? <p className="truncate text-[11px] font-bold text-slate">{typeLabel(rule.kind, rule.type)}</p> : null}
        <p className="truncate text-sm font-bold leading-tight">{subject}</p>
        <p className="truncate text-xs leading-tight text-slate">{detail}</p>
        {problems.length ? (
          <p className={`absolute -top-2.5 right-2 rounded-full border px-1.5 text-[11px] font-bold ${errors ? "border-clay bg-clay text-paper" : "border-harvest bg-paper text-ink"}`}>
            <span aria-hidden="true">{errors ? "✕ " : "! "}</span>
            {errors ? `${errors} error${errors > 1 ? "s" : ""}` : `${warnings} warning${warnings > 1 ? "s" : ""}`}
          </p>
        ) : null}
        {short ? (
          // Below the node's edge like the problem count above it; nodrag/nopan so a click follows the link.
          <span className="nodrag nopan absolute -bottom-2.5 left-6 right-2 flex">
            <ShortMark siteId={siteId} device={short} source="draft" detail={short.ruleNodeIds.includes(rule.id) ? demandWords(rule.params) : undefined} />
          </span>
        ) : null}
      </div>
    </div>
  );
}
