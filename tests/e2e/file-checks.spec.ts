import { test, expect, type APIRequestContext } from "@playwright/test";
import { SignInPage } from "./pages/session";
import { UploadPage } from "./pages/upload";

// The form fills the time zone from the browser's own.
test.use({ timezoneId: "Europe/Amsterdam" });

async function newField(request: APIRequestContext, name: string): Promise<string> {
  const res = await request.post("/api/fields", {
    data: { name, farm: "Kestrel Fen", crs: "EPSG:25831", timeZone: "Europe/Amsterdam" },
  });
  expect(res.status()).toBe(201);
  return (await res.json()).field.id as string;
}

async function fileCount(request: APIRequestContext, fieldId: string): Promise<number> {
  return ((await (await request.get(`/api/fields/${fieldId}`)).json()).datasets as unknown[]).length;
}

/** An as-planted file written by a Windows spreadsheet: Windows-1252, "Rübe" on line 5. */
const TEXT =
  "plant_id,crop,bed,row,lat,lon\n" +
  "FC-1,lettuce,1,1,52.51800,5.39400\n" +
  "FC-2,lettuce,1,1,52.51801,5.39401\n" +
  "FC-3,lettuce,1,1,52.51802,5.39402\n" +
  "FC-4,Rübe,1,2,52.51803,5.39403\n";
const LATIN1 = { name: "ruebe-export.csv", mimeType: "text/csv", buffer: Buffer.from(TEXT, "latin1") };

test("file checks -- technician sees the Latin-1 notice with file and line, then the notice of the same file uploaded before", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Tansy Strip");
  const upload = new UploadPage(page);
  await upload.open(fieldId, "planted");
  await upload.choose(LATIN1);
  // The browser's preview decodes the file as the server will: no replacement characters.
  await expect(upload.previewTable).toContainText("Rübe");
  await expect(upload.role("Latitude")).toHaveValue("lat");
  await upload.save();

  // Held back: the warning names the encoding, the file, the line and what is there.
  await expect(upload.warnings).toBeVisible({ timeout: 30_000 });
  const notice = page.getByTestId("warning-table").locator("tbody tr", { hasText: "Windows-1252" });
  await expect(notice).toHaveAttribute("data-line", "5");
  await expect(notice).toContainText("ruebe-export.csv");
  await expect(notice).toContainText("Rübe");
  expect(await fileCount(page.request, fieldId)).toBe(0);

  await upload.acceptWarningsAndSave();
  await expect(upload.saved).toBeVisible({ timeout: 30_000 });
  expect(await fileCount(page.request, fieldId)).toBe(1);

  // The same bytes again, under another name: the earlier upload is named with its date.
  await page.getByRole("button", { name: "Upload another file of as-planted records" }).click();
  await upload.choose({ ...LATIN1, name: "ruebe-export (1).csv" });
  await upload.save();
  await expect(upload.warnings).toBeVisible({ timeout: 30_000 });
  const earlier = page.getByTestId("warning-table").locator("tbody tr", { hasText: "already uploaded" });
  await expect(earlier).toContainText("ruebe-export (1).csv");
  await expect(earlier).toContainText(/as "ruebe-export\.csv" \(as-planted records\) on \d{4}-\d\d-\d\d \d\d:\d\d UTC/);
  expect(await fileCount(page.request, fieldId)).toBe(1);
});

test("file checks -- a file with a 2 MB value is refused naming line and column, and nothing is saved", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("technician");
  const fieldId = await newField(page.request, "Teasel Row");
  const upload = new UploadPage(page);
  await upload.open(fieldId, "planted");
  const text = `plant_id,lat,lon,crop\nFC-1,52.518,5.394,lettuce\nFC-2,52.518,5.394,${"x".repeat(2 << 20)}\n`;
  await upload.choose({ name: "pasted.csv", mimeType: "text/csv", buffer: Buffer.from(text) });
  await upload.save();
  await expect(upload.invalid).toBeVisible({ timeout: 30_000 });
  const row = upload.errorTable.locator('tbody tr[data-line="3"]');
  await expect(row).toHaveAttribute("data-column", "crop");
  await expect(row).toContainText("at most 1,000");
  expect(await fileCount(page.request, fieldId)).toBe(0);
});
