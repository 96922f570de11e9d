import { toNdjsonLine } from "@/lib/eventlog/format";
import { demoNightLog } from "@/lib/replay/demo-night";
import { DEMO, expect, expectCleanPage, signIn, test } from "./fixtures";

const SITE = "/sites/larch-lane";
const PATH_RULE = "t-path-motion>g-path-after-hours>g-path-dark";
/** The night's log with one broken line (a device the site does not have) on line 17. */
const FILE = demoNightLog().map(toNdjsonLine).join("") + JSON.stringify({ id: "stray", at: Date.UTC(2024, 10, 13, 4), device: "larch-lane-dev-garden-gnome", kind: "motion", value: true }) + "\n";

async function runReplay(page: import("@playwright/test").Page, compareWith: RegExp | null) {
  await page.goto(`${SITE}/replay`);
  await page.getByLabel(/^From/).fill("2024-11-12T15:00");
  await page.getByLabel(/^Until/).fill("2024-11-13T08:00");
  if (compareWith) {
    const b = page.getByLabel(/^Compare with/);
    const label = (await b.locator("option").allTextContents()).find((t) => compareWith.test(t))!;
    await b.selectOption({ label });
  }
  await page.getByRole("button", { name: compareWith ? "Run Compare" : "Run replay" }).click();
  await expect(page.getByRole("status").filter({ hasText: /Done: 16 events replayed/ })).toBeVisible({ timeout: 30_000 });
}

test("the integrator imports a night with a false trigger, finds the rule that lit the front path, fixes the draft on the Canvas and Compare shows only that event", async ({ page, watch }) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 1280, height: 800 });
  await signIn(page, DEMO.integrator, undefined, `${SITE}/events`);
  await expect(page.getByRole("heading", { level: 1, name: "Event log" })).toBeVisible();

  // Import: the check names the broken line; nothing is written until the valid lines are chosen.
  await page.getByLabel(/^Log file/).setInputFiles({ name: "larch-lane-night.ndjson", mimeType: "application/x-ndjson", buffer: Buffer.from(FILE) });
  await expect(page.getByText("16 valid events in 17 lines; 1 line with problems.")).toBeVisible();
  await expect(page.getByRole("cell", { name: /no device "larch-lane-dev-garden-gnome"/ })).toBeVisible();
  const importButton = page.getByRole("button", { name: "Import 16 events" });
  await expect(importButton).toBeDisabled();
  await page.getByLabel(/Import the valid lines/).check();
  await importButton.click();
  await expect(page.getByText("16 events imported.")).toBeVisible();

  // The log, filtered to motion: the 03:12 event is history, not run live.
  await page.getByLabel("Kind").selectOption("motion");
  await expect(page.getByRole("row")).toHaveCount(3);
  await page.getByRole("button", { name: /Trace of motion from Front path motion sensor at 13 Nov 2024 03:12:00/ }).click();
  await expect(page.getByText(/it was imported as history/)).toBeVisible();
  await page.screenshot({ path: "tmp/shots/events-1280.png", fullPage: true });
  await page.setViewportSize({ width: 390, height: 844 });
  await page.screenshot({ path: "tmp/shots/events-390.png", fullPage: true });
  await page.setViewportSize({ width: 1280, height: 800 });

  // Replay against the active rules: the Trace names the rule that lit the path at 03:12.
  await runReplay(page, null);
  await page.getByRole("button", { name: "Trace: motion from Front path motion sensor at 13 Nov 2024 03:12:00" }).click();
  const trace = page.getByRole("list", { name: /motion from Front path motion sensor, 13 Nov 2024 03:12:00/ });
  await expect(trace.getByText(PATH_RULE)).toBeVisible();
  await expect(trace.getByText(/a-path-on.*Front path to 100 %/)).toBeVisible();
  await page.screenshot({ path: "tmp/shots/replay-1280.png", fullPage: true });

  // Fix the draft on the Canvas: the path lights only between sunset and 23:00 (the notice still goes).
  await page.goto(`${SITE}/canvas`);
  await expect(page.getByRole("heading", { level: 1, name: "Canvas" })).toBeVisible();
  const status = page.getByRole("status").filter({ hasText: /changes|Saving|Not saved/ });
  await expect(status).toContainText("All changes saved");
  const panel = page.getByRole("tabpanel");
  await page.locator('.react-flow__node[data-id="g-path-dark"]').click();
  await page.getByRole("tab", { name: "Node" }).click();
  await panel.getByRole("button", { name: /Remove connection: .*Front path/ }).click();
  await page.getByRole("button", { name: /^Add gate: Between times/ }).click();
  const gateId = await page.locator(".react-flow__node.selected").getAttribute("data-id");
  await panel.getByLabel("Until: time").fill("23:00");
  await panel.getByLabel("Connect to").selectOption("a-path-on");
  await panel.getByRole("button", { name: "Connect", exact: true }).click();
  await page.locator('.react-flow__node[data-id="g-path-dark"]').click();
  await page.getByRole("tab", { name: "Node" }).click();
  await panel.getByLabel("Connect to").selectOption(gateId!);
  await panel.getByRole("button", { name: "Connect", exact: true }).click();
  await expect(status).toContainText("All changes saved");

  // Compare the active rules with the fixed draft: one event decides differently, the rest follows from it.
  await runReplay(page, /^Draft/);
  const compare = page.getByRole("region", { name: /^Compare:/ });
  await expect(compare.getByText(/^1 step decided differently/)).toBeVisible();
  const differences = compare.getByRole("list", { name: "Differences" }).locator(":scope > li");
  await expect(differences).toHaveCount(1);
  await expect(differences.first()).toContainText("13 Nov 2024 03:12:00 · motion from Front path motion sensor");
  await expect(differences.first()).toContainText(/only with Active.*Path light 1 0 → 100 %/);
  await differences.first().getByRole("button", { name: /^Trace with Draft/ }).first().click();
  await expect(page.getByText(new RegExp(`Gate ${gateId} \\(time-window\\): failed`))).toBeVisible();
  await page.screenshot({ path: "tmp/shots/compare-1280.png", fullPage: true });
  await page.setViewportSize({ width: 390, height: 844 });
  await page.screenshot({ path: "tmp/shots/compare-390.png", fullPage: true });
  await expectCleanPage(page, watch);
});

test("occupants have no Event log or Replay", async ({ page }) => {
  await signIn(page, DEMO.occupant, undefined, SITE);
  await expect(page.getByRole("link", { name: "Replay" })).toHaveCount(0);
  await page.goto(`${SITE}/replay`);
  await expect(page).toHaveURL(/\/sites\/larch-lane\?denied=1$/);
});
