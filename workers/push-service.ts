/**
 * Local push service: an RFC 8030-style endpoint on localhost that stands in
 * for the browsers' push services in demo, dev and test runs, so the whole
 * notice path works offline.
 *
 *   npx tsx workers/push-service.ts
 *
 * - `POST /push/{id}` takes a push message: checks the VAPID Authorization
 *   (RFC 8292: ES256 JWT, aud = this service's origin, exp ≤ 24 h ahead, and the
 *   key the subscription was made for), the TTL header (RFC 8030 §5.2), the
 *   aes128gcm body (RFC 8188/8291, ≤ 4096 octets), decrypts it with the keys it
 *   holds for that subscription and keeps it. 201 with a Location; 404 for an
 *   unknown subscription and 410 for one that was unsubscribed (RFC 8030 §7.3).
 * - `POST /subscriptions` (demo mode) makes a subscription the way a browser's
 *   push stack would: a fresh P-256 key pair and auth secret; the answer is the
 *   JSON of a PushSubscription. `DELETE /subscriptions/{id}` unsubscribes.
 * - `POST /subscriptions/{id}/receive` hands the subscription's new messages to
 *   its "browser" once (the console page relays them to its service worker).
 * - `GET /messages` lists what arrived (the /dev/push page reads it);
 *   `DELETE /messages` empties it. `POST /faults` makes the next pushes answer
 *   with a status or stall, to try the worker's retries by hand and in tests.
 *
 * Port from PUSH_SERVICE_PORT (default 2530); its public origin (the JWT
 * audience) from PUSH_SERVICE_URL (default http://127.0.0.1:<port>). Listens
 * on 127.0.0.1 only; everything is kept in memory.
 */
import { randomUUID } from "node:crypto";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { z } from "zod";
import { toB64u } from "../lib/push/base64url";
import { decryptWebPush, EceError, generateUaKeys, MAX_PUSH_BODY, parseEceHeader, type UaKeys } from "../lib/push/ece";
import type { PushServiceMessage, PushServiceSubscription } from "../lib/push/service-client";
import { isEntryModule, portFromEnv, runServiceMain } from "./entry";
import { VapidError, verifyVapid } from "../lib/push/vapid";

const HOST = "127.0.0.1";
const MAX_MESSAGES = 500;

type Subscription = { id: string; keys: UaKeys; applicationServerKey: string | null; createdAt: string; deletedAt: string | null };
type Fault = { subscriptionId: string | null; status: number | null; stallMs: number; times: number };

/** What the service holds; pass the same object to a restarted service to carry on where it stopped. */
export type PushServiceState = { subscriptions: Map<string, Subscription>; messages: PushServiceMessage[]; faults: Fault[] };

export function createPushServiceState(): PushServiceState {
  return { subscriptions: new Map(), messages: [], faults: [] };
}

export type PushServiceOptions = {
  /** 0 picks a free port (read the real one from the result). */
  port: number;
  state?: PushServiceState;
  /** The origin pushes must name as JWT audience; default http://127.0.0.1:<port>. */
  publicUrl?: string;
  /** Seconds since the epoch, for the JWT expiry check. */
  nowS?: () => number;
};

export type PushService = { url: string; port: number; close(): Promise<void> };

export async function startPushService({ port, publicUrl, state = createPushServiceState(), nowS = () => Math.floor(Date.now() / 1000) }: PushServiceOptions): Promise<PushService> {
  // Messages newest first.
  const { subscriptions, messages, faults } = state;
  let origin = "";

  const server = http.createServer((req, res) => {
    handle(req, res).catch((error: unknown) => {
      console.error(`push service: ${error instanceof Error ? error.stack : String(error)}`);
      if (!res.headersSent) send(res, 500, { error: "internal" });
      else res.destroy();
    });
  });

  async function handle(req: http.IncomingMessage, res: http.ServerResponse) {
    const url = new URL(req.url ?? "/", origin);
    const method = req.method ?? "GET";
    const path = url.pathname;

    if (path === "/health" && method === "GET") return send(res, 200, { ok: true, subscriptions: subscriptions.size, messages: messages.length });

    if (path === "/subscriptions" && method === "POST") {
      const body = await readJsonBody(req);
      const parsed = z.object({ applicationServerKey: z.string().regex(/^B[A-Za-z0-9_-]{86}$/).nullable().optional() }).safeParse(body ?? {});
      if (!parsed.success) return send(res, 400, { error: "applicationServerKey must be a P-256 public key in base64url (65 octets)." });
      const id = randomUUID();
      const keys = generateUaKeys();
      subscriptions.set(id, { id, keys, applicationServerKey: parsed.data.applicationServerKey ?? null, createdAt: new Date().toISOString(), deletedAt: null });
      return send(res, 201, { endpoint: `${origin}/push/${id}`, expirationTime: null, keys: { p256dh: toB64u(keys.publicKey), auth: toB64u(keys.authSecret) } });
    }

    if (path === "/subscriptions" && method === "GET") {
      const list: PushServiceSubscription[] = [...subscriptions.values()].map((s) => ({ id: s.id, createdAt: s.createdAt, deletedAt: s.deletedAt, isRestricted: s.applicationServerKey !== null }));
      return send(res, 200, { subscriptions: list });
    }

    const sub = /^\/subscriptions\/([0-9a-f-]{36})(\/receive)?$/.exec(path);
    if (sub) {
      const s = subscriptions.get(sub[1]);
      if (!s) return send(res, 404, { error: "No such subscription." });
      if (!sub[2] && method === "DELETE") {
        s.deletedAt ??= new Date().toISOString();
        res.writeHead(204).end();
        return;
      }
      if (sub[2] && method === "POST") {
        if (s.deletedAt) return send(res, 410, { error: "This subscription was removed." });
        const fresh = messages.filter((m) => m.subscriptionId === s.id && !m.isDelivered).reverse();
        for (const m of fresh) m.isDelivered = true;
        return send(res, 200, { messages: fresh });
      }
      return send(res, 405, { error: `Method ${method} not allowed` });
    }

    const push = /^\/push\/([^/]+)$/.exec(path);
    if (push) {
      if (method !== "POST") return send(res, 405, { error: `Method ${method} not allowed` }, { allow: "POST" });
      return receivePush(req, res, push[1]);
    }

    if (path === "/messages") {
      if (method === "GET") {
        const only = url.searchParams.get("subscription");
        return send(res, 200, { messages: messages.filter((m) => !only || m.subscriptionId === only) });
      }
      if (method === "DELETE") {
        const deleted = messages.length;
        messages.length = 0;
        return send(res, 200, { deleted });
      }
      return send(res, 405, { error: `Method ${method} not allowed` }, { allow: "GET, DELETE" });
    }

    if (path === "/faults") {
      if (method === "DELETE") {
        faults.length = 0;
        return send(res, 200, { ok: true });
      }
      if (method !== "POST") return send(res, 405, { error: `Method ${method} not allowed` }, { allow: "POST, DELETE" });
      const parsed = z
        .object({ subscriptionId: z.string().nullable().default(null), status: z.number().int().min(400).max(599).nullable().default(null), stallMs: z.number().int().min(0).max(120_000).default(0), times: z.number().int().min(1).max(100).default(1) })
        .strict()
        .safeParse(await readJsonBody(req));
      if (!parsed.success) return send(res, 400, { error: "A fault is {subscriptionId?, status?: 400–599, stallMs?, times?}." });
      faults.push(parsed.data);
      return send(res, 201, { ok: true });
    }

    return send(res, 404, { error: "Not found" });
  }

  async function receivePush(req: http.IncomingMessage, res: http.ServerResponse, id: string) {
    const fault = faults.find((f) => f.subscriptionId === null || f.subscriptionId === id);
    if (fault) {
      fault.times--;
      if (fault.times <= 0) faults.splice(faults.indexOf(fault), 1);
      // A stall that ends in nothing stored: the sender's timeout decides.
      if (fault.stallMs) await new Promise((r) => setTimeout(r, fault.stallMs));
      req.resume();
      if (fault.status) return send(res, fault.status, { error: `Fault injected: ${fault.status}` });
      if (fault.stallMs) return res.destroy();
    }

    const s = subscriptions.get(id);
    if (!s) return drainThen(req, () => send(res, 404, { error: "No such subscription." }));
    if (s.deletedAt) return drainThen(req, () => send(res, 410, { error: "This subscription was removed." }));

    let vapid: ReturnType<typeof verifyVapid>;
    try {
      vapid = verifyVapid({ authorization: req.headers.authorization, audience: origin, nowS: nowS() });
    } catch (error) {
      if (error instanceof VapidError) return drainThen(req, () => send(res, error.status, { error: error.message }));
      throw error;
    }
    // RFC 8292 §4.2: a subscription made for one application server key takes messages signed with it only.
    if (s.applicationServerKey && vapid.key !== s.applicationServerKey) return drainThen(req, () => send(res, 403, { error: "Signed with a key other than the one this subscription was made for (RFC 8292 §4.2)." }));

    // RFC 8030 §5.2: TTL is required.
    const ttlHeader = req.headers.ttl;
    const ttl = typeof ttlHeader === "string" && /^\d+$/.test(ttlHeader.trim()) ? Number(ttlHeader) : null;
    if (ttl === null) return drainThen(req, () => send(res, 400, { error: "The TTL header is missing or not a number of seconds (RFC 8030 §5.2)." }));
    if (req.headers["content-encoding"] !== "aes128gcm") return drainThen(req, () => send(res, 415, { error: 'Content-Encoding must be "aes128gcm" (RFC 8291 §4).' }));

    const body = await readBody(req, MAX_PUSH_BODY);
    if (body === null) return send(res, 413, { error: `The body is larger than ${MAX_PUSH_BODY} octets (RFC 8291 §4).` });

    let plaintext: Buffer;
    let recordSize: number;
    try {
      recordSize = parseEceHeader(body).recordSize;
      plaintext = decryptWebPush(body, s.keys);
    } catch (error) {
      if (error instanceof EceError) return send(res, 400, { error: error.message });
      throw error;
    }

    const topic = typeof req.headers.topic === "string" ? req.headers.topic : null;
    const urgency = typeof req.headers.urgency === "string" ? req.headers.urgency : "normal";
    // RFC 8030 §5.4: a message with the topic of one not yet delivered replaces it.
    if (topic) {
      const earlier = messages.findIndex((m) => m.subscriptionId === id && m.topic === topic && !m.isDelivered);
      if (earlier >= 0) messages.splice(earlier, 1);
    }
    const text = plaintext.toString("utf8");
    let payload: unknown = text;
    try {
      payload = JSON.parse(text);
    } catch {
      // not JSON: kept as text
    }
    const message: PushServiceMessage = {
      id: randomUUID(),
      subscriptionId: id,
      receivedAt: new Date().toISOString(),
      ttl,
      urgency,
      topic,
      bodyOctets: body.length,
      recordSize,
      vapid: { sub: vapid.claims.sub ?? null, aud: vapid.claims.aud, exp: vapid.claims.exp, key: vapid.key },
      payload,
      isDelivered: false,
    };
    messages.unshift(message);
    if (messages.length > MAX_MESSAGES) messages.length = MAX_MESSAGES;
    return send(res, 201, { id: message.id }, { location: `/messages/${message.id}` });
  }

  const realPort = await new Promise<number>((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, HOST, () => {
      server.off("error", reject);
      resolve((server.address() as AddressInfo).port);
    });
  });
  origin = new URL(publicUrl ?? `http://${HOST}:${realPort}`).origin;

  return {
    url: origin,
    port: realPort,
    close: () =>
      new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()));
        server.closeAllConnections();
      }),
  };
}

function send(res: http.ServerResponse, status: number, body: unknown, headers: Record<string, string> = {}) {
  res.writeHead(status, { "content-type": "application/json; charset=utf-8", "cache-control": "no-store", ...headers });
  res.end(JSON.stringify(body));
}

/** Answers after the request body has been read, so the client is not cut off mid-upload. */
function drainThen(req: http.IncomingMessage, answer: () => void) {
  req.resume();
  if (req.readableEnded) return answer();
  req.once("end", answer);
  req.once("error", answer);
}

/** The body, or null once it passes `limit` octets. */
async function readBody(req: http.IncomingMessage, limit: number): Promise<Buffer | null> {
  const chunks: Buffer[] = [];
  let length = 0;
  for await (const chunk of req as AsyncIterable<Buffer>) {
    length += chunk.length;
    if (length <= limit) chunks.push(chunk);
  }
  return length > limit ? null : Buffer.concat(chunks);
}

async function readJsonBody(req: http.IncomingMessage): Promise<unknown> {
  const body = await readBody(req, 16 * 1024);
  if (!body || body.length === 0) return undefined;
  try {
    return JSON.parse(body.toString("utf8"));
  } catch {
    return null;
  }
}

if (isEntryModule(import.meta.url)) {
  runServiceMain(
    "push service",
    () => startPushService({ port: portFromEnv("PUSH_SERVICE_PORT", 2530), publicUrl: process.env.PUSH_SERVICE_URL || undefined }),
    (service) => `${service.url} (push at /push/{id}, messages at /messages)`,
  );
}
