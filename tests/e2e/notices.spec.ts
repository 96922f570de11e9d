import type { Page } from "@playwright/test";
import { DEMO, expect, expectCleanPage, signIn, test } from "./fixtures";

/** The e2e server's local push service (scripts/e2e-server.ts). */
const PUSH_SERVICE = "http://127.0.0.1:2630";
const SITE = "larch-lane";

test.use({ permissions: ["notifications"] });

/** What this browser's service worker is showing right now. */
function shownNotices(page: Page) {
  return page.evaluate(async () => {
    const registration = await navigator.serviceWorker.ready;
    const list = await registration.getNotifications();
    return list.map((n) => ({ title: n.title, body: n.body, url: (n.data as { url?: string } | null)?.url ?? null }));
  });
}

type Pushed = { isDelivered: boolean; vapid: { aud: string }; payload: { body?: string } };
/** What the e2e push service received with this body. */
async function pushed(body: string): Promise<Pushed[]> {
  const { messages } = (await (await fetch(`${PUSH_SERVICE}/messages`)).json()) as { messages: Pushed[] };
  return messages.filter((m) => m.payload.body === body);
}

/** "HH:MM" on the demo site's wall clock (WET) at `ms`. */
const siteClock = (ms: number) => new Intl.DateTimeFormat("en-GB", { timeZone: "WET", hour: "2-digit", minute: "2-digit", hourCycle: "h23" }).format(ms);

test("the occupant turns on notices; a visitor on the path after closing shows on their browser and in the inbox; quiet hours hold back the push only", async ({ page, watch, browser, baseURL }) => {
  await page.setViewportSize({ width: 1280, height: 800 });
  await signIn(page, DEMO.occupant, undefined, "/account");
  await expect(page).toHaveURL(/\/account$/);

  // The occupant turns notices on in this browser (demo push: the local push service hands out the subscription).
  const notices = page.getByRole("region", { name: "Notices" });
  await expect(notices.getByText("This browser does not get push notices.")).toBeVisible();
  await notices.getByRole("button", { name: "Turn on push notices here" }).click();
  await expect(notices.getByRole("status").filter({ hasText: "Push notices are on for this browser." })).toBeVisible();
  await expect(notices.getByText(/through the local demo push service/)).toBeVisible();
  await expect(notices.getByRole("listitem").filter({ hasText: "local demo push service" })).toHaveCount(1);
  await page.screenshot({ path: "tmp/shots/notices-account-1280.png", fullPage: true });

  // The manager, in another browser, walks a visitor up the path after closing on the Test bench, delivering for real.
  const managerContext = await browser.newContext({ baseURL });
  const manager = await managerContext.newPage();
  await manager.setViewportSize({ width: 1280, height: 800 });
  await signIn(manager, DEMO.manager, undefined, `/sites/${SITE}/bench`);
  await manager.getByLabel("Date", { exact: true }).fill("2025-01-15");
  await manager.getByLabel("Time", { exact: true }).fill("18:30");
  await manager.getByRole("button", { name: "Set date" }).click();
  await expect(manager.getByTestId("bench-mode")).toHaveText("closed");
  await manager.getByLabel("Deliver notices for real (marked as a test)").check();
  const sensor = manager.getByRole("listitem", { name: "Front path motion sensor" });
  await sensor.getByRole("button", { name: "Walk past" }).click();
  await expect(manager.getByRole("region", { name: "Notices" }).getByRole("listitem").first()).toContainText("Someone is on the front path (18:30).");

  // The occupant's browser shows it through its service worker, opening the site overview (the bench is not theirs to open).
  const text = "[Test bench] Someone is on the front path (18:30).";
  // The local push service got it once (VAPID audience = its own origin, RFC 8292 §2) and handed it to this browser …
  await expect.poll(async () => (await pushed(text)).map((m) => [m.vapid.aud, m.isDelivered]), { timeout: 20_000 }).toEqual([[PUSH_SERVICE, true]]);
  // … whose service worker shows it.
  await expect.poll(() => shownNotices(page), { timeout: 20_000 }).toContainEqual({ title: "Visitor · Larch Lane Studio", body: text, url: `/sites/${SITE}` });

  // … and the inbox, with the unread count in the header.
  const badge = page.getByRole("link", { name: /^Inbox, \d+ unread$/ });
  await expect(badge).toBeVisible({ timeout: 20_000 });
  await badge.click();
  await expect(page.getByRole("heading", { level: 1, name: "Inbox" })).toBeVisible();
  const list = page.getByRole("list", { name: "Notices" });
  const item = list.getByRole("listitem").filter({ hasText: text });
  await expect(item).toHaveCount(1);
  await expect(item).toContainText("Visitor");
  await expect(item.getByRole("link", { name: "Open" })).toHaveAttribute("href", `/sites/${SITE}`);
  await page.screenshot({ path: "tmp/shots/notices-inbox-1280.png" });
  await page.setViewportSize({ width: 390, height: 844 });
  await page.screenshot({ path: "tmp/shots/notices-inbox-390.png", fullPage: true });

  // Quiet hours from an hour ago to an hour from now (site time): the next notice reaches the inbox but not the screen.
  await page.setViewportSize({ width: 1280, height: 800 });
  await page.goto("/account#notices");
  const form = page.getByRole("form", { name: "Notices from Larch Lane Studio" });
  await form.getByLabel("From").fill(siteClock(Date.now() - 3600_000));
  await form.getByLabel("Until").fill(siteClock(Date.now() + 3600_000));
  await form.getByRole("button", { name: "Save for Larch Lane Studio" }).click();
  await expect(form.getByRole("status")).toHaveText("Saved.");
  await page.setViewportSize({ width: 390, height: 844 });
  await page.screenshot({ path: "tmp/shots/notices-account-390.png", fullPage: true });
  await page.setViewportSize({ width: 1280, height: 800 });

  await manager.getByRole("button", { name: "+10 min" }).click();
  await expect(manager.getByTestId("bench-time")).toHaveText(/18:40/);
  await sensor.getByRole("button", { name: "Walk past" }).click();
  await page.goto("/inbox");
  const quiet = "[Test bench] Someone is on the front path (18:40).";
  await expect(page.getByRole("list", { name: "Notices" }).getByRole("listitem").filter({ hasText: quiet })).toHaveCount(1, { timeout: 20_000 });
  // Long enough for the worker (every 0.5 s) and the relay (every 2 s) to have passed on a push, had there been one.
  await page.waitForTimeout(4_000);
  expect((await shownNotices(page)).map((n) => n.body)).toContain(text);
  expect((await shownNotices(page)).map((n) => n.body)).not.toContain(quiet);
  expect(await pushed(quiet)).toEqual([]);

  // Marking read empties the badge.
  await page.getByRole("button", { name: "Mark all read" }).click();
  await expect(page.getByRole("link", { name: "Inbox", exact: true })).toBeVisible();
  await expect(page.getByRole("list", { name: "Notices" }).getByText("Unread:")).toHaveCount(0);

  // The developer page lists what the push service received.
  await page.goto("/dev/push");
  await expect(page.getByRole("table")).toContainText(text);
  await page.screenshot({ path: "tmp/shots/notices-dev-push-1280.png" });

  await managerContext.close();
  await expectCleanPage(page, watch);
});

test("turning notices off removes this browser's subscription", async ({ page, watch }) => {
  await signIn(page, DEMO.integrator, undefined, "/account");
  const notices = page.getByRole("region", { name: "Notices" });
  await notices.getByRole("button", { name: "Turn on push notices here" }).click();
  await expect(notices.getByRole("listitem").filter({ hasText: "local demo push service" })).toHaveCount(1);
  await notices.getByRole("button", { name: "Turn off push notices here" }).click();
  await expect(notices.getByText("This browser does not get push notices.")).toBeVisible();
  await expect(notices.getByRole("listitem").filter({ hasText: "local demo push service" })).toHaveCount(0);
  await expectCleanPage(page, watch);
});
