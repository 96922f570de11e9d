import { env } from "@/lib/env";

/** One message as kept by the local push service (`workers/push-service.ts`). */
export type PushServiceMessage = {
  id: string;
  subscriptionId: string;
  /** ISO 8601 time the service accepted it. */
  receivedAt: string;
  ttl: number;
  urgency: string;
  topic: string | null;
  /** Size of the encrypted body and its RFC 8188 record size. */
  bodyOctets: number;
  recordSize: number;
  /** The verified VAPID claims (RFC 8292) and the signer's public key. */
  vapid: { sub: string | null; aud: string; exp: number; key: string };
  /** The decrypted payload: parsed JSON, or the text when it is not JSON. */
  payload: unknown;
  /** Handed to the subscribing browser already. */
  isDelivered: boolean;
};

export type PushServiceSubscription = { id: string; createdAt: string; deletedAt: string | null; isRestricted: boolean };

export type DemoSubscription = { endpoint: string; expirationTime: null; keys: { p256dh: string; auth: string } };

/** The local push service's base URL, or null when none is configured (production: browsers' own services). */
export function pushServiceUrl(): string | null {
  return env().PUSH_SERVICE_URL ?? null;
}

async function call<T>(pathname: string, init?: RequestInit): Promise<T> {
  const base = pushServiceUrl();
  if (!base) throw new Error("PUSH_SERVICE_URL is not set: there is no local push service.");
  const res = await fetch(new URL(pathname, base), { ...init, cache: "no-store", signal: AbortSignal.timeout(5_000) });
  if (!res.ok) throw new Error(`The local push service answered ${res.status} for ${init?.method ?? "GET"} ${pathname}`);
  return (await res.json()) as T;
}

/** A subscription made for `applicationServerKey`, as a browser's push stack would make it. */
export function createDemoSubscription(applicationServerKey: string): Promise<DemoSubscription> {
  return call("/subscriptions", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ applicationServerKey }) });
}

/** The subscription id in a local push service endpoint ("…/push/<id>"), or null. */
export function demoSubscriptionId(endpoint: string): string | null {
  const base = pushServiceUrl();
  if (!base) return null;
  const prefix = `${new URL(base).origin}/push/`;
  return endpoint.startsWith(prefix) && /^[0-9a-f-]{36}$/.test(endpoint.slice(prefix.length)) ? endpoint.slice(prefix.length) : null;
}

export async function deleteDemoSubscription(id: string): Promise<void> {
  const base = pushServiceUrl();
  if (!base) return;
  await fetch(new URL(`/subscriptions/${id}`, base), { method: "DELETE", signal: AbortSignal.timeout(5_000) });
}

/** Takes the subscription's new messages (each is handed over once). */
export async function receiveDemoMessages(id: string): Promise<PushServiceMessage[]> {
  return (await call<{ messages: PushServiceMessage[] }>(`/subscriptions/${id}/receive`, { method: "POST" })).messages;
}

export async function listPushServiceMessages(): Promise<PushServiceMessage[]> {
  return (await call<{ messages: PushServiceMessage[] }>("/messages")).messages;
}
