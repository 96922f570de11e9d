"use client";

import { useQueryClient } from "@tanstack/react-query";
import { useEffect } from "react";
import { ApiError, fetchJson } from "@/components/api/fetch-json";
import { DEMO_ENDPOINT_KEY, demoEndpoint } from "./browser-push";

const POLL_MS = 2_000;

/**
 * Demo mode only: a browser's push stack would receive the local push
 * service's messages itself; here the open console page asks for them and
 * hands them to its service worker, which shows them like real push events.
 */
export function DemoPushRelay() {
  const queryClient = useQueryClient();
  useEffect(() => {
    if (!("serviceWorker" in navigator)) return;
    let isStopped = false;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const tick = async () => {
      if (isStopped) return;
      // Looked up every time: notices may be turned on in this tab after it mounted.
      const endpoint = demoEndpoint();
      if (endpoint) await relay(endpoint);
      if (!isStopped) timer = setTimeout(tick, POLL_MS);
    };
    const relay = async (endpoint: string) => {
      try {
        const { messages } = await fetchJson<{ messages: unknown[] }>("/api/push/demo/receive", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ endpoint }) });
        if (messages.length) {
          const registration = await navigator.serviceWorker.ready;
          registration.active?.postMessage({ type: "demo-push", messages });
          void queryClient.invalidateQueries({ queryKey: ["notices"] });
        }
      } catch (error) {
        // The subscription is gone (removed after a 410, or another person took this browser): stop relaying.
        if (error instanceof ApiError && error.status === 404) window.localStorage.removeItem(DEMO_ENDPOINT_KEY);
      }
    };
    void tick();
    return () => {
      isStopped = true;
      clearTimeout(timer);
    };
  }, [queryClient]);
  return null;
}
