"use client";

import { useId, useRef, useState, useSyncExternalStore } from "react";
import { CopyButton } from "./copy-button";

/** A device of this site to put in the example call. */
export type ExampleDevice = { name: string; address: string; kind: "light-level" | "press"; value: number };

const subscribe = () => () => undefined;

/** The page's own origin in the browser; on the server (no window) the console's configured APP_URL. */
function useOrigin(fallback: string): string {
  return useSyncExternalStore(
    subscribe,
    () => window.location.origin,
    () => fallback,
  );
}

/** POSIX-shell single quoting: the JSON body goes through the shell untouched. */
const shellQuote = (s: string) => `'${s.replace(/'/g, `'\\''`)}'`;

export function GatewayHowTo({ siteId, fallbackOrigin, example }: { siteId: string; fallbackOrigin: string; example: ExampleDevice | null }) {
  const origin = useOrigin(fallbackOrigin);
  const id = useId();
  const postRef = useRef<HTMLPreElement>(null);
  // Fixed when the page opens, so what is shown is exactly what runs.
  const [at] = useState(() => new Date(Math.floor(Date.now() / 1000) * 1000).toISOString());
  const eventsUrl = `${origin}/api/v1/sites/${encodeURIComponent(siteId)}/events`;
  const commandsUrl = `${origin}/api/v1/sites/${encodeURIComponent(siteId)}/commands?after=0`;
  const event = { id: `console-test-${at.replace(/\D/g, "").slice(0, 14)}`, at, device: example?.address ?? "0x0001", kind: example?.kind ?? "press", value: example?.value ?? 1 };
  const post = [
    `curl -X POST ${shellQuote(eventsUrl)} \\`,
    `  -H 'Authorization: Bearer jpk_…' \\`,
    `  -H 'Content-Type: application/json' \\`,
    `  --data ${shellQuote(JSON.stringify({ events: [event] }))}`,
  ].join("\n");
  const poll = `curl ${shellQuote(commandsUrl)} \\\n  -H 'Authorization: Bearer jpk_…'`;

  const selectPost = () => {
    const pre = postRef.current;
    const selection = window.getSelection();
    if (!pre || !selection) return;
    const range = document.createRange();
    range.selectNodeContents(pre);
    selection.removeAllRanges();
    selection.addRange(range);
  };

  return (
    <section aria-labelledby={`${id}-title`} className="max-w-3xl">
      <h2 id={`${id}-title`} className="text-xl font-bold">
        Send events from the gateway
      </h2>
      <p className="mt-1 text-sm text-slate">
        The gateway posts batches of up to 500 events to this console, with the key in the <code className="font-mono">Authorization</code> header. Replace <code className="font-mono">jpk_…</code> with the whole key. This call sends one real reading
        {example ? ` from “${example.name}” (${example.address})` : ""}: the site&apos;s active Rule set runs on it.
      </p>
      <h3 id={`${id}-post`} className="mt-4 text-sm font-semibold">
        Post events
      </h3>
      <pre ref={postRef} aria-labelledby={`${id}-post`} tabIndex={0} className="mt-1 overflow-x-auto rounded-xl border border-line bg-paper p-3 font-mono text-xs leading-relaxed">
        <code>{post}</code>
      </pre>
      <div className="mt-2">
        <CopyButton text={post} label="Copy the command" copiedMessage="Command copied to the clipboard." onFallback={selectPost} />
      </div>
      <ul className="mt-3 list-disc space-y-1 pl-5 text-sm">
        <li>
          <code className="font-mono">id</code> is yours and unique per event: sending the same id again is ignored, so a gateway can safely resend a batch.
        </li>
        <li>
          <code className="font-mono">at</code> is milliseconds since 1970 (UTC) or an ISO 8601 time with offset; more than 5 minutes ahead of the server&apos;s clock is refused.
        </li>
        <li>
          <code className="font-mono">device</code> is the device&apos;s id or any of its unicast addresses, like <code className="font-mono">{event.device}</code>.
        </li>
        <li>
          The answer lists <code className="font-mono">accepted</code>, <code className="font-mono">duplicates</code>, <code className="font-mono">rejected</code> (each bad event with its index, field and a message; the good ones are still stored) and the{" "}
          <code className="font-mono">commands</code> to send on the mesh.
        </li>
      </ul>
      <h3 id={`${id}-poll`} className="mt-4 text-sm font-semibold">
        Poll for commands
      </h3>
      <p className="text-sm text-slate">A gateway that polls passes the last command number it has as <code className="font-mono">after</code> (0 the first time).</p>
      <pre aria-labelledby={`${id}-poll`} tabIndex={0} className="mt-1 overflow-x-auto rounded-xl border border-line bg-paper p-3 font-mono text-xs leading-relaxed">
        <code>{poll}</code>
      </pre>
      <p className="mt-3 text-sm">
        Every field and answer is described in the{" "}
        <a href="/api/v1/openapi.json" className="font-semibold underline">
          OpenAPI 3.1 document of the gateway API
        </a>
        .
      </p>
    </section>
  );
}
