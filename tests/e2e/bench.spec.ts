import { DEMO, expect, expectCleanPage, signIn, test } from "./fixtures";

const dev = (key: string) => `larch-lane-dev-${key}`;
// The level cell reads "<n> %": match the whole number, so "0 %" does not match "100 %".
const level = (n: number) => new RegExp(`(^|\\D)${n} %`);

test("the manager walks a visitor up the path after closing, lets 10 minutes pass, and trips the fire input", async ({ page, watch }) => {
  await page.setViewportSize({ width: 1280, height: 800 });
  await signIn(page, DEMO.manager, undefined, "/sites/larch-lane/bench");
  await expect(page.getByRole("heading", { level: 1, name: "Test bench" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Test bench" })).toHaveAttribute("aria-current", "page");

  // After closing: a Wednesday in January, 18:30 (the demo rules close the shop at 17:30).
  await page.getByLabel("Date", { exact: true }).fill("2025-01-15");
  await page.getByLabel("Time", { exact: true }).fill("18:30");
  await page.getByRole("button", { name: "Set date" }).click();
  await expect(page.getByTestId("bench-time")).toHaveText(/Wed.*15 Jan 2025.*18:30/);
  await expect(page.getByTestId("bench-mode")).toHaveText("closed");

  // Dark on the path, then a visitor walks up it.
  const sensor = page.getByRole("listitem", { name: "Front path motion sensor" });
  await sensor.getByLabel(/Light level \(lx\)/).fill("4");
  await sensor.getByRole("button", { name: "Send lx" }).click();
  await expect(sensor.getByText("now 4 lx")).toBeVisible();
  await sensor.getByRole("button", { name: "Walk past" }).click();

  for (const key of ["light-path-1", "light-path-2"]) {
    const row = page.getByTestId(`level-${dev(key)}`);
    await expect(row).toContainText(level(100));
    await expect(row).toContainText("Sensor");
  }
  const notices = page.getByRole("region", { name: "Notices" });
  await expect(notices.getByRole("listitem").first()).toContainText("would send");
  await expect(notices.getByRole("listitem").first()).toContainText("Someone is on the front path (18:30).");
  const feed = page.getByRole("region", { name: "What happened, and why" });
  await expect(feed.getByText("t-path-motion>g-path-after-hours>g-path-dark").first()).toBeVisible();
  await expect(feed.getByText(/light-level-below \(g-path-dark\): passed — saw lux of Front path motion sensor = 4 lx/).first()).toBeVisible();
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.screenshot({ path: "tmp/shots/bench-visitor-1280.png" });
  await page.screenshot({ path: "tmp/shots/bench-visitor-1280-full.png", fullPage: true });

  // Ten minutes later the 3-minute vacancy rule has faded them out (a 10 s fade, replayed on screen).
  await page.getByRole("button", { name: "+10 min" }).click();
  await expect(page.getByTestId("bench-time")).toHaveText(/18:40/);
  for (const key of ["light-path-1", "light-path-2"]) await expect(page.getByTestId(`level-${dev(key)}`)).toContainText(level(0), { timeout: 15_000 });
  await expect(feed.getByText(/Front path to 0 %/).first()).toBeVisible();

  // Fire input: the latch holds through rocker presses until someone clears it.
  await page.getByRole("listitem", { name: "Fire-alarm input module" }).getByRole("button", { name: "Trip the fire input" }).click();
  const latch = page.getByRole("alert").filter({ hasText: "Emergency latched" });
  await expect(latch).toBeVisible();
  await expect(latch).toContainText("does not replace certified emergency lighting");
  await expect(page.getByTestId(`level-${dev("dl-escape-1")}`)).toContainText(level(100));
  const rocker = page.getByRole("listitem", { name: "Shop door rocker" });
  await rocker.getByRole("button", { name: "Press", exact: true }).click();
  await expect(feed.getByText(/held by Emergency/).first()).toBeVisible();
  await page.getByRole("listitem", { name: "Flat rocker" }).getByRole("button", { name: "Press", exact: true }).click();
  await expect(latch).toBeVisible();
  const shopLight = page.getByTestId(`level-${dev("dl-shop-1")}`);
  await expect(shopLight).toContainText(level(0));
  await expect(shopLight).toContainText("Emergency");
  await page.getByRole("listitem", { name: "Fire-alarm input module" }).getByRole("button", { name: "Clear the input" }).click();
  await expect(latch).toBeVisible();

  page.once("dialog", (d) => void d.accept());
  await page.getByRole("button", { name: "Clear emergency (bench)" }).click();
  await expect(latch).toHaveCount(0);
  await expect(page.getByTestId("bench-mode")).toHaveText("closed");
  // The rocker's Manual claim waited under the Emergency one and takes over (the demo scene "Shop open": 80 %).
  await expect(shopLight).toContainText(level(80));
  await expect(shopLight).toContainText("Manual");
  await expectCleanPage(page, watch);
});

test("on a phone the bench stacks; an out-of-range reading is refused at the control", async ({ page, watch }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, DEMO.manager, undefined, "/sites/larch-lane/bench?source=draft");
  await expect(page.getByRole("radio", { name: /Draft/ })).toBeChecked();
  const climate = page.getByRole("listitem", { name: "Workshop climate sensor" });
  await climate.getByLabel(/Temperature \(°C\)/).fill("120");
  await expect(climate.getByRole("alert")).toContainText("120 °C is outside what the sensor reports (-40–85 °C).");
  await expect(climate.getByRole("button", { name: "Send °C" })).toBeDisabled();
  await page.screenshot({ path: "tmp/shots/bench-phone-top.png" });
  // Nothing on the bench is wider than the phone: long rule ids and names wrap, plan labels stay inside the plan.
  const fits = () => page.getByTestId("bench").evaluate((e) => e.scrollWidth <= e.clientWidth);
  expect(await fits()).toBe(true);
  await page.getByRole("region", { name: "Scenarios" }).getByRole("listitem", { name: "Scenario fire drill" }).getByRole("button", { name: "Play" }).click();
  await expect(page.getByText('Played "fire drill": played all 5 steps.')).toBeVisible();
  expect(await fits()).toBe(true);
  await page.getByRole("region", { name: "What happened, and why" }).screenshot({ path: "tmp/shots/bench-phone-feed.png" });
  await page.getByRole("region", { name: "Zones and levels" }).screenshot({ path: "tmp/shots/bench-phone-zones.png" });
  await page.screenshot({ path: "tmp/shots/bench-phone-full.png", fullPage: true });
  await expectCleanPage(page, watch);
});

test("an occupant cannot open the bench", async ({ page }) => {
  await signIn(page, DEMO.occupant);
  await page.goto("/sites/larch-lane/bench");
  await expect(page).toHaveURL(/\/sites\/larch-lane\?denied=1$/);
  await expect(page.getByRole("link", { name: "Test bench" })).toHaveCount(0);
});
