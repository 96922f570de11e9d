import { test as base, expect, type Page } from "@playwright/test";

type Watch = { offsite: string[]; consoleErrors: string[] };

/**
 * Every test page records requests that leave this machine and console errors,
 * and aborts the former so nothing ever reaches the network.
 */
export const test = base.extend<{ watch: Watch }>({
  watch: async ({ page }, provide) => {
    const watch: Watch = { offsite: [], consoleErrors: [] };
    await page.route("**/*", (route) => {
      const host = new URL(route.request().url()).hostname;
      if (host === "localhost" || host === "127.0.0.1" || host === "[::1]") return route.continue();
      watch.offsite.push(route.request().url());
      return route.abort();
    });
    page.on("console", (m) => {
      if (m.type() === "error") watch.consoleErrors.push(m.text());
    });
    page.on("pageerror", (e) => watch.consoleErrors.push(e.message));
    await provide(watch);
  },
});

/** `expected`: console errors the test provoked on purpose (e.g. the 401 of a wrong password). */
export async function expectCleanPage(page: Page, watch: Watch, expected: RegExp[] = []) {
  await page.waitForLoadState("networkidle");
  expect(watch.offsite, "requests that left localhost").toEqual([]);
  expect(
    watch.consoleErrors.filter((e) => !expected.some((re) => re.test(e))),
    "console errors",
  ).toEqual([]);
}

export { expect };

export const DEMO_PASSWORD = "larch-lane-demo";
export const DEMO = {
  integrator: "integrator@larch-lane.invalid",
  manager: "manager@larch-lane.invalid",
  occupant: "occupant@larch-lane.invalid",
} as const;

/** The e2e server's local mail sink API (see scripts/e2e-server.ts). */
export const MAIL_SINK_API = "http://127.0.0.1:2626";

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD, next?: string) {
  await page.goto(next ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill(password);
  await page.getByRole("button", { name: "Sign in" }).click();
  await page.waitForURL((url) => !url.pathname.startsWith("/sign-in"));
}

/** Waits for a mail to `to` in the local sink and returns the first link in it. */
export async function linkFromMail(to: string, pathPart: string): Promise<string> {
  for (let i = 0; i < 50; i++) {
    const res = await fetch(`${MAIL_SINK_API}/messages?to=${encodeURIComponent(to)}`);
    const { messages } = (await res.json()) as { messages: { text: string }[] };
    const match = messages.map((m) => new RegExp(`https?://\\S*${pathPart}\\?token=[A-Za-z0-9_-]+`).exec(m.text)?.[0]).find(Boolean);
    if (match) return match;
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`No mail with a ${pathPart} link reached ${to}`);
}
