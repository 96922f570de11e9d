import type { z } from "zod";
import { actionNodeSchema } from "@/lib/rules/graph-actions";
import { gateNodeSchema } from "@/lib/rules/graph-gates";
import { triggerNodeSchema } from "@/lib/rules/graph-triggers";
import type { NodeKind } from "@/lib/rules/palette";

/**
 * The inspector's fields, read from the node schemas in lib/rules/graph-*.ts, so
 * a parameter added there (say an optional `reportSeconds`) appears in the form
 * without touching the Canvas. Keys with a meaning of their own (device, zone,
 * scene, recipients …) get a picker; any other number, text, choice or switch
 * gets a plain input. Messages come from the schemas when the node is parsed.
 */
export type FieldSpec =
  | { key: string; label: string; optional: boolean; widget: "device" | "zone" | "scene" | "button" | "time" | "days" | "channels" | "recipients" | "target" | "modes" | "boolean" }
  | { key: string; label: string; optional: boolean; widget: "number"; integer: boolean }
  | { key: string; label: string; optional: boolean; widget: "text"; long: boolean }
  | { key: string; label: string; optional: boolean; widget: "enum"; options: string[] };

type AnySchema = z.ZodType & { _zod: { def: { type: string; innerType?: AnySchema; element?: AnySchema; shape?: Record<string, AnySchema> } } };

function unwrap(schema: AnySchema): { inner: AnySchema; optional: boolean } {
  let s = schema;
  let optional = false;
  while (["optional", "default", "nullable", "prefault"].includes(s._zod.def.type) && s._zod.def.innerType) {
    if (s._zod.def.type !== "nullable") optional = true;
    s = s._zod.def.innerType;
  }
  return { inner: s, optional };
}

const UNIT_LABELS: Record<string, string> = {
  lux: "Threshold (lx)",
  hysteresisLux: "Margin (lx)",
  celsius: "Threshold (°C)",
  percent: "Threshold (%RH)",
  minutes: "Time (min)",
  level: "Level (%)",
  fadeMs: "Fade (ms)",
  text: "Notice text",
  kind: "Notice kind",
  name: "Timer name",
  mode: "Site mode",
  othersOff: "Turn everything else off",
  reportSeconds: "Report every (s)",
};

/** "reportSeconds" → "Report seconds (s)": a readable label with the unit its name implies. */
export function labelFor(key: string, nodeType: string): string {
  if (key === "hysteresis") return nodeType.startsWith("humidity") ? "Margin (%RH)" : "Margin (°C)";
  if (UNIT_LABELS[key]) return UNIT_LABELS[key];
  const words = key.replace(/([a-z])([A-Z])/g, "$1 $2").toLowerCase();
  const unit = /seconds$/.test(key) ? " (s)" : /ms$/i.test(key) ? " (ms)" : /minutes$/.test(key) ? " (min)" : "";
  return words.charAt(0).toUpperCase() + words.slice(1) + unit;
}

const SCHEMAS: Record<NodeKind, AnySchema> = { trigger: triggerNodeSchema as unknown as AnySchema, gate: gateNodeSchema as unknown as AnySchema, action: actionNodeSchema as unknown as AnySchema };

/** The params schema of one node type (or undefined for a type the engine does not know). */
export function paramsSchema(kind: NodeKind, type: string): AnySchema | undefined {
  const options = (SCHEMAS[kind] as unknown as { options: { shape: { type: { value: string }; params: AnySchema } }[] }).options;
  return options.find((o) => o.shape.type.value === type)?.shape.params;
}

export function fieldSpecs(kind: NodeKind, type: string): FieldSpec[] {
  const params = paramsSchema(kind, type);
  if (!params) return [];
  const shape = unwrap(params).inner._zod.def.shape ?? {};
  return Object.entries(shape).map(([key, schema]) => specFor(kind, type, key, schema));
}

function specFor(kind: NodeKind, type: string, key: string, schema: AnySchema): FieldSpec {
  const { inner, optional } = unwrap(schema);
  const label = labelFor(key, type);
  const t = inner._zod.def.type;
  const special = (widget: Exclude<FieldSpec["widget"], "number" | "text" | "enum">, text = label): FieldSpec => ({ key, label: text, optional, widget });
  if (key === "device") return special("device", "Device");
  if (key === "zone") return special("zone", "Zone");
  if (key === "scene") return special("scene", "Scene");
  if (key === "button") return special("button", "Button");
  if (key === "target") return special("target", "Zone or luminaire");
  if (key === "channels") return special("channels", "Channels");
  if (key === "days") return special("days", "Days");
  if (key === "modes") return special("modes", "Site modes (comma between)");
  if (kind === "action" && key === "to") return special("recipients", "Who gets it");
  if (key === "at" || ((key === "from" || key === "to") && kind === "gate")) return special("time", key === "at" ? "At" : key === "from" ? "From" : "Until");
  if (t === "boolean") return special("boolean");
  if (t === "enum") return { key, label, optional, widget: "enum", options: Object.values((inner as unknown as { enum: Record<string, string> }).enum) };
  if (t === "number") {
    const integer = Boolean((inner as unknown as { isInt?: boolean }).isInt);
    return { key, label, optional, widget: "number", integer };
  }
  return { key, label, optional, widget: "text", long: key === "text" };
}

/** What a number input's text means for the schema: empty → left out, otherwise the number (or the text, so zod explains). */
export function numberFromInput(text: string): number | undefined | string {
  const trimmed = text.trim();
  if (trimmed === "") return undefined;
  const n = Number(trimmed.replace(",", "."));
  return Number.isFinite(n) ? n : trimmed;
}
