import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { test, expect, type APIRequestContext } from "@playwright/test";
import { SignInPage } from "./pages/session";
import { FieldFormPage, UploadPage } from "./pages/upload";

const DEMO_DIR = path.join(process.cwd(), "public/demo");
const AS_PLANTED = path.join(DEMO_DIR, "long-acre-as-planted.csv");
const SURVEY = path.join(DEMO_DIR, "long-acre-survey.csv");

// The form fills the time zone from the browser's own.
test.use({ timezoneId: "Europe/Amsterdam" });

/** A fresh field through the API, so each test starts with a field without files. */
async function newField(request: APIRequestContext, name: string): Promise<string> {
  const res = await request.post("/api/fields", {
    data: { name, farm: "Kestrel Fen", crs: "EPSG:25831", timeZone: "Europe/Amsterdam", rowBearingDeg: 22.5 },
  });
  expect(res.status()).toBe(201);
  return (await res.json()).field.id as string;
}

async function fileCount(request: APIRequestContext, fieldId: string): Promise<number> {
  const res = await request.get(`/api/fields/${fieldId}`);
  expect(res.status()).toBe(200);
  return ((await res.json()).datasets as unknown[]).length;
}

/** A small square around the Long Acre plot, WGS 84 (longitude, latitude). */
const BOUNDARY = {
  type: "Feature",
  properties: { name: "Reed Margin" },
  geometry: {
    type: "Polygon",
    coordinates: [[[5.3930, 52.5175], [5.3960, 52.5175], [5.3960, 52.5195], [5.3930, 52.5195], [5.3930, 52.5175]]],
  },
};

test("field form -- technician creates Reed Margin with a CRS from the search list and lands on its page", async ({ page }) => {
  await new SignInPage(page).signInAs("technician");
  const form = new FieldFormPage(page);
  await form.openNew();
  await expect(form.timeZone).toHaveValue("Europe/Amsterdam");

  // Nothing filled in: the form says what is missing, next to each input.
  await form.submit();
  await expect(form.fieldError("name")).toHaveText("Give the field a name.");
  await expect(form.name).toHaveAttribute("aria-describedby", /name-error/);
  await expect(form.fieldError("crs")).toContainText("EPSG code");

  // A name already used by the farm comes back from the server (409) next to the name.
  await form.name.fill("Long Acre");
  await form.farm.fill("Kestrel Fen");
  await form.chooseCrs("25831", "EPSG:25831");
  await expect(page.getByTestId("crs-chosen")).toContainText("UTM zone 31N");
  await form.rowBearing.fill("22,5");
  await form.bedSpacing.fill("3");
  await form.rowsPerBed.fill("5.5");
  await form.rowSpacing.fill("0.5");
  await form.submit();
  await expect(form.fieldError("rowsPerBed")).toContainText("whole number");
  await form.rowsPerBed.fill("5");

  // A boundary in projected metres is refused in the browser; one in longitude/latitude is shown.
  const projected = structuredClone(BOUNDARY);
  projected.geometry.coordinates = [[[662410, 5821330], [662500, 5821330], [662500, 5821500], [662410, 5821330]]];
  await form.boundaryFromFile({ name: "reed-margin-utm.geojson", mimeType: "application/geo+json", buffer: Buffer.from(JSON.stringify(projected)) });
  await expect(form.fieldError("boundaryFile")).toContainText("not longitude/latitude");
  await form.boundaryFromFile({ name: "reed-margin.geojson", mimeType: "application/geo+json", buffer: Buffer.from(JSON.stringify(BOUNDARY)) });
  await expect(form.fieldError("boundaryFile")).toHaveCount(0);
  await expect(page.getByTestId("boundary-preview")).toContainText("4 corners");

  await form.submit();
  await expect(form.fieldError("name")).toContainText('A field named "Long Acre" already exists.');
  await expect(page).toHaveURL(/\/fields\/new$/);

  await form.name.fill("Reed Margin");
  await form.submit();
  await expect(page).toHaveURL(/\/fields\/[0-9a-f-]{36}$/);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Reed Margin");
  await expect(page.getByText("Kestrel Fen · EPSG:25831 · Europe/Amsterdam")).toBeVisible();
  await expect(page.getByText(/rows at 22\.5° from grid north/)).toBeVisible();

  const id = page.url().split("/").pop()!;
  const saved = (await (await page.request.get(`/api/fields/${id}`)).json()).field;
  expect(saved).toMatchObject({ name: "Reed Margin", crs: "EPSG:25831", rowBearingDeg: 22.5, bedSpacingM: 3, rowsPerBed: 5, rowSpacingM: 0.5 });
  expect(saved.boundary.coordinates).toEqual(BOUNDARY.geometry.coordinates);
});

test("upload -- the demo as-planted file is previewed, its columns checked, the progress reaches 100 % and the dataset is saved", async ({ page }) => {
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Sedge Corner");
  const upload = new UploadPage(page);
  await upload.open(fieldId, "planted");
  await upload.choose(AS_PLANTED);

  // Preview, read in the browser before anything is sent.
  await expect(upload.previewTable.locator("tbody tr")).toHaveCount(20);
  await expect(upload.previewTable).toContainText("LA-1-1-0001");
  await expect(page.getByTestId("preview-delimiter")).toHaveText("comma");
  await expect(page.getByTestId("preview-facts")).toContainText("4,800");
  expect(await fileCount(page.request, fieldId)).toBe(0);

  // The engine's guess, as the mapping form shows it.
  await expect(upload.role("Plant id")).toHaveValue("plant_id");
  await expect(upload.role("Latitude")).toHaveValue("lat");
  await expect(upload.role("Longitude")).toHaveValue("lon");
  await expect(upload.role("Planting time")).toHaveValue("planted_at");
  await expect(upload.role("GNSS fix")).toHaveValue("fix");
  await expect(upload.role("Raw GNSS longitude or easting")).toHaveValue("raw_lon");
  await expect(page.getByLabel("Latitude and longitude (degrees)")).toBeChecked();
  await expect(page.getByRole("combobox", { name: "Coordinate system of the file" })).toHaveValue("EPSG:4326");

  // One column cannot play two parts.
  await upload.role("Longitude").selectOption("lat");
  await expect(page.locator('[data-field-error="map-x"]')).toContainText("also chosen as Latitude");
  await expect(page.locator('[data-field-error="map-y"]')).toContainText("also chosen as Longitude");
  await upload.save();
  await expect(upload.transferBar).toHaveCount(0);
  await upload.role("Longitude").selectOption("lon");
  await expect(page.locator('[data-field-error="map-x"]')).toHaveCount(0);
  await expect(page.locator('[data-field-error="map-y"]')).toHaveCount(0);

  await page.getByLabel("Save this mapping as a preset named").check();
  await page.getByLabel("Preset name").fill("Sedge planter export");
  await upload.save();

  // The file is read and checked; its fix-quality warning has to be accepted before anything is kept.
  await upload.acceptWarningsAndSave();
  await expect(upload.saved).toBeVisible({ timeout: 30_000 });
  await upload.expectComplete();
  await expect(page.getByTestId("saved-rows")).toHaveText("4,800");
  const sha = crypto.createHash("sha256").update(fs.readFileSync(AS_PLANTED)).digest("hex");
  await expect(page.getByTestId("saved-sha")).toHaveText(`${sha.slice(0, 12)}…`);
  await expect(page.getByTestId("saved-warnings")).toHaveText("1");
  await expect(page.getByTestId("kept-warning-table")).toContainText("fix qualities are mixed");
  expect(await fileCount(page.request, fieldId)).toBe(1);

  // The saved mapping is offered, and applied by itself, for the next file with the same columns.
  await page.getByRole("button", { name: "Upload another file of as-planted records" }).click();
  await upload.choose(AS_PLANTED);
  await expect(page.getByTestId("preset-applied")).toContainText("Sedge planter export");

  await page.goto(`/fields/${fieldId}`);
  await expect(page.getByText(/long-acre-as-planted\.csv/)).toBeVisible();
});

test("upload -- the survey file needs one column corrected, and its warning accepted, before it is saved", async ({ page }) => {
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Osier Bank");
  const upload = new UploadPage(page);
  await upload.open(fieldId, "survey");
  await upload.choose(SURVEY);

  await expect(page.getByLabel("Easting and northing (metres)")).toBeChecked();
  await expect(upload.role("Easting")).toHaveValue("easting");
  await expect(upload.role("Northing")).toHaveValue("northing");
  // The field's CRS is the default for easting/northing.
  await expect(page.getByRole("combobox", { name: "Coordinate system of the file" })).toHaveValue("EPSG:25831");
  // "precision_m" is not a name Plotproof knows: map it by hand.
  await expect(upload.role("Stated precision (m)")).toHaveValue("");
  await upload.role("Stated precision (m)").selectOption("precision_m");
  await expect(upload.previewTable.locator("thead")).toContainText("Stated precision (m)");

  await upload.save();
  await expect(page.getByTestId("warning-table")).toContainText("have no plant id");
  expect(await fileCount(page.request, fieldId)).toBe(0);
  await expect(page.getByRole("button", { name: "Save with these warnings" })).toBeDisabled();
  await upload.acceptWarningsAndSave();
  await expect(upload.saved).toBeVisible({ timeout: 30_000 });
  await upload.expectComplete();
  const surveyRows = fs.readFileSync(SURVEY, "utf8").split("\n").filter((l) => l.trim() !== "").length - 1;
  await expect(page.getByTestId("saved-rows")).toHaveText(surveyRows.toLocaleString("en-GB"));

  const datasets = (await (await page.request.get(`/api/fields/${fieldId}`)).json()).datasets as { kind: string; mapping: Record<string, string> }[];
  expect(datasets).toHaveLength(1);
  expect(datasets[0]).toMatchObject({ kind: "survey", mapping: { precision: "precision_m", x: "easting", y: "northing" } });
});

test("upload -- a broken file shows line 57 and column lat in the error table and saves nothing", async ({ page }) => {
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Fen Edge");
  const before = await fileCount(page.request, fieldId);

  // Line 1 is the header, so line 57 is the 56th plant; its lat cell becomes text.
  const lines = fs.readFileSync(AS_PLANTED, "utf8").split("\n");
  const header = lines[0].split(",");
  const latAt = header.indexOf("lat");
  const cells = lines[56].split(",");
  cells[latAt] = "fifty-two";
  lines[56] = cells.join(",");
  const broken = { name: "long-acre-as-planted-broken.csv", mimeType: "text/csv", buffer: Buffer.from(lines.join("\n")) };

  const upload = new UploadPage(page);
  await upload.open(fieldId, "planted");
  await upload.choose(broken);
  await upload.save();

  await expect(upload.invalid).toBeVisible({ timeout: 30_000 });
  await expect(upload.invalid.getByRole("heading")).toContainText("Nothing was saved");
  const row = upload.errorTable.locator('tbody tr[data-line="57"][data-column="lat"]');
  await expect(row).toHaveCount(1);
  await expect(row).toContainText("fifty-two");
  await expect(row.locator("td").nth(2)).toHaveText("57");
  await expect(row.locator("td").nth(3)).toHaveText("lat");
  await expect(upload.saved).toHaveCount(0);

  // The problems can be taken away as CSV.
  const [download] = await Promise.all([
    page.waitForEvent("download"),
    page.getByRole("button", { name: "Download errors as CSV" }).click(),
  ]);
  expect(download.suggestedFilename()).toBe("fen-edge-long-acre-as-planted-broken-problems.csv");
  const csv = fs.readFileSync((await download.path())!, "utf8").split("\n");
  expect(csv[0]).toBe("severity,file,line,column,value,expected,code");
  expect(csv.some((l) => l.startsWith("error,long-acre-as-planted-broken.csv,57,lat,fifty-two,"))).toBe(true);

  // Nothing was kept: the field still has as many files as before.
  expect(await fileCount(page.request, fieldId)).toBe(before);
  await page.goto(`/fields/${fieldId}`);
  await expect(page.getByText("No files uploaded for this field yet.")).toBeVisible();
});

test("upload -- a grower sees no create or upload pages, and the API refuses the grower's upload", async ({ page }) => {
  await new SignInPage(page).signInAs("grower");
  const { fields } = await (await page.request.get("/api/fields")).json();
  const longAcre = (fields as { id: string; name: string }[]).find((f) => f.name === "Long Acre")!;

  for (const url of ["/fields/new", `/fields/${longAcre.id}/upload?kind=planted`, `/fields/${longAcre.id}/edit`]) {
    expect((await page.goto(url))?.status()).toBe(403);
    await expect(page.getByTestId("forbidden")).toBeVisible();
    await expect(page.getByLabel("Choose a file or drop it here")).toHaveCount(0);
  }
  const res = await page.request.post(`/api/fields/${longAcre.id}/datasets`, {
    multipart: { kind: "planted", file: { name: "long-acre-as-planted.csv", mimeType: "text/csv", buffer: fs.readFileSync(AS_PLANTED) } },
  });
  expect(res.status()).toBe(403);
  expect(await res.json()).toMatchObject({ error: { code: "forbidden" } });
});
