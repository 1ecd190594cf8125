import fs from "node:fs/promises";
import { expect, test } from "@playwright/test";
import { DEMO_FIELDS } from "@/lib/demo/farm";
import { generatePlanSurvey, readStakeoutCsv } from "@/lib/demo/plan-demo";
import { SignInPage } from "./pages/session";
import { AuditApi } from "./pages/audit";
import { pageFor } from "./pages/review";

const WILLOW = DEMO_FIELDS.find((f) => f.name === "Willow Strip")!;
// The e2e database outlives a run: names carry the run so a second run does not meet the first one's plan.
const RUN = Date.now().toString(36);
const PLAN = `Idris weekly check ${RUN}`;
const FILE = `willow-check-${RUN}.csv`;

test("survey plan -- QA lead plans, technician surveys from it with the control-mark check, coverage and sign-off evidence show", async ({
  page,
  browser,
}) => {
  test.setTimeout(240_000);
  // The QA lead plans a survey of Willow Strip (its as-planted records and control mark come with the demo).
  await new SignInPage(page).signInAs("qa_lead");
  const api = new AuditApi(page);
  const fieldId = await api.fieldId("Willow Strip");
  await page.goto(`/fields/${fieldId}`);
  await page.getByRole("link", { name: "Survey plans" }).click();
  await expect(page.getByTestId("plan-safety")).toContainText("Stop the machine and lock it out");
  const form = page.getByTestId("new-plan-form");
  await form.getByLabel("Plan name").fill(PLAN);
  await form.getByLabel("Tolerance profile").selectOption({ label: "Inter-row hoeing" });
  await form.getByLabel("Minimum per stratum").fill("6");
  await form.getByLabel("Spares per stratum").fill("2");
  await form.getByLabel("Leave out at each bed end (m)").fill("1");
  await form.getByLabel("Seed (optional)").fill("777");
  await form.getByRole("button", { name: "Make plan" }).click();
  await expect(page.getByRole("heading", { name: PLAN })).toBeVisible();
  await expect(page.getByTestId("sample-size")).toContainText("59 checkpoints");
  await expect(page.getByTestId("plan-safety")).toBeVisible();
  await expect(page.getByTestId("plan-plot")).toBeVisible();
  const planUrl = page.url();

  // Stakeout CSV download, then the field sheet.
  const [download] = await Promise.all([page.waitForEvent("download"), page.getByTestId("stakeout-csv").click()]);
  const csv = await fs.readFile((await download.path())!, "utf8");
  expect(csv.split("\r\n")[0]).toBe("point,easting,northing,plant_id,crop,bed,row,arm,kind");
  const points = readStakeoutCsv(csv);
  expect(points.filter((p) => !p.spare).length).toBeGreaterThanOrEqual(59);
  await page.getByRole("link", { name: "Field sheet (A4)" }).click();
  await expect(page.getByTestId("field-sheet")).toBeVisible();
  await expect(page.getByTestId("sheet-marks")).toContainText("WS-CM1");
  await expect(page.getByTestId("sheet-signatures")).toContainText("Surveyed by");
  await expect(page.getByTestId("plan-safety")).toContainText("Keep clear of tool arms, blades");

  // The technician uploads a survey made from that plan (demo generator) with the control-mark check.
  const tech = await pageFor(browser, "technician");
  const survey = generatePlanSurvey(WILLOW, points, 4242);
  await tech.goto(planUrl);
  const up = tech.getByTestId("plan-survey-form");
  await up.getByLabel(/Survey file/).setInputFiles({
    name: FILE,
    mimeType: "text/csv",
    buffer: Buffer.from(survey.csv),
  });
  await up.getByLabel("Before: measured easting (m)").fill(String(survey.before.e));
  await up.getByLabel("Before: measured northing (m)").fill(String(survey.before.n));
  await up.getByLabel("After: measured easting (m)").fill(String(survey.after.e));
  await up.getByLabel("After: measured northing (m)").fill(String(survey.after.n));
  await up.getByLabel("Instrument (make and model)").fill("Demo total station TS-1");
  await up.getByLabel("Serial number").fill("KF-TS-0412");
  await up.getByLabel("Calibration date").fill("2026-03-02");
  await up.getByLabel("Stated horizontal precision (mm)").fill("2");
  await up.getByLabel("Surveyor").fill("Tamsin Rook");
  // The dead and not-found plants are rows of the file's status column (no position), not typed into the form.
  expect(survey.missing.length).toBeGreaterThan(0);
  await up.getByRole("button", { name: "Upload survey" }).click();
  const surveyed = tech.getByTestId("plan-surveys").locator("li", { hasText: FILE });
  await expect(surveyed.getByTestId("coverage-surveyed")).toContainText(
    `${points.filter((p) => !p.spare).length - survey.missing.length} of ${points.filter((p) => !p.spare).length} planned checkpoints surveyed`,
  );
  const first = survey.missing[0];
  await expect(surveyed.getByTestId("coverage")).toContainText(
    `${first.name} ${first.status} (line ${survey.csv.split("\n").findIndex((l) => l.startsWith(`${first.name},`)) + 1})`,
  );
  await expect(surveyed.getByTestId("mark-check")).toHaveAttribute("data-word", "meets");

  // The technician runs the audit and submits it; the result page splits the unpaired points by the plan.
  const datasets = (await (await tech.request.get(`/api/fields/${fieldId}/datasets`)).json()).datasets as {
    id: string;
    kind: string;
    fileName: string;
  }[];
  const planted = datasets.find((d) => d.kind === "planted")!;
  const surveyDs = datasets.find((d) => d.fileName === FILE)!;
  const profile = (await api.profiles()).find((p) => p.name === "Inter-row hoeing")!;
  const created = await tech.request.post("/api/audits?wait=1", {
    data: {
      fieldId,
      plantedDatasetId: planted.id,
      surveyDatasetId: surveyDs.id,
      profileId: profile.id,
      title: "Willow planned check",
    },
  });
  expect(created.status(), await created.text()).toBe(201);
  const audit = (await created.json()).audit;
  expect((await tech.request.post(`/api/audits/${audit.id}/submit`, { data: {} })).status()).toBe(200);
  await tech.goto(`/audits/${audit.id}`);
  const panel = tech.getByTestId("audit-plan-panel");
  await expect(panel).toContainText(PLAN);
  const notSampled = Number(((await panel.getByTestId("split-not-sampled").textContent()) ?? "").replace(/\D/g, ""));
  const sampledNotFound = Number(
    ((await panel.getByTestId("split-sampled-not-found").textContent()) ?? "").replace(/\D/g, ""),
  );
  expect(notSampled + sampledNotFound).toBe(audit.summary.unmatchedPlanted);
  expect(sampledNotFound).toBe(survey.missing.length);
  await expect(panel.getByTestId("split-surveyed-no-record")).toHaveText("0");

  // The QA lead's sign-off checklist shows the recorded control-mark check instead of a tick-box.
  await page.goto(`/audits/${audit.id}/review`);
  const evidence = page.getByTestId("signoff-form").getByTestId("control-mark-evidence");
  await expect(evidence).toHaveAttribute("data-word", "meets");
  await expect(evidence).toContainText("WS-CM1: before");
  await expect(evidence).toContainText("Demo total station TS-1, serial KF-TS-0412, calibrated 2026-03-02");
  await expect(page.getByTestId("signoff-form").getByRole("checkbox", { name: /Control mark checked/ })).toHaveCount(0);
});
