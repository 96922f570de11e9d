import { expect, expectCleanPage, test } from "./fixtures";

test("the overview shows the demo site's zones and devices from the database", async ({ page, watch }) => {
  await page.goto("/");
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
  await page.goto("/sites/larch-lane");
  await page.getByLabel("Find a device").fill("climate");
  await expect(page.getByText("3 of 28 devices match.")).toBeVisible();
  await expect(page.getByRole("article", { name: "Zone Front path" })).toHaveCount(0);

  await page.getByLabel("Find a device").fill("");
  await page.getByLabel("Power").selectOption("kinetic");
  await expect(page.getByText("4 of 28 devices match.")).toBeVisible();
  await expect(page.getByRole("article", { name: "Zone Shop floor" }).getByText("Counter call button")).toBeVisible();
  await expectCleanPage(page, watch);
});

test("an unknown site shows a not-found page", async ({ page }) => {
  const res = await page.goto("/sites/no-such-site");
  expect(res?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "No such site" })).toBeVisible();
});
