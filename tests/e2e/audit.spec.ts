import { test, expect } from "@playwright/test";
import { SignInPage, otherOwner } from "./pages/session";
import { DEMO_PASSWORD } from "@/lib/demo/farm";
import { AuditApi, AuditResultPage, NewAuditPage, formatMm, parseCsv } from "./pages/audit";

// The grower opens the audit the technician created, so the two tests run in order.
test.describe.configure({ mode: "serial" });

let auditId = "";
let pairs = 0;

test("audit -- technician creates an audit for Long Acre, reads the verdict, sorts, filters and downloads", async ({
  page,
}) => {
  test.setTimeout(120_000);
  await new SignInPage(page).signInAs("technician");
  const api = new AuditApi(page);
  const fieldId = await api.fieldId("Long Acre");
  const planted = await api.upload(fieldId, "planted");
  const survey = await api.upload(fieldId, "survey");
  expect(planted.rowCount).toBe(4800);

  const form = new NewAuditPage(page);
  await form.open(fieldId);
  await form.fill({
    title: "Long Acre spring check",
    plantedId: planted.id,
    surveyId: survey.id,
    profileName: "In-row weeding around plants",
    match: /Plant id, then position/,
    maxDistanceMm: "100",
  });
  await form.submit();

  // The server computes in the same process, so the result page may take a few seconds to answer.
  await expect(page).toHaveURL(/\/audits\/[0-9a-f-]{36}$/, { timeout: 30_000 });
  const result = new AuditResultPage(page);
  auditId = result.auditIdFromUrl();
  await result.waitUntilComputed();

  const audit = await api.audit(auditId);
  const s = audit.summary!;
  pairs = s.pairs;
  expect(audit.title).toBe("Long Acre spring check");
  expect(audit.settings).toMatchObject({ match: "auto", maxDistanceM: 0.1 });
  expect(audit.profile?.name).toBe("In-row weeding around plants");

  // Verdict first: overall mark and every criterion in words, as the server judged it.
  await expect(result.verdict).toHaveAttribute("data-passed", String(audit.verdict!.passed));
  await expect(result.verdict).toContainText(audit.verdict!.passed ? "Passed" : "Failed");
  await expect(result.criteria).toHaveCount(audit.verdict!.criteria.length);
  for (const c of audit.verdict!.criteria) {
    const row = page.locator(`[data-testid="criterion"][data-criterion="${c.id}"]`);
    await expect(row).toContainText(c.text);
    await expect(row).toHaveAttribute("data-pass", String(c.passed));
    await expect(row).toContainText(c.passed ? "Pass" : "Fail");
  }
  const verdictBox = await result.verdict.boundingBox();
  const figuresBox = await page.getByTestId("headline-figures").boundingBox();
  expect(verdictBox!.y).toBeLessThan(figuresBox!.y);
  await expect(page.getByTestId("scope-caution")).toContainText("accuracy of the plant records only");

  // Headline figures in millimetres.
  await expect(page.getByTestId("figure-pairs")).toContainText(String(s.pairs));
  await expect(page.getByTestId("figure-rmse")).toContainText(formatMm(s.rmseR));
  await expect(page.getByTestId("figure-r95")).toContainText(formatMm(s.r95));
  await expect(page.getByTestId("figure-cep")).toContainText(formatMm(s.cep50Model));
  await expect(page.getByTestId("figure-nssda")).toContainText(formatMm(s.nssda95));
  expect(s.raw).not.toBeNull();
  await expect(page.getByTestId("raw-comparison")).toContainText(
    `from ${formatMm(s.raw!.rmseR)} to ${formatMm(s.rmseR)}`,
  );
  await expect(page.getByTestId("group-bed").locator('tr[data-group-key="3"]')).toHaveAttribute("data-out", "true");
  await expect(page.getByTestId("chart-scatter").locator("figcaption")).toContainText(formatMm(s.r95));

  // Per-plant table: sorted by the server, largest radial error first.
  await expect(result.residualStatus).toContainText(`of ${s.pairs}`);
  await result.sortResidualsBy("Radial mm", "radial");
  await expect(result.residualStatus).toContainText("sorted by radial error, largest first");
  await expect(page.getByTestId("residuals-table").locator("th[aria-sort]")).toHaveAttribute("aria-sort", "descending");
  await expect(result.residualRows).toHaveCount(25);
  const sorted = await result.residualRowsData();
  for (let i = 1; i < sorted.length; i++) expect(sorted[i - 1].radial).toBeGreaterThanOrEqual(sorted[i].radial);
  expect(sorted[0].radial).toBeGreaterThan(s.r95!);
  expect(sorted[0].bed).toBe("3");

  // Filter: only plants out of tolerance, counted by the server over all pairs.
  const out = s.withinTolerance!.n - s.withinTolerance!.within;
  expect(out).toBeGreaterThan(0);
  await result.filter("Show", "only out of tolerance", "only", "out");
  await expect(result.residualStatus).toContainText(`of ${out}`);
  await expect(result.residualRows).toHaveCount(Math.min(out, 25));
  const marks = page
    .getByTestId("residual-row")
    .locator("[data-pass]")
    .filter({ hasText: /^(Within|Out)$/ });
  await expect(marks).toHaveCount(Math.min(out, 25));
  for (const flag of await marks.evaluateAll((els) => els.map((e) => (e as HTMLElement).dataset.pass)))
    expect(flag).toBe("false");

  // Bed and plant id filters, also answered by the server.
  await result.clearFilters();
  const bed3 = s.groups.bed!.find((g) => g.key === "3")!;
  await result.filter("Bed", "3", "bed", "3");
  await expect(result.residualStatus).toContainText(`of ${bed3.pairs}`);
  await result.filter("Plant id contains", "LA-3-2-", "q", "LA-3-2-");
  const searched = await result.residualRowsData();
  expect(searched.length).toBeGreaterThan(0);
  for (const r of searched) {
    expect(r.plant).toContain("LA-3-2-");
    expect(r.bed).toBe("3");
  }

  // The per-plant CSV: one row per pair, largest radial errors from bed 3 (the RTK-float stretch).
  const { download, text } = await result.download("per-plant errors", "downloads-as-computed");
  expect(download.suggestedFilename()).toMatch(/_residuals\.csv$/);
  const rows = parseCsv(text);
  expect(rows.length).toBe(s.pairs);
  const byRadial = [...rows].sort((a, b) => Number(b.radial_m) - Number(a.radial_m));
  expect(byRadial.slice(0, 5).map((r) => r.bed)).toEqual(["3", "3", "3", "3", "3"]);
  expect(byRadial.slice(0, 5).every((r) => r.fix === "rtk-float")).toBe(true);
  expect(Number(byRadial[0].radial_m)).toBeCloseTo(sorted[0].radial, 4);
});

test("audit -- grower reads the result and downloads, but cannot create audits", async ({ page }) => {
  expect(auditId, "the technician's audit").not.toBe("");
  await new SignInPage(page).signInAs("grower");
  const res = await page.goto(`/audits/${auditId}`);
  expect(res?.status()).toBe(200);
  const result = new AuditResultPage(page);
  await result.waitUntilComputed();
  await expect(result.verdict).toBeVisible();
  await expect(page.getByTestId("headline-figures")).toBeVisible();

  const { text } = await result.download("per-plant errors", "downloads-as-computed");
  expect(parseCsv(text).length).toBe(pairs);
  const summary = await result.download("summary", "downloads-as-computed");
  expect(summary.text).toMatch(/^key,value/m);
  expect(summary.text).toContain(`pairs,${pairs}`);

  // The spreadsheet variants: the browser's locale (en-US: decimal point) picks the comma; millimetres by default.
  const sheet = await result.download("Per-plant errors (CSV)");
  expect(sheet.download.suggestedFilename()).toMatch(/_residuals-mm-comma\.csv$/);
  const sheetLines = sheet.text
    .replace(/^\uFEFF/, "")
    .trim()
    .split("\r\n");
  expect(sheetLines).toHaveLength(pairs + 1);
  expect(sheetLines[0]).toContain("distance (mm)");
  await page.getByLabel("Spreadsheet style").selectOption("semicolon");
  const semi = await result.download("Summary (CSV)");
  expect(semi.download.suggestedFilename()).toMatch(/_summary-mm-semicolon\.csv$/);
  expect(semi.text).toContain("label;value;unit");
  expect(semi.text).toMatch(/\r\nHorizontal RMSE;\d+,\d;mm\r\n/);

  await expect(page.getByTestId("new-audit-link")).toHaveCount(0);
  await expect(page.getByRole("button", { name: /run the audit|new|edit|delete/i })).toHaveCount(0);

  const api = new AuditApi(page);
  const fieldId = await api.fieldId("Long Acre");
  const audit = await api.audit(auditId);
  const refused = await page.request.post("/api/audits", {
    data: {
      fieldId,
      plantedDatasetId: audit.planted!.id,
      surveyDatasetId: audit.survey!.id,
      profileId: audit.profile!.id,
      title: "Grower try",
      match: "auto",
      maxDistanceM: 0.1,
    },
  });
  expect(refused.status()).toBe(403);
  expect(await refused.json()).toMatchObject({ error: { code: "forbidden" } });

  await page.goto(`/fields/${fieldId}/audits/new`);
  await expect(page.getByTestId("forbidden")).toBeVisible();
  await expect(page.getByTestId("new-audit-form")).toHaveCount(0);
});

test("audit -- another organisation's audit is not found", async ({ page }) => {
  expect(auditId, "the technician's audit").not.toBe("");
  await page.goto("/login");
  await new SignInPage(page).signIn(otherOwner.email, DEMO_PASSWORD);
  await expect(page.getByTestId("home-owner")).toBeVisible();
  expect((await page.request.get(`/api/audits/${auditId}`)).status()).toBe(404);
  const res = await page.goto(`/audits/${auditId}`);
  expect(res?.status()).toBe(404);
  await expect(page.getByTestId("not-found")).toBeVisible();
});
