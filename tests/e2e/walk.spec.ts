import { test, expect, type Page } from "@playwright/test";
import { SignInPage, demoPerson } from "./pages/session";
import { AuditApi } from "./pages/audit";
import { ReviewPage, pageFor } from "./pages/review";
import Papa from "papaparse";
import fs from "node:fs";
import { ApiKeysPage } from "./pages/api-keys";
import type { AuditDto } from "@/lib/api-types";

// What a walk through the product tripped over, as each role sees it: dashboard items are links, a returned audit
// says why on its own page, states read as words, a revision shows its number and profile, times are the field's.
test.describe.configure({ mode: "serial" });

let returned: AuditDto;
let revision: AuditDto;

/** No stored state code shows as text anywhere on the page. */
async function expectNoStateCodes(page: Page) {
  const text = (await page.locator("main").textContent()) ?? "";
  expect(text).not.toContain("signed_off");
  expect(text).not.toMatch(/\((computing|computed|failed|submitted|returned)\)/);
  expect(text).not.toMatch(/· (computing|computed|failed|submitted|returned) ·/);
}

test("walk -- a returned audit shows its reasons; its revision shows number, profile and local times", async ({
  page,
  browser,
}) => {
  test.setTimeout(180_000);
  await new SignInPage(page).signInAs("technician");
  const api = new AuditApi(page);
  const fieldId = await api.fieldId("Long Acre");
  const planted = await api.upload(fieldId, "planted");
  const survey = await api.upload(fieldId, "survey");
  const profiles = await api.profiles();
  const weeding = profiles.find((p) => p.name === "In-row weeding around plants")!;
  const hoeing = profiles.find((p) => p.name === "Inter-row hoeing")!;
  const created = await page.request.post("/api/audits?wait=1", {
    data: {
      fieldId,
      plantedDatasetId: planted.id,
      surveyDatasetId: survey.id,
      profileId: weeding.id,
      title: "Walk check",
    },
  });
  expect(created.status(), await created.text()).toBe(201);
  returned = (await created.json()).audit;
  expect((await page.request.post(`/api/audits/${returned.id}/submit`, { data: {} })).status()).toBe(200);

  // The QA lead's home lists it as a link to its review page.
  const lead = await pageFor(browser, "qa_lead");
  const waiting = lead.getByRole("region", { name: "Waiting for review" });
  await waiting.getByRole("link", { name: "Walk check" }).click();
  await expect(lead).toHaveURL(new RegExp(`/audits/${returned.id}/review$`));
  const back = await lead.request.post(`/api/audits/${returned.id}/return`, {
    data: { reasons: ["wrong_profile", "other"], comment: "Judge it for inter-row hoeing, not in-row weeding." },
  });
  expect(back.status(), await back.text()).toBe(200);
  await lead.context().close();

  // The technician's own page of the returned audit says why, in words.
  await page.goto(`/audits/${returned.id}`);
  await expect(page.getByTestId("audit-state")).toHaveText("Returned for correction");
  const why = page.getByTestId("returned-reasons");
  await expect(why).toContainText("Wrong tolerance profile for the next operation");
  await expect(why).toContainText("Something else (see the comment)");
  await expect(page.getByTestId("returned-comment")).toContainText(
    `${demoPerson("qa_lead").name}: “Judge it for inter-row hoeing, not in-row weeding.”`,
  );
  await expectNoStateCodes(page);

  // The corrected revision against another profile.
  const revised = await page.request.post(`/api/audits/${returned.id}/revise?wait=1`, {
    data: { profileId: hoeing.id },
  });
  expect(revised.status(), await revised.text()).toBe(201);
  revision = (await revised.json()).audit;
  expect(revision.revision).toBe(2);

  await page.goto(`/audits/${revision.id}`);
  await expect(page.getByRole("heading", { level: 1 })).toContainText("revision 2");
  await expect(page.getByTestId("audit-result")).toContainText(`against ${hoeing.name}`);
  // The accuracy statement accounts for the survey's own precision, stated in the demo survey file (2 mm).
  await expect(page.getByTestId("statement-asprs")).toContainText("the survey file's median stated precision (2.0 mm)");
  // The similarity fit says its shift at the checkpoints' centre in millimetres, with what would cause it.
  await expect(page.getByTestId("figure-helmert")).toContainText(
    "at the centre of the checkpoints the fit shifts east",
  );
  await expect(page.getByTestId("figure-helmert")).toContainText("base-station coordinates or reference frame");
  // Times in the field's time zone (Europe/London), the UTC instant on hover.
  const created2 = page.getByTestId("audit-result").getByTestId("field-time").first();
  await expect(created2).toHaveText(/(BST|GMT)$/);
  await expect(created2).toHaveAttribute("title", /UTC$/);

  // The technician's home: each audit a link, with its revision, profile and state in words.
  await page.goto("/");
  const recent = page.getByRole("region", { name: "Recent audits" });
  const item = recent
    .getByTestId("home-audit")
    .filter({ has: page.getByTestId("revision-tag") })
    .first();
  await expect(item).toContainText("revision 2");
  await expect(item).toContainText(hoeing.name);
  await expect(item).toContainText("Computed, not yet submitted");
  await item.getByRole("link").first().click();
  await expect(page).toHaveURL(new RegExp(`/audits/${revision.id}$`));
  await page.goto("/");
  await expect(page.getByTestId("home-upload").first().getByRole("link")).toHaveAttribute("href", `/fields/${fieldId}`);
  await expectNoStateCodes(page);

  // The field's audit list: states in words, revision and profile beside the title.
  await page.goto(`/fields/${fieldId}`);
  const row = page
    .getByTestId("field-audits")
    .locator("tr", { has: page.getByTestId("revision-tag") })
    .first();
  await expect(row).toContainText(hoeing.name);
  await expect(page.getByTestId("field-audits")).toContainText("Returned for correction");
  await expectNoStateCodes(page);

  // The audit's own map is named as such; the field map is named as what the grower sees.
  await page.goto(`/audits/${revision.id}`);
  await page.getByTestId("map-link").click();
  await expect(page.getByTestId("audit-map-page")).toBeVisible();
  await expect(page.getByRole("link", { name: "field map (what the grower sees)" })).toHaveAttribute(
    "href",
    `/fields/${fieldId}/map`,
  );
});

test("walk -- the QA lead's review list names each revision's own profile", async ({ browser }) => {
  const lead = await pageFor(browser, "qa_lead");
  await lead.goto("/review");
  const row = lead.getByTestId("review-returned").locator(`tr[data-audit-id="${returned.id}"]`);
  await expect(row).toContainText("In-row weeding around plants");
  await expect(row.getByTestId("field-time")).toHaveAttribute("title", /UTC$/);
  // The revision's review page names its number; the returned one's history shows the field's local times.
  await lead.goto(`/audits/${revision.id}/review`);
  await expect(lead.getByRole("heading", { level: 1 })).toContainText("revision 2");
  await lead.goto(`/audits/${returned.id}/review`);
  await expect(lead.getByRole("heading", { level: 1 })).not.toContainText("revision");
  const when = lead.getByTestId("review-events").getByTestId("field-time").first();
  await expect(when).toHaveText(/(BST|GMT)$/);
  await expect(when).toHaveAttribute("title", /UTC$/);
  await lead.context().close();
});

test("walk -- the signed revision reaches the grower: verdict, home and map agree, float-fix records not to rely on", async ({
  page,
  browser,
}) => {
  test.setTimeout(180_000);
  const floatIds = new Set(
    Papa.parse<Record<string, string>>(fs.readFileSync("public/demo/long-acre-as-planted.csv", "utf8"), {
      header: true,
      skipEmptyLines: true,
    })
      .data.filter((r) => r.fix === "rtk-float")
      .map((r) => r.plant_id),
  );
  // The technician submits the revision judged for inter-row hoeing.
  await new SignInPage(page).signInAs("technician");
  const techReview = new ReviewPage(page);
  await techReview.open(revision.id);
  await techReview.submit("Judged for inter-row hoeing as asked.");

  // The QA lead signs it off with the checklist: every criterion passes, so no deviation is asked for.
  const lead = await pageFor(browser, "qa_lead");
  const leadReview = new ReviewPage(lead);
  await leadReview.open(revision.id);
  const f = leadReview.signoffForm;
  await f.getByRole("checkbox", { name: /Enough checkpoints/ }).check();
  await f.getByRole("checkbox", { name: /Survey instrument at least 3/ }).check();
  await f.getByRole("checkbox", { name: /Control mark checked/ }).check();
  await f.getByRole("checkbox", { name: /Right tolerance profile/ }).check();
  await expect(f.getByLabel(/Why you accept it anyway/)).toHaveCount(0);
  await f.getByLabel(/Type your full name to sign/).fill(demoPerson("qa_lead").name);
  await f.getByRole("button", { name: /^Sign off/ }).click();
  await expect(leadReview.badge).toHaveAttribute("data-state", "signed_off");
  await lead.context().close();

  // The grower's home: the signed revision's word, and the float-fix records counted apart.
  const grower = await pageFor(browser, "grower");
  await grower.goto("/");
  const row = grower.getByTestId("grower-fields").locator(`tr[data-signed-audit="${revision.id}"]`);
  await expect(row).toContainText("Long Acre");
  await expect(row.locator("td[data-word]")).toHaveAttribute("data-word", "meets");
  await expect(row.getByTestId("grower-records")).toContainText("160 not to rely on (fix quality rtk-float)");
  await expect(row.getByTestId("grower-records")).toContainText("4,640 to rely on");

  // The field map says the same, states the rule, rings exactly those records and lists them for the next pass.
  await row.getByRole("link", { name: "Long Acre" }).click();
  await expect(grower.getByTestId("field-map-audit")).toHaveAttribute("data-audit-id", revision.id);
  const trust = grower.getByTestId("record-trust");
  await expect(trust.getByTestId("record-trust-summary")).toContainText(
    "Do not rely on 160 of 4,800 records for inter-row hoeing: fix quality rtk-float.",
  );
  await expect(trust.getByTestId("record-rule")).toContainText("A record is not to be relied on when");
  await expect(trust.getByTestId("record-causes").locator("tbody tr")).toHaveCount(1);
  await expect(trust.getByTestId("count-do-not-rely")).toHaveText("160");
  // The map loads its payload and the marks after the page: give a cold server time.
  await expect(grower.getByTestId("field-map")).toHaveAttribute("data-records-do-not-rely", "160", { timeout: 30_000 });
  await expect(grower.getByTestId("record-marks-key")).toContainText("160 records not to rely on");
  const download = grower.waitForEvent("download");
  await trust.getByRole("button", { name: "Download list (CSV)" }).click();
  const file = await download;
  expect(file.suggestedFilename()).toMatch(/_rev2_.*_do-not-rely_inter-row-hoeing\.csv$/);
  const text = fs.readFileSync((await file.path())!, "utf8").replace(/^\uFEFF/, "");
  expect(text).toContain(`id ${revision.id}, signed off; SHA-256 `);
  const listed = Papa.parse<Record<string, string>>(text, { header: true, comments: "#", skipEmptyLines: true }).data;
  expect(new Set(listed.map((r) => r.plant_id))).toEqual(floatIds);

  // The printable report gives the sign-off and upload times in the field's time zone, UTC on hover.
  await grower.goto(`/audits/${revision.id}/report`);
  const times = grower.getByTestId("field-time");
  expect(await times.count()).toBeGreaterThanOrEqual(3);
  for (const t of await times.all()) {
    await expect(t).toHaveText(/(BST|GMT)$/);
    await expect(t).toHaveAttribute("title", /UTC$/);
  }
  await grower.context().close();
});

test("walk -- revoking an API key asks first; keeping it leaves it live", async ({ page }) => {
  await new SignInPage(page).signInAs("owner");
  await page.goto("/settings/keys");
  const keysPage = new ApiKeysPage(page);
  // A name of its own, so a database kept from an earlier run holds no second row of that name.
  const name = `Walk test key ${Date.now()}`;
  await keysPage.create(name, { scope: "Read only" });
  const row = keysPage.row(name);
  await expect(row).toContainText("live");
  await row.getByRole("button", { name: "Revoke" }).click();
  await expect(row.getByTestId("revoke-confirm")).toContainText(`Revoke “${name}”?`);
  await row.getByRole("button", { name: "Keep it" }).click();
  await expect(row.getByTestId("revoke-confirm")).toHaveCount(0);
  await expect(row).toContainText("live");
  await row.getByRole("button", { name: "Revoke" }).click();
  await row.getByRole("button", { name: "Yes, revoke it" }).click();
  await expect(row).toContainText("revoked");
  await expect(row.getByRole("button", { name: "Revoke" })).toHaveCount(0);
});
