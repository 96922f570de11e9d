/*
 * Joulepath service worker: shows notices and opens the right console page
 * when one is clicked. Push messages arrive as `push` events from the
 * browser's push service; in demo mode the console page relays what the local
 * push service received as a "demo-push" message. Both go through showNotice.
 */
const ICON = "/icons/icon-192.png";

self.addEventListener("install", () => self.skipWaiting());
self.addEventListener("activate", (event) => event.waitUntil(self.clients.claim()));

/** Only paths on this console: a push message can never send someone elsewhere. */
function safePath(url) {
  return typeof url === "string" && url.startsWith("/") && !url.startsWith("//") ? url : "/inbox";
}

function showNotice(payload) {
  const p = payload && typeof payload === "object" ? payload : { body: String(payload ?? "") };
  const title = typeof p.title === "string" && p.title ? p.title : "Joulepath notice";
  return self.registration.showNotification(title, {
    body: typeof p.body === "string" ? p.body : "",
    tag: typeof p.tag === "string" ? p.tag : undefined,
    timestamp: typeof p.at === "number" ? p.at : Date.now(),
    icon: ICON,
    badge: ICON,
    data: { url: safePath(p.url) },
  });
}

self.addEventListener("push", (event) => {
  let payload;
  try {
    payload = event.data ? event.data.json() : {};
  } catch {
    payload = { body: event.data ? event.data.text() : "" };
  }
  event.waitUntil(showNotice(payload));
});

self.addEventListener("message", (event) => {
  // Only pages of this origin can post here; still, accept nothing but the relay's shape.
  if (event.origin && event.origin !== self.location.origin) return;
  const data = event.data;
  if (!data || data.type !== "demo-push" || !Array.isArray(data.messages)) return;
  event.waitUntil(Promise.all(data.messages.map(showNotice)));
});

self.addEventListener("notificationclick", (event) => {
  event.notification.close();
  const target = new URL(safePath(event.notification.data && event.notification.data.url), self.location.origin).href;
  event.waitUntil(
    self.clients.matchAll({ type: "window", includeUncontrolled: true }).then((windows) => {
      const same = windows.find((w) => w.url === target);
      if (same) return same.focus();
      const any = windows.find((w) => "navigate" in w);
      if (any) return any.navigate(target).then((w) => (w ? w.focus() : self.clients.openWindow(target)));
      return self.clients.openWindow(target);
    }),
  );
});

// The push service replaced the subscription: register the new one with the console.
self.addEventListener("pushsubscriptionchange", (event) => {
  const options = event.oldSubscription ? event.oldSubscription.options : null;
  if (!options) return;
  event.waitUntil(
    self.registration.pushManager.subscribe(options).then((subscription) =>
      fetch("/api/push/subscriptions", {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ subscription: subscription.toJSON(), origin: "browser", label: "Renewed by the browser" }),
      }),
    ),
  );
});
