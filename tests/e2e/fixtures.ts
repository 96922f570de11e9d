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

export async function expectCleanPage(page: Page, watch: Watch) {
  await page.waitForLoadState("networkidle");
  expect(watch.offsite, "requests that left localhost").toEqual([]);
  expect(watch.consoleErrors, "console errors").toEqual([]);
}

export { expect };
