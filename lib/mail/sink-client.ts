import { env } from "@/lib/env";

/** One message as kept by the local mail sink (`workers/mail-sink.ts`). */
export type SinkMessage = {
  id: string;
  /** ISO 8601 time the sink accepted the message. */
  receivedAt: string;
  from: string;
  /** Envelope recipients. */
  to: string[];
  subject: string;
  text: string;
  html?: string;
};

function sinkUrl(pathname: string): URL {
  return new URL(pathname, env().MAIL_SINK_API_URL);
}

async function call(url: URL, init?: RequestInit): Promise<unknown> {
  // Never cached: the inbox must show what arrived a moment ago.
  const res = await fetch(url, { ...init, cache: "no-store", signal: AbortSignal.timeout(5_000) });
  if (!res.ok) throw new Error(`Mail sink answered ${res.status} for ${init?.method ?? "GET"} ${url.pathname}`);
  return res.json();
}

/** Messages in the sink, newest first; with `to`, only those delivered to that address (case-insensitive). */
export async function listSinkMessages({ to }: { to?: string } = {}): Promise<SinkMessage[]> {
  const url = sinkUrl("/messages");
  if (to) url.searchParams.set("to", to);
  const body = (await call(url)) as { messages: SinkMessage[] };
  return body.messages;
}

/** Empties the sink; resolves with how many messages were removed. */
export async function clearSinkMessages(): Promise<number> {
  const body = (await call(sinkUrl("/messages"), { method: "DELETE" })) as { deleted: number };
  return body.deleted;
}
