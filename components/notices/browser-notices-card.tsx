"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { fetchJson } from "@/components/api/fetch-json";
import type { PushSubscriptionRowJson } from "@/lib/validation/notices";
import { disableBrowserPush, enableBrowserPush, readBrowserPush, type BrowserPushState } from "./browser-push";

const SUBS_KEY = ["notices", "push-subscriptions"] as const;

/** "Notices on this browser": turn push on or off here, and see the other browsers that get them. */
export function BrowserNoticesCard() {
  const queryClient = useQueryClient();
  const [state, setState] = useState<BrowserPushState | null>(null);
  const [isBusy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const subs = useQuery({ queryKey: SUBS_KEY, queryFn: () => fetchJson<{ subscriptions: PushSubscriptionRowJson[] }>("/api/push/subscriptions") });

  useEffect(() => {
    readBrowserPush().then(setState, () => setState({ status: "off" }));
  }, []);

  const run = async (work: () => Promise<BrowserPushState>, message: string) => {
    setBusy(true);
    setError(null);
    setDone(null);
    try {
      setState(await work());
      setDone(message);
      await queryClient.invalidateQueries({ queryKey: SUBS_KEY });
    } catch (e) {
      setError(e instanceof Error ? e.message : "Something went wrong.");
    } finally {
      setBusy(false);
    }
  };

  return (
    <div className="mt-3 space-y-3">
      <div aria-live="polite">
        {state === null ? (
          <p className="text-sm text-slate">Checking this browser…</p>
        ) : state.status === "unsupported" ? (
          <p className="text-sm text-slate">This browser cannot show notices from web pages. The inbox and e-mail still work.</p>
        ) : state.status === "blocked" ? (
          <p className="text-sm font-semibold text-clay">Notifications are blocked for this console. Allow them in the browser&apos;s site settings, then reload this page.</p>
        ) : state.status === "on" ? (
          <p className="text-sm">
            <span className="mr-2 inline-block rounded-full bg-moss/15 px-2 py-0.5 text-xs font-bold text-moss">On</span>
            Push notices come to this browser{state.mode === "demo" ? " through the local demo push service (nothing leaves this machine)" : ""}.
          </p>
        ) : (
          <p className="text-sm">
            <span className="mr-2 inline-block rounded-full bg-slate/15 px-2 py-0.5 text-xs font-bold text-slate">Off</span>
            This browser does not get push notices.
          </p>
        )}
      </div>
      {error ? (
        <p role="alert" className="rounded-md border border-clay/50 bg-clay/10 px-3 py-2 text-sm font-semibold text-clay">
          {error}
        </p>
      ) : null}
      {done ? (
        <p role="status" className="text-sm font-semibold text-moss">
          {done}
        </p>
      ) : null}
      {state?.status === "off" || state?.status === "blocked" ? (
        <button type="button" disabled={isBusy} aria-busy={isBusy || undefined} onClick={() => run(enableBrowserPush, "Push notices are on for this browser.")} className="rounded-md bg-ink px-4 py-2 font-semibold text-fog disabled:opacity-70">
          {isBusy ? "Turning on…" : "Turn on push notices here"}
        </button>
      ) : null}
      {state?.status === "on" ? (
        <button type="button" disabled={isBusy} aria-busy={isBusy || undefined} onClick={() => run(() => disableBrowserPush(state), "Push notices are off for this browser.")} className="rounded-md border border-line px-4 py-2 font-semibold text-ink hover:bg-fog disabled:opacity-70">
          {isBusy ? "Turning off…" : "Turn off push notices here"}
        </button>
      ) : null}
      {subs.data?.subscriptions.length ? (
        <div>
          <h3 className="text-sm font-bold">Browsers that get your push notices</h3>
          <ul className="mt-1 divide-y divide-line rounded-lg border border-line text-sm">
            {subs.data.subscriptions.map((s) => (
              <li key={s.id} className="flex flex-wrap justify-between gap-x-3 px-3 py-2">
                <span className="font-semibold">{s.label || "Browser"}</span>
                <span className="text-slate">
                  {s.origin === "demo" ? "local demo push service" : s.host} · since {new Date(s.createdAt).toLocaleDateString()}
                  {s.lastSuccessAt ? ` · last notice ${new Date(s.lastSuccessAt).toLocaleString()}` : ""}
                </span>
              </li>
            ))}
          </ul>
        </div>
      ) : null}
    </div>
  );
}
