import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { buildGatewayOpenApi, COMMANDS_PAGE_MAX, OPENAPI_VERSION } from "@/lib/gateway/openapi";
import { gatewayBatchSchema, gatewayEventSchema, MAX_BATCH } from "@/lib/gateway/validate-events";

type Json = Record<string, unknown>;
const doc = buildGatewayOpenApi({ serverUrl: "http://localhost:3000" });
const schemas = doc.components.schemas;
const EVENTS = "/api/v1/sites/{siteId}/events";
const COMMANDS = "/api/v1/sites/{siteId}/commands";

/** Every value in a JSON tree with the path to it. */
function* walk(node: unknown, path: string[] = []): Generator<[string[], unknown]> {
  yield [path, node];
  if (node && typeof node === "object") for (const [k, v] of Object.entries(node)) yield* walk(v, [...path, k]);
}

function resolve(schema: Json): Json {
  const ref = schema.$ref;
  if (typeof ref !== "string") return schema;
  const name = ref.replace("#/components/schemas/", "");
  return resolve(schemas[name]);
}

/**
 * Just enough of JSON Schema 2020-12 (the keywords the document uses) to check
 * payloads against the document itself, so the test can compare its verdict
 * with zod's. Throws on any keyword it does not know, so it never passes by ignoring one.
 */
const KNOWN = new Set(["$ref", "type", "properties", "required", "additionalProperties", "items", "minItems", "maxItems", "minLength", "maxLength", "minimum", "maximum", "pattern", "format", "anyOf", "const", "enum", "default", "description", "propertyNames"]);
function conforms(value: unknown, raw: Json): boolean {
  const s = resolve(raw);
  for (const k of Object.keys(s)) if (!KNOWN.has(k)) throw new Error(`test validator does not know the keyword ${k}`);
  if (s.anyOf) return (s.anyOf as Json[]).some((sub) => conforms(value, sub));
  if ("const" in s && value !== s.const) return false;
  if (s.enum && !(s.enum as unknown[]).includes(value)) return false;
  const types = s.type === undefined ? null : ([] as unknown[]).concat(s.type);
  if (types) {
    const ok = types.some((t) =>
      t === "null" ? value === null : t === "integer" ? Number.isInteger(value) : t === "number" ? typeof value === "number" && Number.isFinite(value) : t === "array" ? Array.isArray(value) : t === "object" ? !!value && typeof value === "object" && !Array.isArray(value) : typeof value === t,
    );
    if (!ok) return false;
  }
  if (typeof value === "string") {
    const length = [...value].length;
    if (typeof s.minLength === "number" && length < s.minLength) return false;
    if (typeof s.maxLength === "number" && length > s.maxLength) return false;
    if (typeof s.pattern === "string" && !new RegExp(s.pattern).test(value)) return false;
  }
  if (typeof value === "number") {
    if (typeof s.minimum === "number" && value < s.minimum) return false;
    if (typeof s.maximum === "number" && value > s.maximum) return false;
  }
  if (Array.isArray(value)) {
    if (typeof s.minItems === "number" && value.length < s.minItems) return false;
    if (typeof s.maxItems === "number" && value.length > s.maxItems) return false;
    if (s.items && !value.every((v) => conforms(v, s.items as Json))) return false;
  }
  if (value && typeof value === "object" && !Array.isArray(value)) {
    const obj = value as Json;
    const props = (s.properties ?? {}) as Record<string, Json>;
    if (((s.required ?? []) as string[]).some((r) => !(r in obj))) return false;
    for (const [k, v] of Object.entries(obj)) {
      if (props[k]) {
        if (!conforms(v, props[k])) return false;
      } else if (s.additionalProperties === false) return false;
    }
  }
  return true;
}

describe("gateway OpenAPI document", () => {
  it("is an OpenAPI 3.1.0 document with info, servers and both gateway paths", () => {
    expect(doc.openapi).toBe("3.1.0");
    expect(OPENAPI_VERSION).toBe("3.1.0");
    expect(doc.info.title).toMatch(/\S/);
    expect(doc.info.version).toMatch(/^\d+\.\d+\.\d+$/);
    expect(doc.servers).toEqual([{ url: "http://localhost:3000", description: "This console" }]);
    expect(Object.keys(doc.paths).sort()).toEqual([COMMANDS, EVENTS]);
    expect(Object.keys(doc.paths[EVENTS])).toEqual(["post"]);
    expect(Object.keys(doc.paths[COMMANDS])).toEqual(["get"]);
    // JSON round trip: what the route serves is exactly this object.
    expect(JSON.parse(JSON.stringify(doc))).toEqual(doc);
  });

  it("declares the bearer key scheme and every operation requires it", () => {
    // OpenAPI 3.1.0 §4.8.27: http scheme names come from RFC 7235; "bearer" per RFC 6750.
    expect(doc.components.securitySchemes.gatewayKey).toMatchObject({ type: "http", scheme: "bearer" });
    expect(doc.security).toEqual([{ gatewayKey: [] }]);
    for (const op of [doc.paths[EVENTS].post, doc.paths[COMMANDS].get]) expect(op.security).toEqual([{ gatewayKey: [] }]);
  });

  it("follows the structural rules of OpenAPI 3.1.0", () => {
    const ops = Object.entries(doc.paths).flatMap(([path, item]) => Object.values(item).map((op) => ({ path, op })));
    // §4.8.10: operationId is unique among all operations.
    const ids = ops.map((o) => o.op.operationId);
    expect(new Set(ids).size).toBe(ids.length);
    for (const { path, op } of ops) {
      // §4.8.8.2: every template expression has a path parameter with required: true.
      const params = op.parameters as Json[];
      for (const [, name] of path.matchAll(/\{([^}]+)\}/g)) expect(params).toContainEqual(expect.objectContaining({ name, in: "path", required: true }));
      // §4.8.17.1: every Response Object has a description; the responses map keys are status codes.
      for (const [code, res] of Object.entries(op.responses as Record<string, Json>)) {
        expect(code).toMatch(/^[1-5]\d\d$/);
        expect(res.description).toMatch(/\S/);
      }
    }
    // Every $ref points at a component that exists; no stray dialect or id markers inside components.
    for (const [path, value] of walk(doc)) {
      const key = path.at(-1);
      if (key === "$ref") expect(Object.keys(schemas)).toContain(String(value).replace("#/components/schemas/", ""));
      if (key === "$schema" || key === "$id") throw new Error(`${path.join(".")} should not be in the document`);
    }
  });

  it("lists the answers of POST events and GET commands", () => {
    expect(Object.keys(doc.paths[EVENTS].post.responses as Json)).toEqual(expect.arrayContaining(["200", "401", "413", "422"]));
    expect(Object.keys(doc.paths[COMMANDS].get.responses as Json)).toEqual(expect.arrayContaining(["200", "401", "422"]));
    const ok = (doc.paths[EVENTS].post.responses as Record<string, Json>)["200"];
    expect(ok.content).toEqual({ "application/json": { schema: { $ref: "#/components/schemas/EventsAnswer" } } });
    expect(schemas.EventsAnswer.required).toEqual(["accepted", "duplicates", "rejected", "commands"]);
    expect(schemas.ItemError.required).toEqual(["index", "field", "message"]);
  });

  it("the request body is a batch of at most 500 events, each needing id, at, device and kind", () => {
    const body = doc.paths[EVENTS].post.requestBody as Json;
    expect(body.required).toBe(true);
    expect(body.content).toEqual({ "application/json": { schema: { $ref: "#/components/schemas/GatewayEventBatch" } } });
    const batch = schemas.GatewayEventBatch;
    expect(batch.required).toEqual(["events"]);
    expect(batch.additionalProperties).toBe(false);
    const events = (batch.properties as Record<string, Json>).events;
    // The published limit; MAX_BATCH is what the route enforces.
    expect(events).toMatchObject({ type: "array", minItems: 1, maxItems: 500, items: { $ref: "#/components/schemas/GatewayEvent" } });
    expect(MAX_BATCH).toBe(500);

    const event = schemas.GatewayEvent;
    expect(event.type).toBe("object");
    expect(event.required).toEqual(["id", "at", "device", "kind"]);
    expect(event.additionalProperties).toBe(false);
    const props = event.properties as Record<string, Json>;
    expect(Object.keys(props)).toEqual(["id", "at", "device", "kind", "value"]);
    expect(props.at.anyOf).toEqual([expect.objectContaining({ type: "integer", minimum: 0 }), expect.objectContaining({ type: "string", format: "date-time" })]);
    expect(props.value.default).toBeNull();
    for (const p of Object.values(props)) expect(p.description).toMatch(/\S/);
  });

  it("documents the commands query as the route parses it", () => {
    const params = doc.paths[COMMANDS].get.parameters as Json[];
    const after = params.find((p) => p.name === "after")!;
    const limit = params.find((p) => p.name === "limit")!;
    expect(after).toMatchObject({ in: "query", required: false, schema: { type: "integer", minimum: 0, default: 0 } });
    expect(limit).toMatchObject({ in: "query", required: false, schema: { type: "integer", minimum: 1, maximum: 500, default: 500 } });
    expect(COMMANDS_PAGE_MAX).toBe(500);
  });

  it("accepts and refuses the same events as the zod schema the route uses", () => {
    const event = { $ref: "#/components/schemas/GatewayEvent" };
    const base = { id: "gw-1", at: 1_750_000_000_000, device: "0x0013", kind: "motion", value: true };
    const samples: unknown[] = [
      base,
      { ...base, at: "2026-06-20T18:00:00+01:00" },
      { ...base, at: "2026-06-20T17:00:00Z", value: null },
      { id: "x", at: 0, device: "d", kind: "press" },
      { ...base, value: "open" },
      { ...base, value: 5.5 },
      { ...base, id: "" },
      { ...base, id: "x".repeat(200) },
      { ...base, id: "x".repeat(201) },
      { ...base, at: -1 },
      { ...base, at: 1.5 },
      { ...base, at: "yesterday" },
      { ...base, at: "2026-06-20T18:00:00" },
      { ...base, device: "d".repeat(101) },
      { ...base, kind: "k".repeat(41) },
      { ...base, value: "s".repeat(41) },
      { ...base, value: { nested: true } },
      { ...base, extra: 1 },
      { id: "gw-1", at: 1, device: "d" },
      "not an object",
      null,
    ];
    for (const sample of samples) expect(conforms(sample, event), JSON.stringify(sample)).toBe(gatewayEventSchema.safeParse(sample).success);

    fc.assert(
      fc.property(
        fc.record(
          {
            id: fc.oneof(fc.string({ maxLength: 210 }), fc.integer()),
            at: fc.oneof(fc.integer({ min: -5, max: 2e12 }), fc.double(), fc.date({ noInvalidDate: true }).map((d) => d.toISOString()), fc.string({ maxLength: 30 })),
            device: fc.string({ maxLength: 110 }),
            kind: fc.string({ maxLength: 45 }),
            value: fc.oneof(fc.constant(null), fc.boolean(), fc.double({ noNaN: true, noDefaultInfinity: true }), fc.string({ maxLength: 45 })),
          },
          { requiredKeys: ["id", "at"] },
        ),
        (sample) => conforms(sample, event) === gatewayEventSchema.safeParse(sample).success,
      ),
      { numRuns: 500, seed: 20260620 },
    );
  });

  it("the batch limits agree with the zod schema the route uses", () => {
    const batch = { $ref: "#/components/schemas/GatewayEventBatch" };
    const one = { id: "a", at: 0, device: "d", kind: "press", value: 1 };
    for (const n of [0, 1, 500, 501]) {
      const sample = { events: Array.from({ length: n }, (_, i) => ({ ...one, id: `e${i}` })) };
      expect(conforms(sample, batch), `${n} events`).toBe(gatewayBatchSchema.safeParse(sample).success);
    }
  });
});
