import { test, expect } from "@playwright/test";
import { SignInPage, demoPerson, otherOwner } from "./pages/session";
import { pageFor } from "./pages/review";
import { AuditApi } from "./pages/audit";
import { createDemoAudit, differingPixels, HIGHLIGHT, MapPage, VIRIDIS_LOW } from "./pages/map";
import { bigAsPlanted } from "./pages/big-file";
import { DEMO_PASSWORD } from "@/lib/demo/farm";
import { decodeMapPayload } from "@/lib/map/binary";
import { PAIR_FLAG } from "@/lib/map/types";
import type { Page as ResidualPage, ResidualRowDto } from "@/lib/api-types";
import type { FieldMapDto } from "@/lib/map/types";

// The technician creates the audit; the grower and the other organisation then open it, so the tests run in order.
test.describe.configure({ mode: "serial" });
test.use({ viewport: { width: 1400, height: 1100 } });

let auditId = "";
let fieldId = "";

async function outOfTolerance(
  page: import("@playwright/test").Page,
  id: string,
  bed?: string,
): Promise<ResidualPage<ResidualRowDto>> {
  const q = new URLSearchParams({ only: "out", sort: "radial", dir: "desc", pageSize: "500", ...(bed ? { bed } : {}) });
  const res = await page.request.get(`/api/audits/${id}/residuals?${q}`);
  expect(res.status()).toBe(200);
  return res.json();
}

test("map -- out-of-tolerance plants are drawn in the highlight colour, and filters change what is drawn", async ({
  page,
}) => {
  test.setTimeout(180_000);
  await new SignInPage(page).signInAs("technician");
  const audit = await createDemoAudit(page);
  auditId = audit.id;
  fieldId = audit.field.id;
  const summary = audit.summary!;
  const out = await outOfTolerance(page, auditId);
  expect(out.total).toBe(summary.withinTolerance!.n - summary.withinTolerance!.within);
  expect(out.total).toBeGreaterThan(0);

  // The points reach the browser as one binary payload of typed arrays.
  const res = await page.request.get(`/api/audits/${auditId}/map-data`);
  expect(res.status()).toBe(200);
  expect(res.headers()["content-type"]).toBe("application/octet-stream");
  const payload = decodeMapPayload(new Uint8Array(await res.body()));
  expect(payload.meta.pairs).toBe(summary.pairs);
  expect(payload.meta.crs).toBe("EPSG:25831");
  expect(payload.arrays.pairXY).toBeInstanceOf(Float32Array);
  const flaggedOut = Array.from(payload.arrays.pairFlags).filter(
    (f) => f & PAIR_FLAG.WITHIN_KNOWN && !(f & PAIR_FLAG.WITHIN),
  ).length;
  expect(flaggedOut).toBe(out.total);
  expect(payload.meta.unpaired).toBe(summary.unmatchedPlanted + summary.unmatchedSurvey + summary.ambiguousSurvey);

  const map = new MapPage(page);
  await map.openAudit(auditId);
  await expect(map.root).toHaveAttribute("data-pairs-shown", String(summary.pairs));
  await expect(map.root).toHaveAttribute("data-out-shown", String(out.total));
  await expect(map.status).toContainText(
    `Showing ${summary.pairs} of ${summary.pairs} checkpoints, ${out.total} out of tolerance`,
  );
  await expect(page.getByTestId("legend-error")).toContainText("limit of the profile: 10 mm");
  await expect(page.getByTestId("north-arrow")).toContainText("grid north of EPSG:25831");
  await expect(page.getByTestId("scale-bar")).toContainText(/\d+ (m|cm)/);

  // Every out-of-tolerance plant carries a red ring: clearly more highlight pixels than plants.
  const allOut = await map.countColour(HIGHLIGHT);
  expect(allOut).toBeGreaterThan(out.total * 10);
  const before = await map.canvasPixels();

  // A bed without any plant out of tolerance: the highlight disappears.
  const beds = payload.meta.dict.bed;
  const outBeds = new Set(out.rows.map((r) => r.bed));
  const clean = beds.find((b) => !outBeds.has(b));
  expect(clean, "a bed with every checkpoint within tolerance").toBeTruthy();
  await map.filter("Bed", clean!);
  await expect(map.root).toHaveAttribute("data-out-shown", "0");
  expect(await map.countColour(HIGHLIGHT)).toBeLessThan(5);
  const cleanShot = await map.canvasPixels();
  expect(differingPixels(before, cleanShot)).toBeGreaterThan(1000);

  // Bed 3, with the RTK-float stretch (public/demo/README.md): its out-of-tolerance plants are highlighted again.
  const bed3 = await outOfTolerance(page, auditId, "3");
  expect(bed3.total).toBeGreaterThan(0);
  await map.filter("Bed", "3");
  await expect(map.root).toHaveAttribute("data-out-shown", String(bed3.total));
  expect(await map.countColour(HIGHLIGHT)).toBeGreaterThan(bed3.total * 10);

  // Only out of tolerance: the within-tolerance plants and the unpaired points go, the highlight stays.
  const bed3Shot = await map.canvasPixels();
  await map.control("Only out of tolerance").check();
  await map.settled();
  await expect(map.root).toHaveAttribute("data-pairs-shown", String(bed3.total));
  await expect(map.root).toHaveAttribute("data-unpaired-shown", "0");
  expect(differingPixels(bed3Shot, await map.canvasPixels())).toBeGreaterThan(500);
  expect(await map.countColour(HIGHLIGHT)).toBeGreaterThan(bed3.total * 10);

  // Keyboard path to the largest error: the side panel shows that plant's record, survey point and residual.
  await page.getByRole("button", { name: "Clear filters" }).click();
  await map.settled();
  await page.getByTestId("next-out").focus();
  await page.keyboard.press("Enter");
  await expect(map.details).toBeVisible();
  const worst = out.rows[0];
  await expect(page.getByTestId("details-pair")).toHaveAttribute("data-seq", String(worst.seq));
  await expect(map.details).toContainText(worst.plantId ?? "–");
  await expect(map.details).toContainText("out of tolerance");
  await expect(map.details).toContainText("Survey point");
  await expect(map.details).toContainText(worst.surveyE.toFixed(3));
  await page.keyboard.press("Escape");
  await expect(map.details).toHaveCount(0);

  // The cell layer for growers replaces the plants; a plant's details left open close with the switch.
  await page.getByTestId("next-out").focus();
  await page.keyboard.press("Enter");
  await expect(map.details).toBeVisible();
  await page.getByTestId("layer-cells").click();
  await expect(map.details).toHaveCount(0);
  await map.settled();
  await expect(map.root).toHaveAttribute("data-layer", "cells");
  expect(await map.countColour(HIGHLIGHT)).toBeLessThan(5);
});

test("map -- the grower's field view: heatmap, guidance per bed and the record-accuracy reminder", async ({
  page,
  browser,
}) => {
  test.setTimeout(120_000);
  expect(auditId, "the technician's audit").not.toBe("");
  await new SignInPage(page).signInAs("grower");
  // Not signed off yet: the grower's view never uses it, only says it is waiting.
  const before = (await (await page.request.get(`/api/fields/${fieldId}/map`)).json()) as FieldMapDto;
  expect(before.audit?.id).not.toBe(auditId);
  expect(before.pending).not.toBeNull();
  await page.goto(`/fields/${fieldId}/map`);
  await expect(page.getByTestId("field-map-page")).toContainText("is waiting for sign-off");
  if (before.audit) await expect(page.getByTestId("field-map-audit")).not.toHaveAttribute("data-audit-id", auditId);
  await page.goto("/");
  await expect(page.locator(`[data-field-id="${fieldId}"]`)).not.toHaveAttribute("data-signed-audit", auditId);

  // The technician submits it and the QA lead signs it off (with deviation: bed 3 fails in-row weeding).
  const tech = await pageFor(browser, "technician");
  expect((await tech.request.post(`/api/audits/${auditId}/submit`, { data: {} })).status()).toBe(200);
  const lead = await pageFor(browser, "qa_lead");
  const signed = await lead.request.post(`/api/audits/${auditId}/signoff`, {
    data: {
      checklist: { checkpoints: true, instrument: true, controlMark: true, profileFits: true },
      comment: "Known float stretch in bed 3; accepted for the record.",
      typedName: demoPerson("qa_lead").name,
    },
  });
  expect(signed.status(), await signed.text()).toBe(201);

  const res = await page.request.get(`/api/fields/${fieldId}/map`);
  expect(res.status()).toBe(200);
  const view = (await res.json()) as FieldMapDto;
  expect(view.audit?.id).toBe(auditId);
  expect(view.summary).toMatch(
    /This map shows how accurate the plant records are, not whether a machine is safe to run\.$/,
  );
  const bed3 = view.guidance.find((g) => g.bed === "3")!;
  expect(bed3.state).toBe("not-relied-on");

  const map = new MapPage(page);
  await map.openField(fieldId);
  await expect(map.root).toHaveAttribute("data-layer", "cells");
  await expect(page.getByTestId("field-guidance")).toHaveText(view.summary);
  await expect(page.getByTestId("bed-guidance").locator('li[data-bed="3"]')).toHaveText(bed3.line);
  await expect(page.locator('[data-testid="bed-row"][data-bed="3"]')).toHaveAttribute("data-state", "not-relied-on");
  await expect(page.getByTestId("legend-share")).toBeVisible();
  // Cells where no checkpoint is out of tolerance take viridis' lowest colour.
  expect(await map.countColour(VIRIDIS_LOW)).toBeGreaterThan(2000);
  // Growers change nothing: the map has no controls that write.
  await expect(page.getByRole("button", { name: /delete|sign off|run/i })).toHaveCount(0);
});

test("map -- refused outside the audit's organisation and without a session", async ({ page, browser }) => {
  expect(auditId, "the technician's audit").not.toBe("");
  const anonymous = await browser.newContext();
  expect((await anonymous.request.get(`/api/audits/${auditId}/map-data`)).status()).toBe(401);
  expect((await anonymous.request.get(`/api/fields/${fieldId}/map`)).status()).toBe(401);
  await anonymous.close();

  await page.goto("/login");
  await new SignInPage(page).signIn(otherOwner.email, DEMO_PASSWORD);
  await expect(page.getByTestId("home-owner")).toBeVisible();
  for (const url of [
    `/api/audits/${auditId}/map-data`,
    `/api/audits/${auditId}/map-data?pair=0`,
    `/api/fields/${fieldId}/map`,
  ]) {
    const res = await page.request.get(url);
    expect(res.status(), url).toBe(404);
    expect(await res.json()).toMatchObject({ error: { code: "not_found" } });
  }
  const mapPage = await page.goto(`/audits/${auditId}/map`);
  expect(mapPage?.status()).toBe(404);
  await expect(page.getByTestId("not-found")).toBeVisible();
  await expect(page.getByTestId("field-map")).toHaveCount(0);
  const fieldPage = await page.goto(`/fields/${fieldId}/map`);
  expect(fieldPage?.status()).toBe(404);

  // Their own field has no audit; its grower view says so instead of showing someone else's.
  const own = await new AuditApi(page).fieldId("Saltings Trial Plot");
  await page.goto(`/fields/${own}/map`);
  await expect(page.getByTestId("field-map-page")).toContainText(
    "No audit of Saltings Trial Plot has been signed off yet",
  );
});

test("map -- opened while its audit is still computing, it shows the progress and then the map", async ({ page }) => {
  test.setTimeout(300_000);
  await new SignInPage(page).signInAs("technician");
  const api = new AuditApi(page);
  // A field of its own, so the other tests' "latest audit of Long Acre" stays what they expect.
  const made = await page.request.post("/api/fields", {
    data: { name: `Great Drove ${Date.now()}`, farm: "Kestrel Fen", crs: "EPSG:25831", timeZone: "Europe/Amsterdam" },
  });
  expect(made.status(), await made.text()).toBe(201);
  const field = ((await made.json()) as { field: { id: string } }).field.id;
  // 100,000 plants, every one surveyed (the same positions, paired by plant id): storing the rows takes several seconds.
  const buffer = bigAsPlanted(100_000);
  const upload = async (kind: "planted" | "survey") => {
    const res = await page.request.post(`/api/fields/${field}/datasets`, {
      multipart: {
        file: { name: `great-drove-${kind}.csv`, mimeType: "text/csv", buffer },
        kind,
        crs: "EPSG:4326",
        acceptWarnings: "true",
      },
      timeout: 120_000,
    });
    expect(res.status(), await res.text()).toBe(201);
    return ((await res.json()) as { dataset: { id: string } }).dataset.id;
  };
  const plantedDatasetId = await upload("planted");
  const surveyDatasetId = await upload("survey");
  const profile = (await api.profiles()).find((p) => p.name === "Inter-row hoeing")!;
  const res = await page.request.post("/api/audits", {
    data: {
      fieldId: field,
      plantedDatasetId,
      surveyDatasetId,
      profileId: profile.id,
      title: "Great Drove while computing",
    },
  });
  expect(res.status()).toBe(202);
  const { audit } = (await res.json()) as { audit: { id: string } };

  await page.goto(`/audits/${audit.id}/map`);
  await expect(page.getByTestId("map-waiting")).toBeVisible();
  await expect(page.getByTestId("audit-progress")).toBeVisible();
  await expect(page.getByTestId("map-error")).toHaveCount(0);
  // No reload: the page polls and draws the map once the audit has finished.
  const map = new MapPage(page);
  await expect(map.root).toBeVisible({ timeout: 240_000 });
  await expect(map.root).toHaveAttribute("data-pairs-shown", "100000");
});
