"use client";

import Link from "next/link";
import { demandWords, energyDeviceHref } from "@/components/energy/short-mark";
import { formatMargin } from "@/components/energy/format";
import type { RuleNode } from "@/lib/rules/graph";
import type { ShortDeviceDto } from "@/lib/validation/energy";

/** In the node panel: the selected trigger's device runs short of energy under the saved draft, and what to do about it. */
export function ShortNotice({ siteId, rule, shortByDevice }: { siteId: string; rule: RuleNode; shortByDevice: Map<string, ShortDeviceDto> }) {
  if (rule.kind !== "trigger") return null;
  const deviceId = (rule.params as { device?: unknown }).device;
  const short = typeof deviceId === "string" ? shortByDevice.get(deviceId) : undefined;
  if (!short) return null;
  const isThisRule = short.ruleNodeIds.includes(rule.id);
  const demand = isThisRule ? demandWords(rule.params) : undefined;
  return (
    <div role="note" aria-label="Energy budget" className="rounded-md border-2 border-clay px-2 py-1.5 text-sm">
      <p className="font-bold text-clay">
        <span aria-hidden="true">⚡ </span>Short of energy under the draft
      </p>
      <p>
        {short.name} cannot pay for the messages its rules ask of it (margin {formatMargin(short.margin)}).{" "}
        {isThisRule
          ? `This trigger is one of the reasons${demand ? ` (${demand})` : ""}: ${demand ? "a longer report interval" : "a gentler setting"} relaxes it.`
          : short.ruleNodeIds.length
            ? "Other triggers on this device are the reason; they carry the same mark."
            : "Its own settings (place, light, profile) are the reason, not a rule."}{" "}
        <Link href={energyDeviceHref(siteId, short.deviceId, "draft")} className="font-semibold underline underline-offset-2">
          Open its energy budget
        </Link>
        .
      </p>
    </div>
  );
}
