import { test, expect, type Page } from "@playwright/test";
import { SignInPage, otherOwner } from "./pages/session";
import { DEMO_PASSWORD } from "@/lib/demo/farm";

test.use({ viewport: { width: 1400, height: 1100 } });

async function fieldId(page: Page, name: string): Promise<string> {
  const res = await page.request.get("/api/fields");
  expect(res.status()).toBe(200);
  return ((await res.json()).fields as { id: string; name: string }[]).find((f) => f.name === name)!.id;
}

async function auditId(page: Page, title: string): Promise<string> {
  const res = await page.request.get("/api/audits");
  return ((await res.json()).audits as { id: string; title: string }[]).find((a) => a.title === title)!.id;
}

test("season -- the QA lead follows Long Acre through the demo season and opens the April diagnostics", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("qa_lead");
  const id = await fieldId(page, "Long Acre");
  await page.goto(`/fields/${id}/season`);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Season: Long Acre");
  // The demo season's three audits of Long Acre: the April one signed off (filled), May and June not (hollow).
  // Other browser tests add audits of Long Acre, so the season holds at least these.
  const headline = page.getByTestId("season-headline");
  expect(await headline.locator('circle[data-signed="yes"]').count()).toBeGreaterThanOrEqual(1);
  expect(await headline.locator('circle[data-signed="no"]').count()).toBeGreaterThanOrEqual(2);
  const table = page.getByTestId("season-table");
  const row = (title: string) => table.locator("tbody tr", { hasText: title });
  await expect(row("Long Acre April planting")).toContainText("Signed off");
  for (const t of ["Long Acre May planting", "Long Acre June planting"]) {
    await expect(row(t)).toHaveCount(1);
    await expect(row(t)).not.toContainText("Signed off");
  }
  await expect(table).toContainText("arm 3");

  await page.getByRole("link", { name: "Long Acre April planting" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Diagnostics: Long Acre April planting");
  // Arm 3's cross-row offset, the others clean
  await expect(page.getByTestId("arm-3")).toContainText(/Arm 3: move its records \d\.\d mm ± \d\.\d mm to the left/);
  await expect(page.getByTestId("arm-1")).toContainText("Arm 1: no significant offset.");
  // The float stretch with its exact plant range
  const fix = page.getByTestId("episode-degraded-fix");
  await expect(fix).toContainText("Bed 3, row 2 (arm 2): plants LA-3-2-0031 to LA-3-2-0110 (80 records)");
  await expect(fix).toContainText("Bed 3, row 3 (arm 3): plants LA-3-3-0031 to LA-3-3-0110 (80 records)");
  await expect(page.getByTestId("chart-pass")).toBeVisible();
  await expect(page.getByTestId("camera-gain")).toContainText("all");

  // Clearance: a bad value is explained; a good one gives both shares
  await page.getByTestId("clearance-mm").fill("abc");
  await expect(page.getByText("“abc” is not a clearance")).toBeVisible();
  await page.getByTestId("clearance-mm").fill("5");
  await expect(page.getByTestId("clearance-result")).toContainText("Measured (checkpoints)");
  await expect(page.getByTestId("clearance-result")).toContainText("Normal model");

  const csv = await page.request.get(`/api/audits/${await auditId(page, "Long Acre April planting")}/diagnostics.csv`);
  expect(csv.status()).toBe(200);
  expect(await csv.text()).toContain("LA-3-2-0031,LA-3-2-0110");
});

test("diagnostics -- the grower opens them from the June result and reads the shift and the comparison", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("grower");
  const id = await auditId(page, "Long Acre June planting");
  await page.goto(`/audits/${id}`);
  await page.getByTestId("diagnostics-link").click();
  await expect(page).toHaveURL(`/audits/${id}/diagnostics`, { timeout: 30_000 });
  // Two audits' diagnostics are computed for the comparison on this first visit.
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Diagnostics: Long Acre June planting", {
    timeout: 20_000,
  });
  await expect(page.getByTestId("similarity")).toContainText("check the base-station coordinates");
  await expect(page.getByTestId("comparison")).toContainText(/Horizontal RMSE rose \d+ % \(significant\)/);
  await expect(page.getByTestId("comparison")).toContainText("Welch's t-test");
});

test("diagnostics -- another organisation gets 404 for the page, the JSON, the CSV and the season", async ({
  page,
  browser,
}) => {
  await new SignInPage(page).signInAs("grower");
  const id = await auditId(page, "Long Acre April planting");
  const field = await fieldId(page, "Long Acre");
  const other = await browser.newPage();
  await new SignInPage(other).open();
  await new SignInPage(other).signIn(otherOwner.email, DEMO_PASSWORD);
  await expect(other.getByTestId("home-owner")).toBeVisible();
  for (const url of [
    `/api/audits/${id}/diagnostics`,
    `/api/audits/${id}/diagnostics.csv`,
    `/api/fields/${field}/season`,
  ])
    expect((await other.request.get(url)).status(), url).toBe(404);
  const res = await other.goto(`/audits/${id}/diagnostics`);
  expect(res!.status()).toBe(404);
  await other.close();
});
