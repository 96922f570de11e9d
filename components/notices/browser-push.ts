import { fetchJson } from "@/components/api/fetch-json";

/**
 * This browser's side of push notices: the service worker, the permission, and
 * the subscription (the browser's own PushManager, or in demo mode one taken
 * from the local push service and remembered here).
 */
export const DEMO_ENDPOINT_KEY = "joulepath.demo-push-endpoint";
/** PushManager.subscribe can hang with no reachable push service; never wait longer than this. */
const SUBSCRIBE_TIMEOUT_MS = 20_000;

export type BrowserPushState =
  | { status: "unsupported" }
  | { status: "blocked" }
  | { status: "off" }
  | { status: "on"; mode: "demo" | "browser"; endpoint: string };

type Config = { publicKey: string; hasDemoService: boolean };
type Sub = { endpoint: string; expirationTime: number | null; keys: { p256dh: string; auth: string } };

export function isSupported(): boolean {
  return typeof window !== "undefined" && "serviceWorker" in navigator && "Notification" in window;
}

export function demoEndpoint(): string | null {
  try {
    return window.localStorage.getItem(DEMO_ENDPOINT_KEY);
  } catch {
    return null;
  }
}

function withTimeout<T>(promise: Promise<T>, ms: number, message: string): Promise<T> {
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(message)), ms);
    promise.then(
      (v) => (clearTimeout(timer), resolve(v)),
      (e: unknown) => (clearTimeout(timer), reject(e)),
    );
  });
}

export async function readBrowserPush(): Promise<BrowserPushState> {
  if (!isSupported()) return { status: "unsupported" };
  if (Notification.permission === "denied") return { status: "blocked" };
  const demo = demoEndpoint();
  if (demo && Notification.permission === "granted") return { status: "on", mode: "demo", endpoint: demo };
  const registration = await navigator.serviceWorker.getRegistration("/");
  const sub = registration && "pushManager" in registration ? await withTimeout(registration.pushManager.getSubscription(), 5_000, "timeout").catch(() => null) : null;
  return sub && Notification.permission === "granted" ? { status: "on", mode: "browser", endpoint: sub.endpoint } : { status: "off" };
}

function label(): string {
  const ua = navigator.userAgent;
  const browser = /Firefox\//.test(ua) ? "Firefox" : /Edg\//.test(ua) ? "Edge" : /Chrom(e|ium)\//.test(ua) ? "Chromium-based browser" : /Safari\//.test(ua) ? "Safari" : "Browser";
  const system = /Android/.test(ua) ? "Android" : /iPhone|iPad/.test(ua) ? "iOS" : /Mac OS X/.test(ua) ? "macOS" : /Windows/.test(ua) ? "Windows" : /Linux/.test(ua) ? "Linux" : "";
  return system ? `${browser} on ${system}` : browser;
}

function keyBytes(base64url: string): Uint8Array<ArrayBuffer> {
  const b64 = base64url.replace(/-/g, "+").replace(/_/g, "/") + "=".repeat((4 - (base64url.length % 4)) % 4);
  const raw = atob(b64);
  const out = new Uint8Array(new ArrayBuffer(raw.length));
  for (let i = 0; i < raw.length; i++) out[i] = raw.charCodeAt(i);
  return out;
}

async function register(subscription: Sub, origin: "demo" | "browser") {
  await fetchJson("/api/push/subscriptions", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ subscription, origin, label: label() }) });
}

/** Asks for permission, installs the service worker and subscribes; throws with a message a person can act on. */
export async function enableBrowserPush(): Promise<BrowserPushState> {
  if (!isSupported()) throw new Error("This browser cannot show notices from web pages.");
  const permission = await Notification.requestPermission();
  if (permission !== "granted") throw new Error("Notifications are blocked for this console. Allow them in the browser's site settings, then try again.");
  const registration = await navigator.serviceWorker.register("/sw.js", { scope: "/" });
  await withTimeout(navigator.serviceWorker.ready, 10_000, "The service worker did not start. Reload the page and try again.");
  const config = await fetchJson<Config>("/api/push/config");
  if (config.hasDemoService) {
    const { subscription } = await fetchJson<{ subscription: Sub }>("/api/push/demo", { method: "POST" });
    await register(subscription, "demo");
    window.localStorage.setItem(DEMO_ENDPOINT_KEY, subscription.endpoint);
    return { status: "on", mode: "demo", endpoint: subscription.endpoint };
  }
  const sub = await withTimeout(
    registration.pushManager.subscribe({ userVisibleOnly: true, applicationServerKey: keyBytes(config.publicKey) }),
    SUBSCRIBE_TIMEOUT_MS,
    "The browser's push service did not answer. Check the connection and try again.",
  );
  await register(sub.toJSON() as Sub, "browser");
  return { status: "on", mode: "browser", endpoint: sub.endpoint };
}

export async function disableBrowserPush(state: BrowserPushState): Promise<BrowserPushState> {
  if (state.status !== "on") return state;
  await fetchJson("/api/push/subscriptions", { method: "DELETE", headers: { "content-type": "application/json" }, body: JSON.stringify({ endpoint: state.endpoint }) }).catch(() => undefined);
  if (state.mode === "demo") window.localStorage.removeItem(DEMO_ENDPOINT_KEY);
  else {
    const registration = await navigator.serviceWorker.getRegistration("/");
    const sub = await registration?.pushManager.getSubscription();
    await sub?.unsubscribe();
  }
  return { status: "off" };
}
