import { DEMO, expect, expectCleanPage, signIn, test } from "./fixtures";

test("signed out, the console asks to sign in and then returns to the page", async ({ page, watch }) => {
  await page.goto("/sites/larch-lane");
  await expect(page).toHaveURL(/\/sign-in\?next=%2Fsites%2Flarch-lane/);
  await page.getByLabel("E-mail").fill(DEMO.integrator);
  await page.getByLabel("Password").fill("larch-lane-demo");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page).toHaveURL(/\/sites\/larch-lane$/);
  await expectCleanPage(page, watch);
});

test("the overview shows the demo site's zones and devices from the database", async ({ page, watch }) => {
  await signIn(page, DEMO.integrator);
  await expect(page).toHaveURL(/\/sites$/);
  await page.getByRole("link", { name: /Larch Lane Studio/ }).click();

  await expect(page.getByRole("heading", { level: 1, name: "Larch Lane Studio" })).toBeVisible();
  for (const zone of ["Shop floor", "Workshop", "Textile room", "Front path", "Back door", "Flat"]) {
    await expect(page.getByRole("heading", { level: 3, name: zone, exact: true })).toBeVisible();
  }
  const path = page.getByRole("article", { name: "Zone Front path" });
  await expect(path.getByText("Front path motion sensor")).toBeVisible();
  await expect(path.getByText("group 0xC004")).toBeVisible();
  await expect(page.getByRole("link", { name: "Overview" })).toHaveAttribute("aria-current", "page");
  await expectCleanPage(page, watch);
});

test("the device filter narrows the zones by name and power source", async ({ page, watch }) => {
  await signIn(page, DEMO.manager, undefined, "/sites/larch-lane");
  await page.getByLabel("Find a device").fill("climate");
  await expect(page.getByText("3 of 28 devices match.")).toBeVisible();
  await expect(page.getByRole("article", { name: "Zone Front path" })).toHaveCount(0);

  await page.getByLabel("Find a device").fill("");
  await page.getByLabel("Power").selectOption("kinetic");
  await expect(page.getByText("4 of 28 devices match.")).toBeVisible();
  await expect(page.getByRole("article", { name: "Zone Shop floor" }).getByText("Counter call button")).toBeVisible();
  // Managers do not manage members.
  await expect(page.getByRole("link", { name: "Members" })).toHaveCount(0);
  await expectCleanPage(page, watch);
});

test("an unknown site shows a not-found page", async ({ page }) => {
  await signIn(page, DEMO.integrator);
  const res = await page.goto("/sites/no-such-site");
  expect(res?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "No such site" })).toBeVisible();
});
