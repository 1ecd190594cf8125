import { createHash } from "node:crypto";
import { expect, test } from "@playwright/test";
import { bigAsPlanted } from "./pages/big-file";
import { SignInPage } from "./pages/session";
import { UploadPage } from "./pages/upload";

// Files above 10 MB used to reach the upload route cut off by Next's proxy copy ("Unexpected end of form"), although
// the product accepts up to 300 MB. The route now bypasses the proxy and refuses cross-site requests itself.

test("large upload -- a 13 MB as-planted file is saved whole from the browser, byte for byte", async ({ page }) => {
  test.setTimeout(300_000);
  await new SignInPage(page).signInAs("technician");
  const created = await page.request.post("/api/fields", {
    data: {
      name: "Sluice Ground",
      farm: "Kestrel Fen",
      crs: "EPSG:25831",
      timeZone: "Europe/London",
      rowBearingDeg: 0,
    },
  });
  expect(created.status()).toBe(201);
  const fieldId = (await created.json()).field.id as string;
  const file = { name: "sluice-ground-160k.csv", mimeType: "text/csv", buffer: bigAsPlanted(160_000) };
  expect(file.buffer.length).toBeGreaterThan(12 * 1024 * 1024);

  const upload = new UploadPage(page);
  await upload.open(fieldId, "planted");
  await upload.choose(file);
  await upload.save();
  await expect(upload.saved).toBeVisible({ timeout: 280_000 });
  await expect(page.getByTestId("saved-rows")).toHaveText("160,000");

  const field = await (await page.request.get(`/api/fields/${fieldId}`)).json();
  const [dataset] = field.datasets as { id: string; sha256: string }[];
  expect(dataset.sha256).toBe(createHash("sha256").update(file.buffer).digest("hex"));
  const raw = await page.request.get(`/api/datasets/${dataset.id}/file`);
  expect(raw.status()).toBe(200);
  expect(
    createHash("sha256")
      .update(await raw.body())
      .digest("hex"),
  ).toBe(dataset.sha256);
});

test("large upload -- the upload route still refuses a cross-site POST carrying the technician's cookie", async ({
  page,
}) => {
  await new SignInPage(page).signInAs("technician");
  const fields = (await (await page.request.get("/api/fields")).json()).fields as { id: string; name: string }[];
  const fieldId = fields.find((f) => f.name === "Long Acre")!.id;
  const before = (await (await page.request.get(`/api/fields/${fieldId}`)).json()).datasets.length;
  const attack = await page.request.post(`/api/fields/${fieldId}/datasets`, {
    headers: { origin: "http://evil.example" },
    multipart: {
      file: { name: "x.csv", mimeType: "text/csv", buffer: Buffer.from("plant_id,lat,lon\nA,52,0\n") },
      kind: "planted",
    },
  });
  expect(attack.status()).toBe(403);
  expect((await attack.json()).error.message).toContain("http://evil.example");
  expect((await (await page.request.get(`/api/fields/${fieldId}`)).json()).datasets.length).toBe(before);
});
