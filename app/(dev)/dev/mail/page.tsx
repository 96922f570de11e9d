import type { Metadata } from "next";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { env } from "@/lib/env";
import { listSinkMessages, type SinkMessage } from "@/lib/mail/sink-client";

export const metadata: Metadata = { title: "Mail sink", robots: { index: false, follow: false } };
export const dynamic = "force-dynamic";

type Inbox = { ok: true; messages: SinkMessage[] } | { ok: false; reason: string };

export default async function DevMailPage() {
  // The (dev) layout already answers 404; checked again so the page is never reachable on its own.
  if (env().JOULEPATH_DEV_TOOLS !== "1") notFound();

  const apiUrl = env().MAIL_SINK_API_URL;
  const inbox: Inbox = await listSinkMessages().then(
    (messages) => ({ ok: true, messages }),
    (error: unknown) => ({ ok: false, reason: error instanceof Error ? error.message : String(error) }),
  );

  return (
    <main id="main" className="mx-auto max-w-5xl px-4 py-8 font-sans text-ink">
      <h1 className="text-2xl font-extrabold">Mail sink</h1>
      <p role="note" className="mt-3 rounded-lg border border-line bg-paper px-4 py-3 text-sm text-slate">
        Local mail sink — messages sent by this console in demo/dev mode; nothing here left this machine.
      </p>

      {inbox.ok ? (
        <MessageList messages={inbox.messages} apiUrl={apiUrl} />
      ) : (
        <div role="alert" className="mt-6 rounded-xl border border-clay/40 bg-paper p-5">
          <h2 className="font-bold text-clay">The mail sink is not reachable.</h2>
          <p className="mt-2 text-sm">
            Nothing answered at <code>{apiUrl}</code>. Start it with{" "}
            <code className="rounded bg-fog px-1.5 py-0.5 font-semibold">npx tsx workers/mail-sink.ts</code> and reload
            this page.
          </p>
          <p className="mt-1 text-xs text-slate">Detail: {inbox.reason}</p>
        </div>
      )}
    </main>
  );
}

function MessageList({ messages, apiUrl }: { messages: SinkMessage[]; apiUrl: string }) {
  return (
    <section aria-labelledby="inbox-heading" className="mt-6">
      <h2 id="inbox-heading" className="text-lg font-bold">
        Messages <span className="font-semibold text-slate">({messages.length}, newest first)</span>
      </h2>
      {messages.length === 0 ? (
        <p className="mt-3 text-slate">No messages yet. Anything the console sends will appear here.</p>
      ) : (
        <ol className="mt-3 divide-y divide-line overflow-hidden rounded-xl border border-line bg-paper">
          {messages.map((m) => (
            <li key={m.id}>
              <details>
                <summary className="grid cursor-pointer gap-x-4 gap-y-0.5 px-4 py-3 hover:bg-fog sm:grid-cols-[11rem_14rem_1fr]">
                  <span className="text-sm text-slate">
                    <span className="sr-only">Received </span>
                    <time dateTime={m.receivedAt}>{formatTime(m.receivedAt)}</time>
                  </span>
                  <span className="truncate text-sm">
                    <span className="text-slate">To </span>
                    {m.to.join(", ")}
                  </span>
                  <span className="font-semibold">
                    <span className="sr-only">Subject: </span>
                    {m.subject || "(no subject)"}
                  </span>
                </summary>
                <div className="border-t border-line px-4 py-4">
                  <dl className="grid grid-cols-[4rem_1fr] gap-x-3 gap-y-1 text-sm">
                    <dt className="text-slate">From</dt>
                    <dd>{m.from}</dd>
                    <dt className="text-slate">To</dt>
                    <dd>{m.to.join(", ")}</dd>
                  </dl>
                  <h3 className="sr-only">Text body</h3>
                  <div className="mt-3 whitespace-pre-wrap break-words rounded-lg bg-fog p-4 text-sm">
                    {m.text ? linkify(m.text) : <span className="text-slate">(no text body)</span>}
                  </div>
                  <p className="mt-2 text-xs text-slate">
                    {m.html ? "This message also has an HTML part. " : "Text only. "}
                    <a href={new URL(`/messages/${encodeURIComponent(m.id)}`, apiUrl).href} className="underline">
                      Raw JSON
                    </a>
                  </p>
                </div>
              </details>
            </li>
          ))}
        </ol>
      )}
    </section>
  );
}

/** "2026-05-14 10:04:12 UTC": fixed format, so server and reader never disagree on a time zone. */
function formatTime(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return `${d.toISOString().slice(0, 19).replace("T", " ")} UTC`;
}

const URL_PATTERN = /https?:\/\/[^\s<>"']+/g;

/** Turns the http(s) URLs in a plain-text body into links; everything else stays text (React escapes it). */
function linkify(text: string): ReactNode[] {
  const parts: ReactNode[] = [];
  let last = 0;
  for (const match of text.matchAll(URL_PATTERN)) {
    // A sentence's closing punctuation is not part of the URL.
    const url = match[0].replace(/[.,;:!?)\]]+$/, "");
    const start = match.index;
    if (start > last) parts.push(text.slice(last, start));
    parts.push(
      <a key={start} href={url} className="font-semibold break-all text-ink underline">
        {url}
      </a>,
    );
    last = start + url.length;
  }
  if (last < text.length) parts.push(text.slice(last));
  return parts;
}
