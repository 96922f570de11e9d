import { DEMO, expect, expectCleanPage, signIn, test } from "./fixtures";

const SITE = "larch-lane";

test("integrator creates a gateway key, sees it once, the gateway API takes it, then revokes it and the API refuses it", async ({ page, watch }) => {
  await signIn(page, DEMO.integrator);
  await page.goto(`/sites/${SITE}`);
  await page.getByRole("navigation", { name: "Site sections" }).getByRole("link", { name: "Gateway keys" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Gateway keys" })).toBeVisible();

  // The how-to shows the exact call with this page's own origin and the site.
  const origin = new URL(page.url()).origin;
  await expect(page.locator("pre").first()).toContainText(`curl -X POST '${origin}/api/v1/sites/${SITE}/events'`);
  await expect(page.locator("pre").first()).toContainText("-H 'Authorization: Bearer jpk_…'");

  // A name is required; the message is tied to the field.
  await page.getByRole("button", { name: "Create key" }).click();
  await expect(page.getByText("Name the key, e.g. after the gateway it goes in")).toBeVisible();
  await expect(page.getByLabel("Key name")).toHaveAttribute("aria-invalid", "true");

  const name = `Test gateway ${Date.now()}`;
  await page.getByLabel("Key name").fill(name);
  await page.getByLabel("Key name").press("Enter");
  const box = page.getByRole("region", { name: "Shown once — store it in the gateway now" });
  await expect(box).toBeVisible();
  await expect(box.getByRole("heading", { name: "Shown once — store it in the gateway now" })).toBeFocused();
  const key = await box.getByLabel("New gateway key").inputValue();
  expect(key).toMatch(/^jpk_[A-Za-z0-9_-]{43}$/);

  const row = page.getByRole("row").filter({ has: page.getByRole("rowheader", { name, exact: true }) });
  await expect(row).toContainText(`${key.slice(0, 10)}…`);
  await expect(row).toContainText("Active");
  await expect(row).toContainText("Never");

  // The key works for the gateway API.
  const send = (id: string) =>
    page.request.post(`/api/v1/sites/${SITE}/events`, {
      headers: { authorization: `Bearer ${key}` },
      data: { events: [{ id, at: Date.now() - 1000, device: "0x0009", kind: "light-level", value: 300 }] },
    });
  const ok = await send(`e2e-key-${Date.now()}`);
  expect(ok.status()).toBe(200);
  expect((await ok.json()).accepted).toBe(1);

  // Hidden, and gone for good after a reload.
  await box.getByRole("button", { name: "I have stored it — hide the key" }).click();
  await expect(box).toHaveCount(0);
  await page.reload();
  await expect(page.getByRole("heading", { level: 1, name: "Gateway keys" })).toBeVisible();
  expect(await page.content()).not.toContain(key);
  await expect(row).not.toContainText("Never");

  // Revoke asks first; Escape keeps the key and returns focus to the button.
  const revoke = row.getByRole("button", { name: `Revoke key ${name}` });
  await revoke.click();
  const question = row.getByRole("group", { name: `Revoke key ${name}?` });
  await expect(question.getByRole("button", { name: "Keep it" })).toBeFocused();
  await page.keyboard.press("Escape");
  await expect(question).toHaveCount(0);
  await expect(revoke).toBeFocused();

  await revoke.click();
  await question.getByRole("button", { name: "Revoke key", exact: true }).click();
  await expect(page.getByText(`Key “${name}” revoked.`)).toBeVisible();
  await expect(row).toContainText("Revoked");
  await expect(row.getByRole("button")).toHaveCount(0);

  const refused = await send(`e2e-key-after-${Date.now()}`);
  expect(refused.status()).toBe(401);
  expect((await refused.json()).error).toBe("unauthenticated");

  await expectCleanPage(page, watch);
});

test("the gateway keys page is for integrators only, and the OpenAPI document is public", async ({ page, watch }) => {
  await signIn(page, DEMO.manager);
  await page.goto(`/sites/${SITE}`);
  await expect(page.getByRole("link", { name: "Gateway keys" })).toHaveCount(0);
  await page.goto(`/sites/${SITE}/keys`);
  await expect(page).toHaveURL(new RegExp(`/sites/${SITE}\\?denied=1`));

  const doc = await page.request.get("/api/v1/openapi.json");
  expect(doc.status()).toBe(200);
  const body = await doc.json();
  expect(body.openapi).toBe("3.1.0");
  expect(Object.keys(body.paths)).toContain("/api/v1/sites/{siteId}/events");
  await expectCleanPage(page, watch);
});
