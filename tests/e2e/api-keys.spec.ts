import fs from "node:fs";
import path from "node:path";
import { test, expect } from "@playwright/test";
import { SignInPage } from "./pages/session";
import { ApiKeysPage } from "./pages/api-keys";

const NAME = "Planter nightly push";

test("api keys -- owner makes an upload-only key with an expiry; it uploads a file and cannot create an audit", async ({
  page,
  request,
}) => {
  test.setTimeout(120_000);
  await new SignInPage(page).signInAs("owner");
  const keysPage = new ApiKeysPage(page);
  await keysPage.open();

  const expiresOn = new Date(Date.now() + 90 * 86_400_000).toISOString().slice(0, 10);
  const key = await keysPage.create(NAME, { scope: "Upload only", expiresOn });
  const row = keysPage.row(NAME);
  await expect(row).toContainText("Upload only");
  await expect(row).toContainText(`expires ${expiresOn}`);
  await expect(row).toContainText("live");

  // The key on its own, as a script would send it: no browser session.
  const auth = { authorization: `Bearer ${key}` };
  const fields = await request.get("/api/fields", { headers: auth });
  expect(fields.status()).toBe(200);
  const longAcre = ((await fields.json()).fields as { id: string; name: string }[]).find(
    (f) => f.name === "Long Acre",
  )!;

  const upload = await request.post(`/api/fields/${longAcre.id}/datasets`, {
    headers: auth,
    multipart: {
      file: {
        name: "long-acre-as-planted.csv",
        mimeType: "text/csv",
        buffer: fs.readFileSync(path.join(process.cwd(), "public/demo/long-acre-as-planted.csv")),
      },
      kind: "planted",
      crs: "EPSG:4326",
      acceptWarnings: "true",
    },
  });
  expect(upload.status()).toBe(201);
  expect((await upload.json()).dataset.rowCount).toBe(4800);

  const audit = await request.post("/api/audits", { headers: auth, data: { fieldId: longAcre.id } });
  expect(audit.status()).toBe(403);
  expect((await audit.json()).error.message).toContain('scope "upload"');

  // The list now shows when the key was last used.
  await page.reload();
  await expect(row).not.toContainText("never");
});
