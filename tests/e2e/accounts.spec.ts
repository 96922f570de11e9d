import { DEMO, expect, expectCleanPage, linkFromMail, signIn, test } from "./fixtures";

test("sign up, create a site, invite an occupant who accepts and sees only occupant views", async ({ page, watch, browser }) => {
  const stamp = Date.now();
  const integratorEmail = `e2e-integrator-${stamp}@example.invalid`;
  const occupantEmail = `e2e-occupant-${stamp}@example.invalid`;

  // Sign up; the form reports field errors first.
  await page.goto("/sign-up");
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page.getByText("Enter your name")).toBeVisible();
  await page.getByLabel("Your name").fill("Pat Fitter");
  await page.getByLabel("E-mail").fill(integratorEmail);
  await page.getByLabel("Password").fill("short");
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page.getByText("Use at least 10 characters")).toBeVisible();
  await page.getByLabel("Password").fill("a long enough phrase");
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page).toHaveURL(/\/sites$/);

  // Create a site: the creator becomes its integrator.
  await page.getByRole("link", { name: "New site" }).click();
  await page.getByLabel("Site name").fill("Quillmark Pottery");
  await page.getByLabel("Time zone").fill("Mars/Olympus");
  await page.getByRole("button", { name: "Create site" }).click();
  await expect(page.getByText(/Choose a time zone/)).toBeVisible();
  await page.getByLabel("Time zone").fill("CET");
  await page.getByLabel("Latitude (°)").fill("47.5");
  await page.getByLabel("Longitude (°)").fill("8.2");
  await page.getByRole("button", { name: "Create site" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Quillmark Pottery" })).toBeVisible();
  await expect(page.getByText("Integrator", { exact: true })).toBeVisible();
  const siteUrl = new URL(page.url());
  const siteId = siteUrl.pathname.split("/")[2];

  // Invite an occupant.
  await page.getByRole("link", { name: "Members" }).click();
  await expect(page.getByRole("cell", { name: /Pat Fitter \(you\)/ })).toBeVisible();
  await page.getByLabel("E-mail").fill(occupantEmail);
  await page.getByLabel("Role", { exact: true }).selectOption("occupant");
  await page.getByRole("button", { name: "Send invitation" }).click();
  await expect(page.getByText(`Invitation sent to ${occupantEmail}.`)).toBeVisible();
  await expect(page.getByRole("cell", { name: occupantEmail, exact: true })).toBeVisible();
  await expectCleanPage(page, watch);

  // The invitation arrives in the local mail sink; the occupant accepts in another browser.
  const link = await linkFromMail(occupantEmail, "/invite");
  const other = await browser.newContext();
  const occ = await other.newPage();
  await occ.goto(link);
  await expect(occ.getByRole("heading", { name: "Join Quillmark Pottery" })).toBeVisible();
  await occ.getByLabel("Your name").fill("Sam Resident");
  await occ.getByLabel("Choose a password").fill("resident pass phrase");
  await occ.getByRole("button", { name: "Create account and accept" }).click();
  await expect(occ).toHaveURL(new RegExp(`/sites/${siteId}$`));
  await expect(occ.getByText("Occupant", { exact: true })).toBeVisible();
  await expect(occ.getByRole("heading", { name: "Your zones" })).toBeVisible();
  await expect(occ.getByRole("link", { name: "Members" })).toHaveCount(0);

  // Direct requests to integrator-only routes are refused on the server.
  const api = await occ.request.get(`/api/sites/${siteId}/members`);
  expect(api.status()).toBe(403);
  const post = await occ.request.post(`/api/sites/${siteId}/invites`, { data: { email: "x@example.invalid", role: "integrator" }, headers: { origin: new URL(occ.url()).origin } });
  expect(post.status()).toBe(403);
  await occ.goto(`/sites/${siteId}/members`);
  await expect(occ.getByText("Your role on this site does not open that page.")).toBeVisible();

  // The link cannot be used twice.
  await occ.goto(link);
  await expect(occ.getByText(/expired, was revoked or was already used/)).toBeVisible();
  await other.close();

  // Back as the integrator: the occupant is now a member and no invitation waits.
  await page.reload();
  await expect(page.getByRole("cell", { name: "Sam Resident", exact: true })).toBeVisible();
  await expect(page.getByText("No invitations waiting.")).toBeVisible();
});

test("password reset round trip through the local mail sink", async ({ page, watch }) => {
  const email = `e2e-reset-${Date.now()}@example.invalid`;
  await page.goto("/sign-up");
  await page.getByLabel("Your name").fill("Robin Forgetful");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("the first phrase");
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page).toHaveURL(/\/sites$/);
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page).toHaveURL(/\/sign-in/);

  await page.getByRole("link", { name: "Forgot your password?" }).click();
  // Wait for the new page: the sign-in form's own E-mail field is there until the route changes.
  await expect(page.getByRole("heading", { name: "Reset your password" })).toBeVisible();
  await page.getByLabel("E-mail").fill(email);
  await page.getByRole("button", { name: "Send reset link" }).click();
  await expect(page.getByText(/a reset link is on its way/)).toBeVisible();

  const link = await linkFromMail(email, "/reset-password");
  await page.goto(link);
  await expect(page.getByRole("heading", { name: "Choose a new password" })).toBeVisible();
  await page.getByLabel("New password", { exact: true }).fill("the second phrase");
  await page.getByLabel("New password again").fill("the second phrase");
  await page.getByRole("button", { name: "Set new password" }).click();
  await expect(page).toHaveURL(/\/sites/);
  await page.getByRole("button", { name: "Sign out" }).click();

  await page.goto("/sign-in");
  await page.getByLabel("E-mail").fill(email);
  await page.getByLabel("Password").fill("the first phrase");
  await page.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByText("That e-mail and password do not match an account.")).toBeVisible();
  await signIn(page, email, "the second phrase");
  await expect(page.getByRole("heading", { name: "Your sites" })).toBeVisible();
  // The one wrong password above answers 401 on purpose.
  await expectCleanPage(page, watch, [/status of 401/]);
});

test("the demo occupant sees only their zones", async ({ page, watch }) => {
  await signIn(page, DEMO.occupant, undefined, "/sites/larch-lane");
  await expect(page.getByRole("heading", { name: "Your zones" })).toBeVisible();
  const zoneHeadings = page.getByRole("heading", { level: 3 });
  await expect(zoneHeadings).toHaveText(["Front path", "Back door", "Flat"]);
  await expectCleanPage(page, watch);
});
