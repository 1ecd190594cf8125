import path from "node:path";
import { test, expect, type Page } from "@playwright/test";
import { SignInPage, otherOwner } from "./pages/session";
import { Outbox, pageFor } from "./pages/review";
import { UploadPage } from "./pages/upload";
import { AuditApi, AuditResultPage, NewAuditPage } from "./pages/audit";
import { DEMO_PASSWORD } from "@/lib/demo/farm";
import type { DatasetDto } from "@/lib/api-types";

test.use({ viewport: { width: 1400, height: 1100 } });

const TRANSPLANTER = "Reedling 5-arm transplanter";

async function machineId(page: Page, name: string): Promise<string> {
  const res = await page.request.get("/api/machines");
  expect(res.status()).toBe(200);
  return ((await res.json()).machines as { id: string; name: string }[]).find((m) => m.name === name)!.id;
}

test("machine season -- the grower follows the transplanter's demo audits on both fields; the field page links its season", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("grower");
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Machines" }).click();
  const row = page.locator(`[data-testid="machine-row"][data-machine-name="${TRANSPLANTER}"]`);
  await expect(row).toContainText("2.50 m");
  // A grower reads the list but is offered no changes
  await expect(page.getByRole("button", { name: "New machine" })).toHaveCount(0);
  await row.getByRole("link", { name: `Season of ${TRANSPLANTER}` }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(`Season: ${TRANSPLANTER}`, { timeout: 30_000 });
  // Four demo audits of its records with results: Long Acre April signed off (filled), the others not (hollow)
  const headline = page.getByTestId("season-headline");
  await expect(headline.locator('circle[data-signed="yes"]')).toHaveCount(1);
  await expect(headline.locator('circle[data-signed="no"]')).toHaveCount(3);
  const table = page.getByTestId("season-table");
  await expect(table.locator("tbody tr")).toHaveCount(4);
  await expect(table).toContainText("Willow Strip May planting");
  await expect(table).toContainText("Long Acre June planting");
  await expect(page.getByTestId("season-arms")).toBeVisible();

  // The May planting of Long Acre is compared with the machine's previous audit, on Willow Strip
  await table.getByRole("link", { name: "Long Acre May planting" }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Diagnostics: Long Acre May planting", {
    timeout: 30_000,
  });
  await expect(page.getByTestId("comparison-basis")).toHaveText(
    `The previous audit of the same machine (${TRANSPLANTER}), on Willow Strip.`,
  );

  const fields = (await (await page.request.get("/api/fields")).json()).fields as { id: string; name: string }[];
  await page.goto(`/fields/${fields.find((f) => f.name === "Long Acre")!.id}`);
  await page.getByTestId("field-season-link").click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Season: Long Acre", { timeout: 30_000 });
});

test("alerts -- a QA lead sets a threshold, a technician's audit breaches it, the e-mail arrives and the alert shows", async ({
  page,
  browser,
}) => {
  test.setTimeout(180_000);
  await new SignInPage(page).signInAs("qa_lead");
  await expect(page.getByTestId("home-alerts")).toBeVisible();
  await page.getByRole("navigation", { name: "Main" }).getByRole("link", { name: "Alerts" }).click();
  const form = page.getByTestId("alert-rules-form");
  // The demo starts with thresholds; the season's audits already crossed them
  await expect(form.getByLabel("Arm cross-row offset above (mm)")).toHaveValue("2");
  await expect(page.getByTestId("alert-item").first()).toBeVisible();
  // A bad value is explained and nothing is saved
  await form.getByLabel("Arm cross-row offset above (mm)").fill("two");
  await form.getByRole("button", { name: "Save thresholds" }).click();
  await expect(form.locator('[data-field-error="armCrossOffsetMm"]')).toHaveText(
    "“two” is not a number of millimetres.",
  );
  await form.getByLabel("Arm cross-row offset above (mm)").fill("2.5");
  await form.getByLabel("Horizontal RMSE up more than (%)").fill("");
  await form.getByLabel("Alert when an audit fails its tolerance profile").uncheck();
  await form.getByRole("button", { name: "Save thresholds" }).click();
  await expect(page.getByTestId("alert-rules-saved")).toBeVisible();
  const rules = (await (await page.request.get("/api/alerts/rules")).json()).rules;
  expect(rules).toMatchObject({ armCrossOffsetM: 0.0025, rmseRise: null, failedVerdict: false });

  // The technician uploads the Long Acre records naming the transplanter, and runs an audit
  const tamsin = await pageFor(browser, "technician");
  const api = new AuditApi(tamsin);
  const fieldId = await api.fieldId("Long Acre");
  const upload = new UploadPage(tamsin);
  await upload.open(fieldId, "planted");
  await tamsin
    .getByLabel("Machine that recorded the file (optional)")
    .selectOption({ label: `${TRANSPLANTER} (5 arms)` });
  await upload.choose(path.resolve("public/demo/long-acre-as-planted.csv"));
  await upload.save();
  await upload.acceptWarningsAndSave();
  await expect(upload.saved).toBeVisible({ timeout: 30_000 });
  const datasets = (await (await tamsin.request.get(`/api/fields/${fieldId}/datasets`)).json())
    .datasets as DatasetDto[];
  const planted = datasets
    .filter((d) => d.kind === "planted" && d.fileName === "long-acre-as-planted.csv")
    .sort((a, b) => (a.uploadedAt < b.uploadedAt ? 1 : -1))[0];
  const survey = await api.upload(fieldId, "survey");
  const audit = new NewAuditPage(tamsin);
  await audit.open(fieldId);
  await audit.fill({
    title: "Long Acre arm check",
    plantedId: planted.id,
    surveyId: survey.id,
    profileName: "Inter-row hoeing",
    match: /Plant id, then position/,
    maxDistanceMm: "100",
  });
  await audit.submit();
  await expect(tamsin).toHaveURL(/\/audits\/[0-9a-f-]{36}$/, { timeout: 30_000 });
  const result = new AuditResultPage(tamsin);
  const auditId = result.auditIdFromUrl();
  await result.waitUntilComputed();
  await expect(tamsin.getByTestId("audit-machine")).toHaveText(TRANSPLANTER);
  await tamsin.context().close();

  // The e-mail to the QA lead, through the demo outbox
  const mail = await new Outbox(browser).waitFor("idris@kestrelfen.example", /Alert: Long Acre arm check/);
  expect(mail.text).toContain("Mean cross-row error of arm 3");
  expect(mail.text).toContain("above the 2.5 mm limit");
  expect(mail.link).toContain(`/audits/${auditId}/diagnostics`);

  // The alert in the app, and the count on the home page
  await page.goto("/alerts");
  const item = page.getByTestId("alert-item").filter({ hasText: "Long Acre arm check" });
  await expect(item).toHaveCount(1);
  await expect(item).toHaveAttribute("data-kind", "arm-cross-offset");
  await expect(item).toContainText(TRANSPLANTER);
  await page.goto("/");
  const count = Number(await page.getByTestId("home-alerts").getAttribute("data-open"));
  expect(count).toBeGreaterThan(0);
  await page.goto("/alerts");
  await item.getByRole("button", { name: "Acknowledge" }).click();
  await expect(item).toHaveAttribute("data-open", "no");
  await page.goto("/");
  await expect(page.getByTestId("home-alerts")).toHaveAttribute("data-open", String(count - 1));
});

test("machines -- a technician cannot change them; a QA lead adds one; another organisation gets 404", async ({
  page,
  browser,
}) => {
  const tamsin = await pageFor(browser, "technician");
  await tamsin.goto("/machines");
  await expect(tamsin.getByTestId("machines-table")).toBeVisible();
  await expect(tamsin.getByRole("button", { name: "New machine" })).toHaveCount(0);
  const refused = await tamsin.request.post("/api/machines", {
    data: { name: "Tamsin's rig", workingWidthM: 2, toolArms: 2 },
  });
  expect(refused.status()).toBe(403);
  expect(
    (
      await tamsin.request.put("/api/alerts/rules", {
        data: { armCrossOffsetM: 0.01, rmseRise: null, failedVerdict: false },
      })
    ).status(),
  ).toBe(403);
  await tamsin.context().close();

  await new SignInPage(page).signInAs("qa_lead");
  await page.goto("/machines");
  await page.getByRole("button", { name: "New machine" }).click();
  const form = page.getByTestId("machine-form");
  await form.getByLabel("Name").fill("Osier 3-arm planter");
  await form.getByLabel("Working width (m)").fill("wide");
  await form.getByLabel("Tool arms").fill("3");
  await form.getByRole("button", { name: "Add machine" }).click();
  await expect(form.locator('[data-field-error="workingWidthM"]')).toHaveText("“wide” is not a width in metres.");
  await form.getByLabel("Working width (m)").fill("1.5");
  await form.getByRole("button", { name: "Add machine" }).click();
  await expect(page.getByTestId("machine-notice")).toHaveText("Added “Osier 3-arm planter”.");
  await expect(page.locator('[data-testid="machine-row"][data-machine-name="Osier 3-arm planter"]')).toContainText(
    "1.50 m",
  );

  const id = await machineId(page, TRANSPLANTER);
  const alertId = ((await (await page.request.get("/api/alerts")).json()).alerts as { id: string }[])[0].id;
  const other = await browser.newPage();
  await new SignInPage(other).open();
  await new SignInPage(other).signIn(otherOwner.email, DEMO_PASSWORD);
  await expect(other.getByTestId("home-owner")).toBeVisible();
  for (const url of [`/api/machines/${id}`, `/api/machines/${id}/season`])
    expect((await other.request.get(url)).status(), url).toBe(404);
  expect((await other.request.patch(`/api/machines/${id}`, { data: { toolArms: 2 } })).status()).toBe(404);
  expect((await other.request.patch(`/api/alerts/${alertId}`, { data: { acknowledged: true } })).status()).toBe(404);
  expect((await (await other.request.get("/api/alerts")).json()).alerts).toEqual([]);
  const res = await other.goto(`/machines/${id}/season`);
  expect(res!.status()).toBe(404);
  await other.close();
});
