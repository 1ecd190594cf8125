import { test, expect } from "@playwright/test";
import { SignInPage, demoPerson } from "./pages/session";
import { AuditApi } from "./pages/audit";
import { Outbox, ReviewPage, pageFor } from "./pages/review";
import type { AuditDto } from "@/lib/api-types";

// One story in order: the technician's audit, the QA lead's sign-off, then what everyone sees afterwards.
test.describe.configure({ mode: "serial" });

let audit: AuditDto;

test("review -- technician submits, QA lead signs off from the e-mail link, the signed audit and its files stay fixed", async ({
  page,
  browser,
}) => {
  test.setTimeout(180_000);
  const technician = demoPerson("technician");
  const lead = demoPerson("qa_lead");

  // The technician uploads the demo files and runs the audit through the API.
  await new SignInPage(page).signInAs("technician");
  const api = new AuditApi(page);
  const fieldId = await api.fieldId("Long Acre");
  const planted = await api.upload(fieldId, "planted");
  const survey = await api.upload(fieldId, "survey");
  const profile = (await api.profiles()).find((p) => p.name === "In-row weeding around plants")!;
  const created = await page.request.post("/api/audits?wait=1", {
    data: {
      fieldId,
      plantedDatasetId: planted.id,
      surveyDatasetId: survey.id,
      profileId: profile.id,
      title: "Long Acre review check",
    },
  });
  expect(created.status(), await created.text()).toBe(201);
  audit = (await created.json()).audit;
  expect(audit.state).toBe("computed");
  expect(audit.verdict!.passed).toBe(false); // in-row weeding fails on bed 3's float stretch: a sign-off is "with deviation"

  // … and submits it for sign-off on the review page.
  const techReview = new ReviewPage(page);
  await techReview.open(audit.id);
  await expect(techReview.badge).toHaveAttribute("data-state", "computed");
  await techReview.submit("Bed 3 rows 2–3 were planted on an RTK float fix.");
  await expect(page.getByTestId("review-events")).toContainText(`${technician.name} submitted it for sign-off`);

  // The QA lead's e-mail arrives in the demo's fake SMTP server.
  const mail = await new Outbox(browser).waitFor(lead.email, "Waiting for your sign-off: Long Acre review check");
  expect(mail.text).toContain(
    `${technician.name} has submitted the audit “Long Acre review check” of Long Acre (revision 1) for sign-off.`,
  );
  expect(mail.text).toContain("Their note: “Bed 3 rows 2–3 were planted on an RTK float fix.”");
  expect(new URL(mail.link).pathname).toBe(`/audits/${audit.id}/review`);

  // The QA lead opens the link and signs off with the checklist.
  const leadPage = await pageFor(browser, "qa_lead");
  await leadPage.goto(mail.link);
  const leadReview = new ReviewPage(leadPage);
  await expect(leadReview.signoffForm).toBeVisible();
  for (const c of audit.verdict!.criteria.filter((x) => !x.passed))
    await expect(leadPage.getByTestId("deviation-note")).toContainText(c.text);
  // A name other than the signer's is refused before anything is stored.
  await leadReview.signOff({
    precisionMm: "2",
    controlMarkNote: "KF-03, 1.5 mm off",
    comment: "Known float stretch; in-row weeding stays off bed 3 until replanting.",
    name: "Maren Holt",
  });
  await expect(leadReview.signoffForm.locator('[data-field-error="typedName"]')).toContainText(
    `Type your name as on your account: ${lead.name}.`,
  );
  await leadReview.signoffForm.getByLabel(/Type your full name to sign/).fill(lead.name);
  await leadReview.signoffForm.getByRole("button", { name: /^Sign off/ }).click();
  await expect(leadReview.record).toBeVisible();
  await expect(leadReview.record).toContainText(`Signed off with deviation by ${lead.name} (QA lead)`);
  await expect(leadReview.record).toContainText(
    "2 mm (from the survey file), 4× finer than the tightest limit of 8 mm",
  );
  await expect(leadReview.badge).toHaveAttribute("data-state", "signed_off");
  const sha = (await leadPage.getByTestId("signoff-sha256").textContent())!.trim();
  expect(sha).toMatch(/^[0-9a-f]{64}$/);
  await expect(leadPage.getByTestId("signoff-form")).toHaveCount(0);

  // Verify re-computes from the raw files and confirms the hash.
  await leadPage.getByTestId("verify-button").click();
  await expect(leadPage.getByTestId("verify-result")).toHaveAttribute("data-ok", "true", { timeout: 30_000 });
  await expect(leadPage.getByTestId("verify-result")).toContainText(
    `Everything matches the signed record (SHA-256 ${sha.slice(0, 16)}…)`,
  );

  // The printable report carries the hash, the verdict and the caution, and prints without the app's header.
  await leadPage.goto(`/audits/${audit.id}/report`);
  await expect(leadPage.getByTestId("report-status")).toContainText(`Signed off with deviation by ${lead.name}`);
  await expect(leadPage.getByTestId("report-hash")).toHaveText(sha);
  await expect(leadPage.getByTestId("report-sha-survey")).toContainText(survey.sha256);
  await expect(leadPage.getByTestId("report-verdict").locator("tr")).toHaveCount(audit.verdict!.criteria.length);
  await expect(leadPage.getByTestId("report-scatter").locator("circle").first()).toBeVisible();
  await expect(leadPage.getByTestId("report-caution")).toContainText(
    "does not certify that any machine is safe to operate",
  );
  await expect(leadPage.getByTestId("report-caution")).toContainText(
    "legal surveys follow local codes and licensed practice",
  );
  await leadPage.emulateMedia({ media: "print" });
  await expect(leadPage.getByRole("navigation", { name: "Main" })).toBeHidden();
  await expect(leadPage.getByTestId("print-button")).toBeHidden();
  const pdf = await leadPage.pdf({ preferCSSPageSize: true });
  expect(pdf.subarray(0, 5).toString()).toBe("%PDF-");
  await leadPage.context().close();

  // The technician sees the signed state …
  await page.reload();
  await expect(techReview.badge).toHaveAttribute("data-state", "signed_off");
  await expect(techReview.record).toContainText(sha);
  await expect(page.getByTestId("review-bar-report")).toBeVisible();
  // … the decision e-mail …
  const told = await new Outbox(browser).waitFor(technician.email, "Signed off: Long Acre review check");
  expect(told.text).toContain(sha);
  // … and cannot delete the survey any more: 409 with the reason.
  const del = await page.request.delete(`/api/datasets/${survey.id}`);
  expect(del.status()).toBe(409);
  const { error } = await del.json();
  expect(error.code).toBe("conflict");
  expect(error.message).toBe(
    `"long-acre-survey.csv" is an input of the signed-off audit "Long Acre review check"; signed-off audits and their files can never be changed or deleted.`,
  );
  expect((await page.request.get(`/api/datasets/${survey.id}`)).status()).toBe(200);
  // Nor can the audit be submitted, returned or signed again.
  const again = await page.request.post(`/api/audits/${audit.id}/submit`, { data: {} });
  expect(again.status()).toBe(409);
  expect((await again.json()).error.message).toContain("This audit is signed off.");
});

test("review -- the QA lead's review list and the organisation's activity show what happened", async ({ browser }) => {
  const lead = await pageFor(browser, "qa_lead");
  await lead.goto("/review");
  await expect(lead.getByTestId("review-signed").locator(`tr[data-audit-id="${audit.id}"]`)).toContainText(
    demoPerson("qa_lead").name,
  );
  await expect(lead.getByTestId("review-waiting").or(lead.getByText("Nothing is waiting for review."))).toBeVisible();
  await lead.goto("/activity");
  const log = lead.getByTestId("org-activity");
  await expect(log).toContainText(`${demoPerson("qa_lead").name} signed off revision 1 with deviation`);
  await expect(log).toContainText(`${demoPerson("technician").name} submitted revision 1 for sign-off`);
  await expect(log).toContainText(`${demoPerson("qa_lead").name} opened the printable sign-off report.`);
  await lead.context().close();
});
