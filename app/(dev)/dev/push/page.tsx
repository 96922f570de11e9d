import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { env } from "@/lib/env";
import { listPushServiceMessages, pushServiceUrl, type PushServiceMessage } from "@/lib/push/service-client";

export const metadata: Metadata = { title: "Push service", robots: { index: false, follow: false } };
export const dynamic = "force-dynamic";

type Received = { ok: true; messages: PushServiceMessage[] } | { ok: false; reason: string };

export default async function DevPushPage() {
  // The (dev) layout already answers 404; checked again so the page is never reachable on its own.
  if (env().JOULEPATH_DEV_TOOLS !== "1") notFound();
  const url = pushServiceUrl();
  const received: Received = url
    ? await listPushServiceMessages().then(
        (messages) => ({ ok: true as const, messages }),
        (error: unknown) => ({ ok: false as const, reason: error instanceof Error ? error.message : String(error) }),
      )
    : { ok: false, reason: "PUSH_SERVICE_URL is not set." };

  return (
    <main id="main" className="mx-auto max-w-5xl px-4 py-8 font-sans text-ink">
      <h1 className="text-2xl font-extrabold">Push service</h1>
      <p role="note" className="mt-3 rounded-lg border border-line bg-paper px-4 py-3 text-sm text-slate">
        Local push service — what the notice worker pushed in demo/dev mode, after the service checked its VAPID signature (RFC 8292) and decrypted it (RFC 8291). Nothing here left this machine.
      </p>
      {received.ok ? (
        <section aria-labelledby="received-heading" className="mt-6">
          <h2 id="received-heading" className="text-lg font-bold">
            Messages <span className="font-semibold text-slate">({received.messages.length}, newest first)</span>
          </h2>
          {received.messages.length === 0 ? (
            <p className="mt-3 text-slate">Nothing pushed yet. Turn on push notices on the account page, then trigger a rule.</p>
          ) : (
            <div className="mt-3 overflow-x-auto rounded-xl border border-line bg-paper">
              <table className="w-full text-left text-sm">
                <thead className="border-b border-line bg-fog text-xs uppercase tracking-wide text-slate">
                  <tr>
                    <th scope="col" className="px-3 py-2">Received (UTC)</th>
                    <th scope="col" className="px-3 py-2">Notice</th>
                    <th scope="col" className="px-3 py-2">Subscription</th>
                    <th scope="col" className="px-3 py-2">VAPID</th>
                    <th scope="col" className="px-3 py-2">Body</th>
                    <th scope="col" className="px-3 py-2">Handed to browser</th>
                  </tr>
                </thead>
                <tbody className="divide-y divide-line">
                  {received.messages.map((m) => (
                    <tr key={m.id} className="align-top">
                      <td className="whitespace-nowrap px-3 py-2">
                        <time dateTime={m.receivedAt}>{m.receivedAt.slice(0, 19).replace("T", " ")}</time>
                      </td>
                      <td className="px-3 py-2">{describe(m.payload)}</td>
                      <td className="px-3 py-2 font-mono text-xs">{m.subscriptionId.slice(0, 8)}…</td>
                      <td className="px-3 py-2 text-xs">
                        {m.vapid.sub ?? "(no sub)"}
                        <br />
                        exp in {Math.round((m.vapid.exp * 1000 - Date.parse(m.receivedAt)) / 60_000)} min
                      </td>
                      <td className="whitespace-nowrap px-3 py-2 text-xs">
                        {m.bodyOctets} octets · rs {m.recordSize}
                        <br />
                        TTL {m.ttl} s · {m.urgency}
                      </td>
                      <td className="px-3 py-2">{m.isDelivered ? "Yes" : "Not yet"}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </section>
      ) : (
        <div role="alert" className="mt-6 rounded-xl border border-clay/40 bg-paper p-5">
          <h2 className="font-bold text-clay">The local push service is not reachable.</h2>
          <p className="mt-2 text-sm">
            Start it with <code className="rounded bg-fog px-1.5 py-0.5 font-semibold">npx tsx workers/push-service.ts</code> and set{" "}
            <code>PUSH_SERVICE_URL</code> (the demo command does both), then reload this page.
          </p>
          <p className="mt-1 text-xs text-slate">Detail: {received.reason}</p>
        </div>
      )}
    </main>
  );
}

function describe(payload: unknown) {
  if (payload && typeof payload === "object" && "title" in payload) {
    const p = payload as { title?: unknown; body?: unknown; url?: unknown };
    return (
      <>
        <strong>{String(p.title)}</strong>
        <br />
        {String(p.body ?? "")}
        {typeof p.url === "string" ? <span className="block text-xs text-slate">opens {p.url}</span> : null}
      </>
    );
  }
  return <span className="font-mono text-xs">{JSON.stringify(payload).slice(0, 300)}</span>;
}
