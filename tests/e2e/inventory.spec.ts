import { readFileSync } from "node:fs";
import { DEMO, expect, expectCleanPage, signIn, test } from "./fixtures";

const header = "name,kind,zone,unicast_address,elements,buttons,floor,x_m,y_m";

test("integrator imports devices from CSV, uploads and scales a plan, places devices, builds a scene and previews it", async ({ page, watch }) => {
  test.setTimeout(120_000); // one long flow through four pages
  await signIn(page, DEMO.integrator);
  await page.getByRole("link", { name: "New site" }).click();
  await page.getByLabel("Site name").fill("Bramblecote Bakery");
  await page.getByLabel("Time zone").fill("CET");
  await page.getByRole("button", { name: "Create site" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Bramblecote Bakery" })).toBeVisible();
  const siteId = new URL(page.url()).pathname.split("/")[2];

  // A zone, then a CSV with one bad row: the row's error is shown and nothing is written.
  await page.getByRole("link", { name: "Devices" }).click();
  await page.getByLabel("New zone").fill("Counter");
  await page.getByRole("button", { name: "Add zone" }).click();
  await expect(page.getByText("0xC000")).toBeVisible();
  const bad = [header, "Counter downlight 1,mesh-luminaire,Counter,,1,,,,", "Counter dimmer,toaster,Counter,,1,,,,"].join("\n");
  await page.getByLabel("CSV file").setInputFiles({ name: "devices.csv", mimeType: "text/csv", buffer: Buffer.from(bad) });
  const problems = page.getByRole("table", { name: "Problems in the file" });
  await expect(problems).toBeVisible();
  await expect(problems.getByRole("row").nth(1)).toContainText("3");
  await expect(problems.getByRole("row").nth(1)).toContainText("kind");
  await expect(page.getByText("0 of 0 devices")).toBeVisible();

  const good = [header, "Counter downlight 1,mesh-luminaire,Counter,,1,,,,", "Counter downlight 2,mesh-luminaire,Counter,0x0010,1,,,,", "Door rocker,kinetic-rocker,Counter,,2,4,,,"].join("\n");
  await page.getByLabel("CSV file").setInputFiles({ name: "devices.csv", mimeType: "text/csv", buffer: Buffer.from(good) });
  await expect(page.getByText("3 devices ready, no problems found.")).toBeVisible();
  await page.getByRole("button", { name: "Import 3 devices" }).click();
  await expect(page.getByText("3 devices imported.")).toBeVisible();
  await expect(page.getByText("3 of 3 devices")).toBeVisible();
  await expect(page.getByRole("cell", { name: "0x0010" })).toBeVisible();

  // A floor with its plan; then the scale from two points 500 px apart (10 m at 50 px/m).
  await page.getByRole("link", { name: "Plan" }).click();
  await page.getByLabel("Floor name").fill("Ground");
  await page.getByLabel("Plan image", { exact: true }).setInputFiles("db/seed/plans/ground-floor.png");
  await page.getByRole("button", { name: "Add floor" }).click();
  await expect(page.getByText("Set the scale before placing devices")).toBeVisible();
  await page.getByRole("button", { name: "Set scale" }).click();
  const plan = page.getByRole("img", { name: "Floor plan: Ground" });
  const box = (await plan.boundingBox())!;
  const k = box.width / 1100;
  await page.mouse.click(box.x + 100 * k, box.y + 300 * k);
  await page.mouse.click(box.x + 600 * k, box.y + 300 * k);
  await page.getByLabel("Distance (m)").fill("10");
  await page.getByRole("button", { name: "Save scale" }).click();
  await expect(page.getByText("Scale saved.")).toBeVisible();
  await expect(page.getByText(/Scale (49\.\d|50\.\d) px\/m/)).toBeVisible();

  // Place a device: select it, click the plan at 4 m, 6 m (the plan moved up when the scale tool closed).
  await page.getByRole("button", { name: "Counter downlight 1" }).click();
  const placed = (await plan.boundingBox())!;
  await page.mouse.click(placed.x + 200 * k, placed.y + 300 * k);
  await expect(page.getByText(/Counter downlight 1 placed at 4\.\d\d m, 6\.\d\d m/)).toBeVisible();
  const marker = page.getByRole("button", { name: /Counter downlight 1, at/ });
  await expect(marker).toBeVisible();
  await marker.focus();
  await page.keyboard.press("Shift+ArrowRight");
  await expect(page.getByText(/Counter downlight 1 placed at 5\.\d\d m/)).toBeVisible();

  // A scene with a zone level, shown with its transition-time octet, then previewed on the plan.
  await page.getByRole("link", { name: "Scenes" }).click();
  await page.getByRole("button", { name: "New scene" }).click();
  await page.getByLabel("Name").fill("Morning bake");
  await page.getByLabel("Fade (s)").fill("10");
  await expect(page.getByText(/Sent as transition time 0x4A/)).toBeVisible();
  await page.getByRole("checkbox", { name: "Whole zone (2)" }).check();
  await page.getByRole("slider", { name: "Level of Whole zone (2), percent" }).fill("60");
  await expect(page.getByLabel("Scene preview").getByText("60 %").first()).toBeVisible();
  await page.getByRole("button", { name: "Create scene" }).click();
  await expect(page.getByRole("cell", { name: "Morning bake", exact: true })).toBeVisible();
  await expect(page.getByRole("cell", { name: "10 s (0x4A)" })).toBeVisible();

  await page.getByRole("link", { name: "Plan" }).click();
  await page.getByLabel("Preview a scene").selectOption({ label: "1 · Morning bake" });
  await expect(page.getByText(/glow = scene level/)).toBeVisible();
  await expect(page.request.get(`/api/sites/${siteId}/devices/export`).then((r) => r.text())).resolves.toContain("Counter downlight 2,mesh-luminaire,Counter,0x0010");
  await expectCleanPage(page, watch, [/status of 422/]);
});

test("an upload that is not really an image is refused and nothing is stored", async ({ page }) => {
  await signIn(page, DEMO.integrator, undefined, "/sites/larch-lane/plan");
  await page.getByLabel("Floor name").fill("Cellar");
  await page.getByLabel("Plan image", { exact: true }).setInputFiles({ name: "plan.png", mimeType: "image/png", buffer: Buffer.from("this is text, not a picture") });
  await page.getByRole("button", { name: "Add floor" }).click();
  await expect(page.getByRole("alert").filter({ hasText: /not an image/ })).toBeVisible();
  await expect(page.getByLabel("Floor").locator("option")).toHaveText(["Ground floor", "Upper floor (flat)"]);
  expect(readFileSync("db/seed/plans/ground-floor.png").byteLength).toBeGreaterThan(0);
});

test("an occupant cannot reach the inventory edit routes", async ({ page }) => {
  await signIn(page, DEMO.occupant);
  const origin = new URL(page.url()).origin;
  const post = await page.request.post("/api/sites/larch-lane/devices", { data: { name: "Sneaky", kind: "mesh-luminaire" }, headers: { origin } });
  expect(post.status()).toBe(403);
  const zone = await page.request.post("/api/sites/larch-lane/zones", { data: { name: "Sneaky zone" }, headers: { origin } });
  expect(zone.status()).toBe(403);
  const scene = await page.request.post("/api/sites/larch-lane/scenes", { data: { number: 99, name: "Sneaky", fadeMs: 0, levels: [] }, headers: { origin } });
  expect(scene.status()).toBe(403);
  for (const path of ["devices", "plan", "scenes"]) {
    await page.goto(`/sites/larch-lane/${path}`);
    await expect(page.getByText("Your role on this site does not open that page.")).toBeVisible();
  }
  await expect(page.getByRole("link", { name: "Devices" })).toHaveCount(0);
});
