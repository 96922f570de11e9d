import { z } from "zod";
import type { CommandMessage, SystemReason } from "@/lib/bus/types";
import { DEVICE_KIND_INFO } from "@/lib/catalogue/device-kinds";
import { idSchema } from "@/lib/validation/site";
import { gatewayBatchSchema, gatewayEventSchema, MAX_BATCH, MAX_FUTURE_MS } from "./validate-events";

/**
 * The gateway API as an OpenAPI 3.1 document, served at GET /api/v1/openapi.json.
 * Request schemas are generated from the zod schemas the route handlers parse
 * with (lib/gateway/validate-events.ts), so the document cannot drift from what
 * the server accepts. Answer schemas are written here in zod; the integration
 * tests parse the real answers with them, so they cannot drift either.
 */

export const OPENAPI_VERSION = "3.1.0";
/** The version of this document's API (the `/v1/` in its paths). */
export const GATEWAY_API_VERSION = "1.0.0";
/** GET …/commands returns at most this many per call (as app/api/v1/sites/[siteId]/commands/route.ts parses `limit`). */
export const COMMANDS_PAGE_MAX = 500;
/** readJson's limit for a batch in app/api/v1/sites/[siteId]/events/route.ts. */
export const MAX_BATCH_BYTES = 2 * 1024 * 1024;

const COMMAND_MESSAGES = ["generic-onoff-set-unack", "light-lightness-set-unack", "scene-recall-unack"] as const satisfies readonly CommandMessage[];
const SYSTEM_REASONS = ["zone-vacant", "hold-ended", "relay-time-up", "cleared-by-person"] as const satisfies readonly SystemReason[];
// Compile-time guards: a value added to CommandMessage or SystemReason but not listed above fails typecheck here.
const everyValueListed: [Exclude<CommandMessage, (typeof COMMAND_MESSAGES)[number]>, Exclude<SystemReason, (typeof SYSTEM_REASONS)[number]>] extends [never, never] ? true : never = true;
void everyValueListed;

/** One rejected item of a batch (lib/gateway/validate-events.ts `ItemError`). */
export const itemErrorSchema = z
  .strictObject({
    index: z.number().int().nonnegative().meta({ description: "Position of the item in `events`, from 0." }),
    id: z.string().optional().meta({ description: "The item's id, when it had a readable one." }),
    field: z.string().meta({ description: 'The field at fault ("id", "at", "device", "kind", "value", or "event" for the item as a whole).' }),
    message: z.string(),
  })
  .meta({ description: "An item that was not stored, and why." });

/** A mesh access message for the gateway to send (lib/bus/types.ts `GatewayCommand`, as the events answer carries it). */
export const commandSchema = z
  .strictObject({
    seq: z.number().int().positive().meta({ description: "Command number on this site, increasing; pass the last one you have as `after`." }),
    at: z.number().int().nonnegative().meta({ description: "When the engine issued it, ms since 1970 (UTC)." }),
    destination: z.number().int().min(0).max(0xffff).meta({ description: "Mesh destination address: a unicast element 0x0001–0x7FFF or a group 0xC000–0xFEFF (Mesh Profile 1.0.1 §3.4.2)." }),
    addressing: z.enum(["group", "unicast"]),
    message: z.enum(COMMAND_MESSAGES),
    bytes: z
      .string()
      .regex(/^[0-9A-F]{2}( [0-9A-F]{2})*$/)
      .meta({ description: 'The access message as upper-case hex octets, opcode first (Mesh Model 1.0.1 Table 7.1), e.g. "82 4D FF FF 06 0A 00".' }),
    tid: z.number().int().min(0).max(255).meta({ description: "Transaction identifier octet." }),
    ttl: z.number().int().min(0).max(127).meta({ description: "TTL to send with (Mesh Profile 1.0.1 §3.4.4.3)." }),
    transition: z.number().int().min(0).max(255).nullable().meta({ description: "Transition time octet when the message carries one (Mesh Model 1.0.1 §3.1.3), else null." }),
  })
  .meta({ description: "A message for the gateway to send on the mesh." });

/** A command as GET …/commands lists it: everything the engine stored, including why it was sent. */
export const storedCommandSchema = commandSchema
  .extend({
    source: z.number().int().min(1).max(0x7fff).meta({ description: "The gateway's own unicast address (the message's source)." }),
    devices: z.array(z.string()).meta({ description: "Ids of the luminaires or relays it is meant for." }),
    origin: z.string().meta({ description: "The event id or timer that led to it." }),
    ruleId: z.string().nullable().meta({ description: "The rule that sent it, or null when the engine did (a hold or timer ending)." }),
    actionId: z.string().nullable(),
    reason: z.enum(SYSTEM_REASONS).optional().meta({ description: "Why the engine sent it on its own." }),
  })
  .meta({ description: "A command as stored, with what caused it." });

/** POST …/events answer: 200 when anything was valid, 422 (with `error`) when nothing was. */
export const eventsAnswerSchema = z.strictObject({
  error: z.literal("invalid_events").optional(),
  message: z.string().optional(),
  accepted: z.number().int().nonnegative().meta({ description: "Events stored and run through the active rules now." }),
  duplicates: z.array(z.string()).meta({ description: "Ids already stored earlier: ignored, so resending a batch is harmless." }),
  rejected: z.array(itemErrorSchema),
  commands: z.array(commandSchema).meta({ description: "What the accepted events made the rules send, in order." }),
});

export const commandsAnswerSchema = z.strictObject({
  commands: z.array(storedCommandSchema),
  last: z.number().int().nonnegative().meta({ description: "The last command number in this answer (or `after` when there is none): the next call's `after`." }),
});

/** Every error answer (lib/api/respond.ts): a code, a sentence, for 422 the fields at fault; an AppError's details may add more. */
export const errorAnswerSchema = z.looseObject({
  error: z.string().meta({ description: 'A stable code: "unauthenticated", "too_large", "invalid_input", "bad_request" …' }),
  message: z.string().meta({ description: "A sentence for a person." }),
  fields: z.record(z.string(), z.array(z.string())).optional().meta({ description: 'Field path → messages, e.g. { "events": ["At most 500 events in one batch"] }.' }),
});

/** The query of GET …/commands, as that route parses it. */
const commandsQuery = {
  after: z.number().int().min(0).default(0).meta({ description: "Last command number you already have; 0 for all." }),
  limit: z.number().int().min(1).max(COMMANDS_PAGE_MAX).default(COMMANDS_PAGE_MAX).meta({ description: "How many to return at most." }),
};

type Json = Record<string, unknown>;

export type OpenApiDocument = {
  openapi: string;
  info: { title: string; version: string; description: string };
  servers?: { url: string; description?: string }[];
  security: Record<string, string[]>[];
  paths: Record<string, Record<string, Json>>;
  components: { schemas: Record<string, Json>; securitySchemes: Record<string, Json> };
};

/** zod → JSON Schema 2020-12, the dialect OpenAPI 3.1 uses; the `$schema` line is dropped inside the document. */
function schemaOf(schema: z.ZodType, io: "input" | "output"): Json {
  const { $schema: _dialect, ...json } = z.toJSONSchema(schema, { target: "draft-2020-12", io, unrepresentable: "throw" }) as Json;
  return json;
}

/** The answer schemas as components; one that uses another refers to it by $ref instead of repeating it. */
function answerSchemas(): Record<string, Json> {
  const registry = z.registry<{ id: string }>();
  registry.add(itemErrorSchema, { id: "ItemError" });
  registry.add(commandSchema, { id: "Command" });
  registry.add(storedCommandSchema, { id: "StoredCommand" });
  registry.add(eventsAnswerSchema, { id: "EventsAnswer" });
  registry.add(commandsAnswerSchema, { id: "CommandsAnswer" });
  registry.add(errorAnswerSchema, { id: "Error" });
  const { schemas } = z.toJSONSchema(registry, { target: "draft-2020-12", io: "output", unrepresentable: "throw", uri: (id) => `#/components/schemas/${id}` });
  return Object.fromEntries(
    Object.entries(schemas).map(([id, schema]) => {
      const { $schema: _dialect, $id: _id, ...rest } = schema as Json;
      return [id, rest];
    }),
  );
}

/** Adds a description to a generated property, and fails loudly when the property is gone (the schema changed). */
function describeProperty(object: Json, name: string, description: string) {
  const props = object.properties as Record<string, Json> | undefined;
  if (!props?.[name]) throw new Error(`openapi: the gateway event schema has no "${name}" property any more; update lib/gateway/openapi.ts`);
  props[name] = { description, ...props[name] };
}

const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });
const json = (schema: Json) => ({ "application/json": { schema } });
const errorAnswer = (description: string) => ({ description, content: json(ref("Error")) });

function eventSchemaJson(): Json {
  const event = schemaOf(gatewayEventSchema, "input");
  const kinds = [...new Set(Object.values(DEVICE_KIND_INFO).flatMap((k) => k.reports))];
  describeProperty(event, "id", "Your id for this report, unique per site. Sending the same id again is ignored, so retrying a batch is safe.");
  describeProperty(event, "at", `When the device reported: ms since 1970 (UTC) or an ISO 8601 date-time with offset. More than ${MAX_FUTURE_MS / 60_000} minutes ahead of the server's clock is refused.`);
  describeProperty(event, "device", 'The device: its Joulepath id ("larch-lane-dev-sensor-path") or any of its element addresses ("0x0013").');
  describeProperty(event, "kind", `What the device reported; it must be something its kind reports: ${kinds.join(", ")}.`);
  describeProperty(
    event,
    "value",
    'press/release/long-press: button number from 1 (or null for 1); motion: true/false; contact: "open"/"closed"; fire-alarm: "active"/"cleared" (or true/false); light-level: lx 0–200000; temperature: °C −40–85; humidity: %RH 0–100.',
  );
  return event;
}

function batchSchemaJson(): Json {
  const batch = schemaOf(gatewayBatchSchema, "input");
  const events = (batch.properties as Record<string, Json> | undefined)?.events;
  if (!events || events.type !== "array") throw new Error("openapi: gatewayBatchSchema.events is not an array any more; update lib/gateway/openapi.ts");
  // The route takes the items as unknown and checks each on its own (so one bad item does not sink the batch); documented, each is a GatewayEvent.
  events.items = ref("GatewayEvent");
  events.description = `Up to ${MAX_BATCH} events. Valid ones are stored even when others are rejected.`;
  return batch;
}

function queryParameter(name: keyof typeof commandsQuery): Json {
  const schema = schemaOf(commandsQuery[name], "input");
  const { description, ...rest } = schema;
  return { name, in: "query", required: false, description, schema: rest };
}

/** The whole document. `serverUrl`: the console's public origin (APP_URL), listed as the server. */
export function buildGatewayOpenApi(options: { serverUrl?: string } = {}): OpenApiDocument {
  const siteId = { name: "siteId", in: "path", required: true, description: "The site's id, as in the console's address bar.", schema: schemaOf(idSchema, "input") };
  const unauthorised = errorAnswer("No key, a wrong or revoked key, or a key of another site.");
  return {
    openapi: OPENAPI_VERSION,
    info: {
      title: "Joulepath gateway API",
      version: GATEWAY_API_VERSION,
      description:
        "How a site's gateway reports what its switches and sensors did, and collects the mesh messages the site's active Rule set sends back. Authenticate with the site's gateway key (created under Gateway keys in the console) as `Authorization: Bearer jpk_…`.",
    },
    ...(options.serverUrl ? { servers: [{ url: options.serverUrl, description: "This console" }] } : {}),
    security: [{ gatewayKey: [] }],
    paths: {
      "/api/v1/sites/{siteId}/events": {
        post: {
          operationId: "postEvents",
          summary: "Report a batch of device events",
          description:
            "Stores each valid event (ids seen before are listed as duplicates and ignored), runs it through the active rules in time order, and answers with the commands to send. Each invalid item is listed in `rejected` with its index and field; nothing of it is kept.",
          security: [{ gatewayKey: [] }],
          parameters: [siteId],
          requestBody: { required: true, description: `A JSON body of at most ${MAX_BATCH_BYTES} bytes.`, content: json(ref("GatewayEventBatch")) },
          responses: {
            "200": { description: "At least one event was valid (or a duplicate). Rejected items, if any, are listed.", content: json(ref("EventsAnswer")) },
            "400": errorAnswer("The body is not JSON."),
            "401": unauthorised,
            "409": errorAnswer("Another batch for this site changed its state at the same moment; nothing was stored, send the batch again."),
            "413": errorAnswer(`The body is larger than ${MAX_BATCH_BYTES} bytes.`),
            "422": {
              description: `Nothing was stored: either the batch itself is malformed (no \`events\`, empty, or more than ${MAX_BATCH} items — an Error with \`fields\`), or every item was rejected (an EventsAnswer with \`error: "invalid_events"\`).`,
              content: json({ anyOf: [ref("Error"), ref("EventsAnswer")] }),
            },
          },
        },
      },
      "/api/v1/sites/{siteId}/commands": {
        get: {
          operationId: "listCommands",
          summary: "Commands issued after a given number",
          description: "For gateways that poll: the site's commands numbered after `after`, oldest first, at most `limit`.",
          security: [{ gatewayKey: [] }],
          parameters: [siteId, queryParameter("after"), queryParameter("limit")],
          responses: {
            "200": { description: "The commands, oldest first.", content: json(ref("CommandsAnswer")) },
            "401": unauthorised,
            "422": errorAnswer("`after` or `limit` is not a whole number in range."),
          },
        },
      },
    },
    components: {
      schemas: {
        GatewayEvent: eventSchemaJson(),
        GatewayEventBatch: batchSchemaJson(),
        ...answerSchemas(),
      },
      securitySchemes: {
        gatewayKey: {
          type: "http",
          scheme: "bearer",
          bearerFormat: "jpk_ followed by 43 base64url characters",
          description: "The site's gateway key. It is shown once when created; only its SHA-256 is stored.",
        },
      },
    },
  };
}
