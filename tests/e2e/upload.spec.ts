import crypto from "node:crypto";
import fs from "node:fs";
import path from "node:path";
import { test, expect, type APIRequestContext } from "@playwright/test";
import { SignInPage } from "./pages/session";
import { FieldFormPage, UploadPage } from "./pages/upload";
import { bigAsPlanted } from "./pages/big-file";

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
    coordinates: [
      [
        [5.393, 52.5175],
        [5.396, 52.5175],
        [5.396, 52.5195],
        [5.393, 52.5195],
        [5.393, 52.5175],
      ],
    ],
  },
};

test("field form -- technician creates Reed Margin with a CRS from the search list and lands on its page", async ({
  page,
}) => {
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
  projected.geometry.coordinates = [
    [
      [317960, 5816690],
      [318050, 5816690],
      [318050, 5816860],
      [317960, 5816690],
    ],
  ];
  await form.boundaryFromFile({
    name: "reed-margin-utm.geojson",
    mimeType: "application/geo+json",
    buffer: Buffer.from(JSON.stringify(projected)),
  });
  await expect(form.fieldError("boundaryFile")).toContainText("not longitude/latitude");
  await form.boundaryFromFile({
    name: "reed-margin.geojson",
    mimeType: "application/geo+json",
    buffer: Buffer.from(JSON.stringify(BOUNDARY)),
  });
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
  expect(saved).toMatchObject({
    name: "Reed Margin",
    crs: "EPSG:25831",
    rowBearingDeg: 22.5,
    bedSpacingM: 3,
    rowsPerBed: 5,
    rowSpacingM: 0.5,
  });
  expect(saved.boundary.coordinates).toEqual(BOUNDARY.geometry.coordinates);
});

test("upload -- the demo as-planted file is previewed, its columns checked, the progress reaches 100 % and the dataset is saved", async ({
  page,
}) => {
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
  await page.getByLabel("Name of the preset").fill("Sedge planter export");
  await upload.save();

  // The file is read and checked; its fix-quality warning has to be accepted before anything is kept.
  await upload.acceptWarningsAndSave();
  await expect(upload.saved).toBeVisible({ timeout: 30_000 });
  await upload.expectComplete();
  await expect(page.getByTestId("saved-rows")).toHaveText("4,800");
  const sha = crypto.createHash("sha256").update(fs.readFileSync(AS_PLANTED)).digest("hex");
  await expect(page.getByTestId("saved-sha")).toHaveText(`${sha.slice(0, 12)}…`);
  await expect(page.getByTestId("saved-warnings")).toHaveText("1");
  await expect(page.getByTestId("kept-warning-table")).toContainText(/fix qualities are mixed/i);
  expect(await fileCount(page.request, fieldId)).toBe(1);

  // The saved mapping is offered, and applied by itself, for the next file with the same columns.
  await page.getByRole("button", { name: "Upload another file of as-planted records" }).click();
  await upload.choose(AS_PLANTED);
  await expect(page.getByTestId("preset-applied")).toContainText("Sedge planter export");

  await page.goto(`/fields/${fieldId}`);
  await expect(page.getByText(/long-acre-as-planted\.csv/)).toBeVisible();
});

test("upload -- the technician says the fix column is not in the file: it is not read, and the saved mapping and preset say so", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Carr Meadow");
  const upload = new UploadPage(page);
  await upload.open(fieldId, "planted");
  await upload.choose(AS_PLANTED);
  const fixHeading = upload.previewTable.locator("thead th").filter({ hasText: /^fix/ });
  await expect(upload.role("GNSS fix")).toHaveValue("fix");
  await expect(fixHeading).toContainText("GNSS fix");

  await upload.role("GNSS fix").selectOption({ label: "— not in this file —" });
  await expect(page.locator("#map-fix-hint")).toHaveText("“fix” is not read.");
  await expect(fixHeading).toContainText("not read");
  await expect(upload.role("Tool arm")).toHaveValue("arm");
  await page.getByLabel("Save this mapping as a preset named").check();
  await page.getByLabel("Name of the preset").fill("Carr planter, fix not trusted");
  await upload.save();

  // With the fix column unread there are no mixed fix qualities to warn about: saved at once.
  await expect(upload.saved).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId("saved-warnings")).toHaveText("0");
  const datasets = (await (await page.request.get(`/api/fields/${fieldId}`)).json()).datasets as {
    mapping: Record<string, string | null>;
  }[];
  expect(datasets).toHaveLength(1);
  expect(datasets[0].mapping).toMatchObject({ fix: null, arm: "arm", id: "plant_id", x: "lon", y: "lat" });

  // The preset brings "not in this file" back for the next file with the same columns (chosen by hand:
  // another test's preset names more columns, so it is the one applied by itself).
  await page.getByRole("button", { name: "Upload another file of as-planted records" }).click();
  await upload.choose(AS_PLANTED);
  await page.getByLabel("Use a saved mapping").selectOption({ label: "Carr planter, fix not trusted" });
  await page.getByRole("button", { name: "Use preset" }).click();
  await expect(page.getByTestId("preset-applied")).toContainText("Carr planter, fix not trusted");
  await expect(upload.role("GNSS fix").locator("option:checked")).toHaveText("— not in this file —");
  await expect(fixHeading).toContainText("not read");
});

test("field form -- editing a field with saved records takes its row bearing and outline from them", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Withy Bed");
  const res = await page.request.post(`/api/fields/${fieldId}/datasets`, {
    multipart: {
      kind: "planted",
      acceptWarnings: "true",
      file: { name: "long-acre-as-planted.csv", mimeType: "text/csv", buffer: fs.readFileSync(AS_PLANTED) },
    },
  });
  expect(res.status()).toBe(201);

  await page.goto(`/fields/${fieldId}/edit`);
  await expect(page.getByRole("heading", { level: 1 })).toHaveText("Edit Withy Bed");
  const form = new FieldFormPage(page);
  await expect(form.name).toHaveValue("Withy Bed");
  await expect(form.crs).toHaveValue("EPSG:25831");
  await form.rowBearing.fill("");
  await page.getByRole("button", { name: "Take from the as-planted records" }).click();
  const bearing = Number(await form.rowBearing.inputValue());
  expect(Math.abs(bearing - 22.5)).toBeLessThan(0.5); // the demo rows run at 22.5°
  await page.getByLabel("Outline of the as-planted records").check();
  await expect(page.getByTestId("boundary-preview")).toBeVisible();
  await form.submit("Save changes");
  await expect(page).toHaveURL(new RegExp(`/fields/${fieldId}$`));
  const saved = (await (await page.request.get(`/api/fields/${fieldId}`)).json()).field;
  expect(saved.rowBearingDeg).toBe(bearing);
  expect(saved.boundary.type).toBe("Polygon");
});

test("upload -- the survey file needs one column corrected, and its warning accepted, before it is saved", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Osier Bank");
  const upload = new UploadPage(page);
  await upload.open(fieldId, "survey");
  // A rover export whose precision column has a name Plotproof does not know.
  const text = fs.readFileSync(SURVEY, "utf8").replace(/^([^\n]*)precision_m/, "$1rover_sd_metres");
  await upload.choose({ name: "osier-bank-survey.csv", mimeType: "text/csv", buffer: Buffer.from(text) });

  await expect(page.getByLabel("Easting and northing (metres)")).toBeChecked();
  await expect(upload.role("Easting")).toHaveValue("easting");
  await expect(upload.role("Northing")).toHaveValue("northing");
  // The field's CRS is the default for easting/northing.
  await expect(page.getByRole("combobox", { name: "Coordinate system of the file" })).toHaveValue("EPSG:25831");
  // "rover_sd_metres" is not a name Plotproof knows: map it by hand.
  await expect(upload.role("Stated precision (m)")).toHaveValue("");
  await upload.role("Stated precision (m)").selectOption("rover_sd_metres");
  await expect(upload.previewTable.locator("thead")).toContainText("Stated precision (m)");

  await upload.save();
  await expect(page.getByTestId("warning-table")).toContainText("have no plant id");
  // Warnings are a caution to read (amber), not a red stop: the server step is shown as paused, not stopped.
  await expect(upload.warnings).toHaveCSS("background-color", "rgb(251, 240, 214)");
  await expect(page.locator('[aria-label="Server steps"] [data-step-state="paused"]')).toHaveCount(1);
  await expect(page.locator('[aria-label="Server steps"] [data-step-state="stopped"]')).toHaveCount(0);
  expect(await fileCount(page.request, fieldId)).toBe(0);
  await expect(page.getByRole("button", { name: "Save with these warnings" })).toBeDisabled();
  await upload.acceptWarningsAndSave();
  await expect(upload.saved).toBeVisible({ timeout: 30_000 });
  await upload.expectComplete();
  const surveyRows =
    fs
      .readFileSync(SURVEY, "utf8")
      .split("\n")
      .filter((l) => l.trim() !== "").length - 1;
  await expect(page.getByTestId("saved-rows")).toHaveText(surveyRows.toLocaleString("en-GB"));

  const datasets = (await (await page.request.get(`/api/fields/${fieldId}`)).json()).datasets as {
    kind: string;
    mapping: Record<string, string>;
  }[];
  expect(datasets).toHaveLength(1);
  expect(datasets[0]).toMatchObject({
    kind: "survey",
    mapping: { precision: "rover_sd_metres", x: "easting", y: "northing" },
  });
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
  const broken = {
    name: "long-acre-as-planted-broken.csv",
    mimeType: "text/csv",
    buffer: Buffer.from(lines.join("\n")),
  };

  const upload = new UploadPage(page);
  await upload.open(fieldId, "planted");
  await upload.chooseWithKeyboard(broken);
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
    multipart: {
      kind: "planted",
      file: { name: "long-acre-as-planted.csv", mimeType: "text/csv", buffer: fs.readFileSync(AS_PLANTED) },
    },
  });
  expect(res.status()).toBe(403);
  expect(await res.json()).toMatchObject({ error: { code: "forbidden" } });
});

test("upload -- 100,000 as-planted rows are saved from the browser with the progress bars moving", async ({ page }) => {
  test.setTimeout(240_000);
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Great Drove");
  const upload = new UploadPage(page);
  await upload.open(fieldId, "planted");
  const file = { name: "great-drove-100k.csv", mimeType: "text/csv", buffer: bigAsPlanted(100_000) };
  await upload.choose(file);
  // Only the first megabyte is read for the preview: the row count is an estimate.
  const estimate = ((await page.getByTestId("preview-facts").textContent()) ?? "").match(/about ([\d,]+)/);
  expect(estimate).not.toBeNull();
  expect(Math.abs(Number(estimate![1].replace(/,/g, "")) - 100_000)).toBeLessThan(5_000);

  // Every value each bar shows, as it changes.
  await page.evaluate(() => {
    const seen: Record<string, string[]> = { transfer: [], server: [] };
    (window as unknown as { __bars: typeof seen }).__bars = seen;
    new MutationObserver(() => {
      for (const [key, id] of [
        ["transfer", "upload-transfer"],
        ["server", "upload-server"],
      ] as const) {
        const v = document.querySelector(`[data-testid="${id}"]`)?.getAttribute("aria-valuenow");
        if (v && seen[key][seen[key].length - 1] !== v) seen[key].push(v);
      }
    }).observe(document.body, { subtree: true, childList: true, attributes: true, attributeFilter: ["aria-valuenow"] });
  });
  const t0 = Date.now();
  await upload.save();
  await expect(upload.saved).toBeVisible({ timeout: 200_000 });
  const seconds = (Date.now() - t0) / 1000;
  await upload.expectComplete();
  await expect(page.getByTestId("saved-rows")).toHaveText("100,000");
  expect(await fileCount(page.request, fieldId)).toBe(1);

  const bars = await page.evaluate(() => (window as unknown as { __bars: Record<string, string[]> }).__bars);
  // The server bar passes through values between 0 and 100 %, and both bars end at 100 %.
  expect(bars.server.filter((v) => Number(v) > 0 && Number(v) < 100).length).toBeGreaterThan(1);
  expect(bars.transfer.at(-1)).toBe("100");
  expect(bars.server.at(-1)).toBe("100");
  test.info().annotations.push({
    type: "timing",
    description: `100,000 rows (${(file.buffer.length / 1024 / 1024).toFixed(1)} MB) saved in ${seconds.toFixed(1)} s; bars: transfer ${bars.transfer.join(" → ")}; server ${bars.server.join(" → ")}`,
  });
  console.log(
    `[upload timing] 100,000 rows, ${(file.buffer.length / 1024 / 1024).toFixed(1)} MB: ${seconds.toFixed(1)} s from "Check and save" to saved`,
  );
});

test("upload -- a GeoJSON survey file is previewed by its features' properties and saved with positions from the geometry", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Lode Piece");
  const [head, ...rows] = fs.readFileSync(SURVEY, "utf8").trim().split("\n");
  const names = head.split(",");
  const at = (cells: string[], name: string) => cells[names.indexOf(name)];
  const features = rows.map((line) => {
    const cells = line.split(",");
    return {
      type: "Feature",
      geometry: { type: "Point", coordinates: [Number(at(cells, "easting")), Number(at(cells, "northing"))] },
      properties: {
        plant_id: at(cells, "plant_id") || null,
        method: at(cells, "method"),
        observed_at: at(cells, "observed_at"),
      },
    };
  });
  const geojson = {
    type: "FeatureCollection",
    crs: { type: "name", properties: { name: "urn:ogc:def:crs:EPSG::25831" } },
    features,
  };

  const upload = new UploadPage(page);
  await upload.open(fieldId, "survey");
  await upload.choose({
    name: "lode-piece-survey.geojson",
    mimeType: "application/geo+json",
    buffer: Buffer.from(JSON.stringify(geojson)),
  });
  await expect(page.getByTestId("preview-facts")).toContainText(`${rows.length}`);
  await expect(page.getByTestId("preview-facts")).toContainText("EPSG:25831");
  await expect(upload.previewTable.locator("thead")).toContainText("plant_id");
  await expect(upload.previewTable).toContainText("LA-1-1-0006");
  await expect(page.getByTestId("geometry-note")).toContainText("Point geometry");
  await expect(page.getByLabel("Easting and northing (metres)")).toBeChecked();
  await expect(upload.role("Plant id")).toHaveValue("plant_id");
  await expect(page.getByRole("combobox", { name: "Coordinate system of the file" })).toHaveValue("EPSG:25831");

  await upload.save();
  await upload.acceptWarningsAndSave();
  await expect(upload.saved).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId("saved-rows")).toHaveText(rows.length.toLocaleString("en-GB"));
  const [dataset] = (await (await page.request.get(`/api/fields/${fieldId}`)).json()).datasets;
  expect(dataset).toMatchObject({ kind: "survey", format: "geojson", crs: "EPSG:25831" });
});
