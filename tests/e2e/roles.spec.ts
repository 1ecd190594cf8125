import { test, expect } from "@playwright/test";
import { SignInPage, demoPerson, otherOwner } from "./pages/session";
import { DEMO_PASSWORD } from "@/lib/demo/farm";

const HOME_HEADING = {
  owner: /Kestrel Fen Growers: team and fields/,
  qa_lead: /Audits waiting for your review/,
  technician: /Your uploads and audits/,
  grower: /Your fields and how far to trust their records/,
} as const;

for (const role of ["owner", "qa_lead", "technician", "grower"] as const) {
  test(`sign-in -- ${role} lands on their own home`, async ({ page }) => {
    await new SignInPage(page).signInAs(role);
    await expect(page.getByRole("heading", { level: 1 })).toHaveText(HOME_HEADING[role]);
    await expect(page.getByTestId("viewer")).toContainText(demoPerson(role).name);
  });
}

test("roles -- technician is refused the owner's team page", async ({ page }) => {
  await new SignInPage(page).signInAs("technician");
  const res = await page.goto("/team");
  expect(res?.status()).toBe(403);
  await expect(page.getByTestId("forbidden")).toBeVisible();
  await expect(page.getByRole("link", { name: "Team" })).toHaveCount(0);
});

test("roles -- grower is refused the review page and the technician-only API", async ({ page }) => {
  await new SignInPage(page).signInAs("grower");
  expect((await page.goto("/review"))?.status()).toBe(403);
  const res = await page.request.post("/api/fields", {
    data: { name: "Grower Field", farm: "Kestrel Fen", crs: "EPSG:25831", timeZone: "Europe/Amsterdam" },
  });
  expect(res.status()).toBe(403);
  expect(await res.json()).toMatchObject({ error: { code: "forbidden" } });
});

test("organisations -- another organisation's field is not found, in the API and the page", async ({
  page,
  browser,
}) => {
  // Find a field id of the other organisation by signing in as its owner in a separate context.
  const other = await browser.newContext();
  const otherPage = await other.newPage();
  await otherPage.goto("/login");
  await new SignInPage(otherPage).signIn(otherOwner.email, DEMO_PASSWORD);
  await expect(otherPage.getByTestId("home-owner")).toBeVisible();
  const { fields } = await (await otherPage.request.get("/api/fields")).json();
  const foreignId: string = fields[0].id;
  await other.close();

  await new SignInPage(page).signInAs("technician");
  const api = await page.request.get(`/api/fields/${foreignId}`);
  expect(api.status()).toBe(404);
  expect(await api.json()).toMatchObject({ error: { code: "not_found" } });
  const pageRes = await page.goto(`/fields/${foreignId}`);
  expect(pageRes?.status()).toBe(404);
  await expect(page.getByTestId("not-found")).toBeVisible();
  // Their own fields open normally.
  await page.goto("/fields");
  await page.getByRole("link", { name: "Long Acre" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Long Acre");
});

test("api -- without a session the API answers 401 with a JSON error", async ({ request }) => {
  const res = await request.get("/api/fields");
  expect(res.status()).toBe(401);
  expect(await res.json()).toMatchObject({ error: { code: "unauthenticated" } });
});

test("sign-in -- a wrong password shows a clear message", async ({ page }) => {
  const signIn = new SignInPage(page);
  await signIn.open();
  await signIn.signIn(demoPerson("grower").email, "not-the-password");
  await expect(page.locator("[data-form-error]")).toContainText("do not match an account");
  await expect(page).toHaveURL(/\/login$/);
});

test("sign-up -- invalid e-mail and short password get field-level errors, then a valid sign-up lands on the owner home", async ({
  page,
}) => {
  await page.goto("/signup");
  await page.getByLabel("Your name").fill("Fenna Lark");
  await page.getByLabel("E-mail").fill("fenna-at-nowhere");
  await page.getByLabel("Password").fill("short");
  await page.getByLabel("Farm business or company").fill("Lark Marsh Organics");
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page.locator('[data-field-error="email"]')).toContainText("valid e-mail");
  await expect(page.locator('[data-field-error="password"]')).toContainText("at least 10 characters");

  await page.getByLabel("E-mail").fill("fenna@larkmarsh.example");
  await page.getByLabel("Password").fill("a-long-enough-passphrase");
  await page.getByRole("button", { name: "Create account" }).click();
  await expect(page.getByTestId("home-owner")).toBeVisible();
  await expect(page.getByTestId("viewer")).toContainText("Lark Marsh Organics");
});
