import fs from "node:fs/promises";
import { expect, type Page, test } from "@playwright/test";
import sharp from "sharp";
import { DEMO_FIELDS } from "@/lib/demo/farm";
import { generatePlanSurvey, PLAN_DEMO_NAME, readStakeoutCsv } from "@/lib/demo/plan-demo";
import type { SurveyPlanDto, SurveyRecordDto } from "@/lib/plan/dto";
import { SignInPage } from "./pages/session";
import { AuditApi } from "./pages/audit";
import { pageFor } from "./pages/review";
import { UploadPage } from "./pages/upload";

const WILLOW = DEMO_FIELDS.find((f) => f.name === "Willow Strip")!;
// The e2e database outlives a run: names carry the run so a second run does not meet the first one's plan.
const RUN = Date.now().toString(36);
const PLAN = `Idris weekly check ${RUN}`;
const FILE = `willow-check-${RUN}.csv`;
const GENERAL_FILE = `willow-general-${RUN}.csv`;
/** The server's message for a control mark chosen without its measurement (lib/validation/plan.ts). */
const NO_BEFORE = "fieldwork.before: give the control mark as measured before the survey";

/** Pixels of the plan map's canvas within `tolerance` of `rgb` (read from a screenshot of its area). */
async function countCanvasColour(page: Page, rgb: [number, number, number], tolerance = 14): Promise<number> {
  const frame = page.getByTestId("plan-map-frame");
  await frame.scrollIntoViewIfNeeded();
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  const box = await frame.locator("canvas").boundingBox();
  expect(box).not.toBeNull();
  const png = await page.screenshot({ clip: box! });
  const { data, info } = await sharp(png).raw().toBuffer({ resolveWithObject: true });
  let n = 0;
  for (let i = 0; i < data.length; i += info.channels)
    if (
      Math.abs(data[i] - rgb[0]) <= tolerance &&
      Math.abs(data[i + 1] - rgb[1]) <= tolerance &&
      Math.abs(data[i + 2] - rgb[2]) <= tolerance
    )
      n++;
  return n;
}

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
  const planUrl = page.url();

  // The plan on the field's map: records faint, checkpoints, spares and the control mark, with the counts as text.
  const map = page.getByTestId("plan-map");
  await expect(map).toBeVisible();
  await page.waitForFunction(
    () => Number(document.querySelector<HTMLElement>('[data-testid="plan-map"]')?.dataset.draws) > 0,
    null,
    { timeout: 30_000 },
  );
  await page.evaluate(() => new Promise((r) => requestAnimationFrame(() => requestAnimationFrame(r))));
  const nCheck = Number(await map.getAttribute("data-checkpoints"));
  const nSpare = Number(await map.getAttribute("data-spares"));
  const nRecords = Number(await map.getAttribute("data-records"));
  expect(nCheck).toBeGreaterThanOrEqual(59);
  expect(nSpare).toBeGreaterThan(0);
  expect(nRecords).toBeGreaterThan(nCheck + nSpare);
  await expect(page.getByTestId("plan-map-summary")).toContainText(
    `${nRecords} as-planted records (faint dots), ${nCheck} planned checkpoints (filled green discs), ${nSpare} spares (hollow brown diamonds) and 1 control mark (black triangles: WS-CM1)`,
  );
  await expect(page.getByTestId("plan-map-key")).toContainText("spare");
  // Drawn in the plan's own colours: leaf discs, loam diamonds, the ink triangle of the mark.
  expect(await countCanvasColour(page, [47, 107, 69])).toBeGreaterThan(nCheck * 10);
  expect(await countCanvasColour(page, [122, 75, 42])).toBeGreaterThan(nSpare * 5);
  expect(await countCanvasColour(page, [29, 42, 36], 10)).toBeGreaterThan(40);
  // Keyboard: Tab reaches the map after the stakeout links (one tab stop, named); minus zooms out (the scale bar
  // grows); the next Tab reaches the view buttons.
  const canvas = page.getByRole("img", { name: /^Map of the plan on Willow Strip: / });
  await page.getByRole("link", { name: "Field sheet (A4)" }).focus();
  await page.keyboard.press("Tab");
  await expect(canvas).toBeFocused();
  const scale = page.getByTestId("plan-map").getByTestId("scale-bar");
  const metresBefore = Number(await scale.getAttribute("data-metres"));
  await page.keyboard.press("-");
  await expect.poll(async () => Number(await scale.getAttribute("data-metres"))).toBeGreaterThan(metresBefore);
  await page.keyboard.press("Tab");
  await expect(page.getByRole("button", { name: "Fit to plan" })).toBeFocused();

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
  // The map is a client island: once it shows, the page is hydrated and the upload form answers in place.
  await expect(tech.getByTestId("plan-map")).toBeVisible({ timeout: 30_000 });
  const up = tech.getByTestId("plan-survey-form");
  await up.getByLabel(/Survey file/).setInputFiles({
    name: FILE,
    mimeType: "text/csv",
    buffer: Buffer.from(survey.csv),
  });
  // The mark is chosen but not its measurement: the server's message, nothing saved.
  await up.getByRole("button", { name: "Upload survey" }).click();
  await expect(up.getByRole("alert")).toContainText(NO_BEFORE);
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

test("survey upload -- the technician records the plan, control mark and instrument on the general upload screen", async ({
  page,
}) => {
  test.setTimeout(180_000);
  await new SignInPage(page).signInAs("technician");
  const api = new AuditApi(page);
  const fieldId = await api.fieldId("Willow Strip");
  const plans = (await (await page.request.get(`/api/fields/${fieldId}/plans`)).json()).plans as SurveyPlanDto[];
  const plan = plans.find((p) => p.name === PLAN_DEMO_NAME)!;
  const points = readStakeoutCsv(await (await page.request.get(`/api/plans/${plan.id}/stakeout.csv`)).text());
  const survey = generatePlanSurvey(WILLOW, points, 5151);
  expect(survey.missing.length).toBeGreaterThan(0);

  const upload = new UploadPage(page);
  await upload.open(fieldId, "survey");
  await upload.choose({ name: GENERAL_FILE, mimeType: "text/csv", buffer: Buffer.from(survey.csv) });
  const work = page.getByTestId("upload-fieldwork");
  await work.getByText("Survey plan, control mark and instrument (optional)").click();
  await work
    .getByLabel("Survey plan this survey was made from")
    .selectOption({ label: `${plan.name} (${plan.checkpoints} checkpoints)` });
  await work.getByLabel("Control mark", { exact: true }).selectOption({ index: 1 });
  // The same check and message as the plan page's upload: a mark without its measurement is refused.
  await upload.save();
  await expect(page.locator("[data-form-error]")).toContainText(NO_BEFORE);
  await expect(page.locator("[data-form-error]")).toContainText("Nothing was saved.");

  await work.getByLabel("Before: measured easting (m)").fill(String(survey.before.e));
  await work.getByLabel("Before: measured northing (m)").fill(String(survey.before.n));
  await work.getByLabel("After: measured easting (m)").fill(String(survey.after.e));
  await work.getByLabel("After: measured northing (m)").fill(String(survey.after.n));
  await work.getByLabel("Instrument (make and model)").fill("Demo total station TS-2");
  await work.getByLabel("Serial number").fill("KF-TS-0977");
  await work.getByLabel("Calibration date").fill("2026-02-11");
  await work.getByLabel("Stated horizontal precision (mm)").fill("2");
  await work.getByLabel("Surveyor").fill("Tamsin Rook");
  await work.getByLabel("Method").fill("Total station, general upload");
  await upload.save();
  await expect(upload.saved.or(upload.warnings)).toBeVisible({ timeout: 60_000 });
  if (await upload.warnings.isVisible()) await upload.acceptWarningsAndSave();
  await expect(upload.saved).toBeVisible({ timeout: 60_000 });

  // The survey is recorded against the plan, with the control-mark check and the file's dead / not-found rows.
  const datasets = (await (await page.request.get(`/api/fields/${fieldId}/datasets`)).json()).datasets as {
    id: string;
    fileName: string;
  }[];
  const saved = datasets.find((d) => d.fileName === GENERAL_FILE)!;
  const { record } = (await (await page.request.get(`/api/datasets/${saved.id}/survey-record`)).json()) as {
    record: SurveyRecordDto;
  };
  expect(record.planName).toBe(PLAN_DEMO_NAME);
  expect(record.instrumentCheck!.word).toBe("meets");
  expect(record.instrument).toBe("Demo total station TS-2");
  expect(record.surveyor).toBe("Tamsin Rook");
  expect(record.coverage!.checkpointsSurveyed).toBe(plan.checkpoints - survey.missing.length);
  for (const m of survey.missing)
    expect(record.coverage!.missing.find((x) => x.name === m.name)).toMatchObject({ status: m.status });

  // The plan page lists it with its coverage and the mark check.
  await page.goto(`/plans/${plan.id}`);
  const listed = page.getByTestId("plan-surveys").locator("li", { hasText: GENERAL_FILE });
  await expect(listed.getByTestId("coverage-surveyed")).toContainText(
    `${plan.checkpoints - survey.missing.length} of ${plan.checkpoints} planned checkpoints surveyed`,
  );
  await expect(listed.getByTestId("mark-check")).toHaveAttribute("data-word", "meets");
});
