import { DEMO, expect, expectCleanPage, signIn, test } from "./fixtures";

const CANVAS = "/sites/larch-lane/canvas";
const TEXT = "Back door left open after closing ({time}).";
const SENTENCE = `When Back door contact is left open for 10 min, only when the site mode is closed, notify Demo facilities manager and Demo integrator by push and in-app: “${TEXT}”`;

test("the manager wires 'back door left open after closing' to a notice, activates it, tries it on the bench; a second browser gets the conflict prompt", async ({ page, watch, browser }) => {
  test.setTimeout(120_000);
  await page.setViewportSize({ width: 1280, height: 800 });
  await signIn(page, DEMO.manager, undefined, CANVAS);
  await expect(page.getByRole("heading", { level: 1, name: "Canvas" })).toBeVisible();
  await expect(page.getByRole("link", { name: "Canvas" })).toBeVisible();
  await expect(page.getByText("Active: version 1")).toBeVisible();
  const status = page.getByRole("status").filter({ hasText: /changes|Saving|Not saved/ });
  await expect(status).toContainText("All changes saved");
  const panel = page.getByRole("tabpanel");

  // The notice first: to two chosen people.
  await page.getByRole("button", { name: /^Add action: Notice/ }).click();
  await expect(panel.getByRole("heading", { name: "Notice" })).toBeVisible();
  await panel.getByRole("radio", { name: "Chosen people" }).check();
  await panel.getByRole("checkbox", { name: /Demo integrator/ }).check();
  await expect(panel.getByRole("checkbox", { name: /Demo facilities manager/ })).toBeChecked();
  await panel.getByLabel("Notice text").fill(TEXT);
  await expect(status).toContainText("All changes saved");
  await expect(panel.getByText("This action is not connected to anything.")).toBeVisible();

  // The gate, connected to the notice: the path still has no trigger, and the engine says so.
  await page.getByRole("button", { name: /^Add gate: Site mode is/ }).click();
  await expect(panel.getByRole("heading", { name: "Site mode is" })).toBeVisible();
  await expect(panel.getByLabel(/Site modes/)).toHaveValue("closed");
  await panel.getByLabel("Connect to").selectOption("a-notice-1");
  await panel.getByRole("button", { name: "Connect", exact: true }).click();
  await expect(panel.getByText("No trigger leads to this gate, so it is never checked.")).toBeVisible();
  await page.getByRole("tab", { name: /Problems/ }).click();
  await expect(panel.getByRole("button", { name: /No trigger reaches this action, so it never runs/ })).toBeVisible();
  await expect(page.locator('.react-flow__node[data-id="a-notice-1"]')).toContainText("1 error");

  // Activate is refused while the draft has an error.
  await page.getByRole("button", { name: "Activate…" }).click();
  const activate = page.getByRole("dialog", { name: "Activate the draft" });
  await expect(activate.getByText("No trigger reaches this action, so it never runs.")).toBeVisible();
  await expect(activate.getByRole("button", { name: "Activate these changes" })).toBeDisabled();
  await activate.getByRole("button", { name: "Cancel" }).click();

  // The trigger, dragged from the list onto the Canvas; a wrong value gets the schema's message.
  await page.getByRole("button", { name: /^Add trigger: Left open/ }).dragTo(page.getByRole("region", { name: "Canvas" }), { targetPosition: { x: 120, y: 90 } });
  await page.getByRole("tab", { name: "Node" }).click();
  await expect(panel.getByRole("heading", { name: "Left open" })).toBeVisible();
  await expect(panel.getByLabel("Device")).toHaveValue("larch-lane-dev-contact-back");
  await panel.getByLabel("Time (min)").fill("0");
  await expect(panel.getByRole("alert")).toHaveText("Enter minutes as a whole number from 1 to 1440.");
  await panel.getByLabel("Time (min)").fill("10");
  await expect(panel.getByRole("alert")).toHaveCount(0);
  await panel.getByLabel("Connect to").selectOption("g-site-mode-is-1");
  await panel.getByRole("button", { name: "Connect", exact: true }).click();
  await expect(status).toContainText("All changes saved");
  await page.getByRole("tab", { name: /Problems/ }).click();
  await expect(panel.getByText("No problems found.")).toBeVisible();
  await page.getByRole("tab", { name: /Paths/ }).click();
  await expect(panel.getByRole("button", { name: SENTENCE })).toBeVisible();
  await panel.getByRole("button", { name: SENTENCE }).click();
  await page.waitForTimeout(400);
  await page.screenshot({ path: "tmp/shots/canvas-1280.png" });

  // Activate after reading the change summary.
  await page.getByRole("button", { name: "Activate…" }).click();
  await expect(activate.getByText("Rules added (1)")).toBeVisible();
  await expect(activate.getByText(SENTENCE)).toBeVisible();
  await page.screenshot({ path: "tmp/shots/canvas-activate-1280.png" });
  await activate.getByRole("button", { name: "Activate these changes" }).click();
  await expect(page.getByText("Version 2 is now active.")).toBeVisible();
  await expect(page.getByText("Active: version 2")).toBeVisible();
  await page.getByRole("tab", { name: "Versions" }).click();
  await expect(panel.getByRole("listitem").filter({ hasText: "Version 2" }).first()).toContainText(/active[\s\S]*by Demo facilities manager/);

  // Try it on the bench with the draft: after closing, the back door stays open for 10 minutes.
  await page.getByRole("button", { name: "Try on bench" }).click();
  await page.waitForURL(/\/sites\/larch-lane\/bench\?source=draft$/);
  await expect(page.getByRole("heading", { level: 1, name: "Test bench" })).toBeVisible();
  await expect(page.getByRole("radio", { name: /Draft/ })).toBeChecked();
  await page.getByLabel("Date", { exact: true }).fill("2025-01-15");
  await page.getByLabel("Time", { exact: true }).fill("18:30");
  await page.getByRole("button", { name: "Set date" }).click();
  await expect(page.getByTestId("bench-mode")).toHaveText("closed");
  await page.getByRole("listitem", { name: "Back door contact" }).getByRole("button", { name: "Open", exact: true }).click();
  await expect(page.getByRole("listitem", { name: "Back door contact" })).toContainText("now open");
  // Twice: the 10-minute timer falls due a moment after 18:40, whatever second the door opened.
  await page.getByRole("button", { name: "+10 min" }).click();
  await expect(page.getByTestId("bench-time")).toHaveText(/18:40/);
  await page.getByRole("button", { name: "+10 min" }).click();
  await expect(page.getByTestId("bench-time")).toHaveText(/18:50/);
  const ours = page.getByRole("region", { name: "Notices" }).getByRole("listitem").filter({ hasText: /Back door left open after closing \(18:4\d\)\./ });
  await expect(ours.first()).toContainText("would send");
  await ours.first().scrollIntoViewIfNeeded();
  await page.screenshot({ path: "tmp/shots/canvas-bench-1280.png" });

  // Two people on the same draft: the second save gets the conflict prompt, and nothing is lost.
  await page.goto(CANVAS);
  await expect(status).toContainText("All changes saved");
  const other = await browser.newContext({ viewport: { width: 1280, height: 800 }, baseURL: `http://localhost:${process.env.E2E_PORT ?? 3100}` });
  const page2 = await other.newPage();
  await signIn(page2, DEMO.integrator, undefined, CANVAS);
  await expect(page2.getByRole("heading", { level: 1, name: "Canvas" })).toBeVisible();
  await expect(page2.getByText("All changes saved")).toBeVisible();

  await page.getByRole("button", { name: /^Add action: Relay on \(/ }).click();
  await expect(status).toContainText("All changes saved");
  await page2.getByRole("button", { name: /^Add action: Clear emergency/ }).click();
  const conflict = page2.getByRole("dialog", { name: "Someone else changed this draft" });
  await expect(conflict).toBeVisible();
  await page2.screenshot({ path: "tmp/shots/canvas-conflict-1280.png" });
  await conflict.getByRole("button", { name: "Keep mine as a copy" }).click();
  await expect(conflict).toBeHidden();
  await expect(page2.getByText("All changes saved")).toBeVisible();
  const draft = (await (await page2.request.get("/api/sites/larch-lane/rules")).json()) as { draft: { graph: { nodes: { id: string }[] } } };
  const ids = draft.draft.graph.nodes.map((n) => n.id);
  expect(ids).toEqual(expect.arrayContaining(["a-relay-on-1", "a-clear-emergency-1", "t-contact-left-open-1"]));
  await other.close();

  // The first browser now holds a stale revision too: its next change meets the prompt, and "Reload" shows both.
  await page.keyboard.press("Escape");
  await page.getByRole("button", { name: /^Add gate: No emergency/ }).click();
  await expect(page.getByRole("dialog", { name: "Someone else changed this draft" })).toBeVisible();
  await page.getByRole("button", { name: "Reload their draft" }).click();
  await expect(status).toContainText("All changes saved");
  await expect(page.locator('.react-flow__node[data-id="a-clear-emergency-1"]')).toHaveCount(1);
  await expectCleanPage(page, watch, [/409/]);
});

test("keyboard editing: undo, redo, copy/paste, delete and the keys panel", async ({ page, watch }) => {
  await page.setViewportSize({ width: 1280, height: 800 });
  await signIn(page, DEMO.integrator, undefined, CANVAS);
  await expect(page.getByRole("status").filter({ hasText: "All changes saved" })).toBeVisible();
  const nodes = page.locator(".react-flow__node");
  const before = await nodes.count();
  await page.getByRole("button", { name: /^Add trigger: Motion/ }).click();
  await expect(nodes).toHaveCount(before + 1);
  await page.locator("body").press("Control+c");
  await page.locator("body").press("Control+v");
  await expect(nodes).toHaveCount(before + 2);
  await page.locator("body").press("Delete");
  await expect(nodes).toHaveCount(before + 1);
  await page.locator("body").press("Control+z");
  await expect(nodes).toHaveCount(before + 2);
  await page.locator("body").press("Control+Shift+z");
  await expect(nodes).toHaveCount(before + 1);
  await page.getByRole("button", { name: "Undo" }).click();
  await page.getByRole("button", { name: "Undo" }).click();
  await page.getByRole("button", { name: "Undo" }).click();
  await expect(nodes).toHaveCount(before);
  await page.locator("body").press("?");
  const help = page.getByRole("dialog", { name: "Canvas keys" });
  await expect(help.getByRole("cell", { name: "Tidy up: auto-layout" })).toBeVisible();
  await help.getByRole("button", { name: "Close" }).click();
  await page.locator("body").press("l");
  await expect(page.getByRole("status").filter({ hasText: "All changes saved" })).toBeVisible();
  await page.screenshot({ path: "tmp/shots/canvas-layout-1280.png" });
  await expectCleanPage(page, watch);
});

test("on a phone the Canvas is read-only and the sentence list works", async ({ page, watch }) => {
  await page.setViewportSize({ width: 390, height: 844 });
  await signIn(page, DEMO.manager, undefined, CANVAS);
  await expect(page.getByText("The Canvas is read-only on a narrow screen.")).toBeVisible();
  const panel = page.getByRole("tabpanel");
  const first = panel.getByRole("button", { name: /^When / }).first();
  await expect(first).toBeVisible();
  await page.screenshot({ path: "tmp/shots/canvas-phone.png" });
  await first.click();
  await expect(page.locator(".react-flow__node.selected").first()).toBeVisible();
  await expect(page.getByRole("button", { name: /^Add trigger/ })).toHaveCount(0);
  await page.screenshot({ path: "tmp/shots/canvas-phone-full.png", fullPage: true });
  await expectCleanPage(page, watch);
});

test("occupants never see the Canvas", async ({ page }) => {
  await signIn(page, DEMO.occupant);
  await page.goto(CANVAS);
  await expect(page).toHaveURL(/\/sites\/larch-lane\?denied=1$/);
  await expect(page.getByRole("link", { name: "Canvas" })).toHaveCount(0);
  const res = await page.request.get("/api/sites/larch-lane/rules");
  expect(res.status()).toBe(403);
});
