import fs from "node:fs";
import path from "node:path";
import crypto from "node:crypto";
import { GetObjectCommand, ListObjectsV2Command, S3Client } from "@aws-sdk/client-s3";
import { expect, test, type Browser, type BrowserContext, type Page } from "@playwright/test";
import { benchFiles } from "@/lib/cli/bench-field";
import type { AuditDto } from "@/lib/api-types";
import { AuditApi } from "../e2e/pages/audit";
import { ReviewPage } from "../e2e/pages/review";
import { SignInPage, demoPerson, type DemoRole } from "../e2e/pages/session";
import { STATE_FILE, type DeploymentState } from "./deployment";

// Server mode as deployed: two app instances and two workers on one PostgreSQL. What one instance starts, a worker
// computes and the other instance shows; a worker killed mid-audit leaves the job to the other one.
test.describe.configure({ mode: "serial" });

const state = (): DeploymentState => JSON.parse(fs.readFileSync(STATE_FILE, "utf8"));

async function signedIn(
  browser: Browser,
  base: string,
  role: DemoRole,
): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({ baseURL: base });
  const page = await context.newPage();
  await new SignInPage(page).signInAs(role);
  return { context, page };
}

/** The same browser's cookies, on the other instance: sessions live in the shared database. */
async function onOtherInstance(browser: Browser, from: BrowserContext, base: string): Promise<Page> {
  const context = await browser.newContext({ baseURL: base });
  await context.addCookies(await from.cookies());
  return context.newPage();
}

async function waitComputed(page: Page, id: string, timeoutMs: number): Promise<AuditDto> {
  let audit: AuditDto | null = null;
  await expect(async () => {
    audit = (await (await page.request.get(`/api/audits/${id}`)).json()).audit as AuditDto;
    expect(audit.state).not.toBe("computing");
  }).toPass({ timeout: timeoutMs, intervals: [500] });
  return audit!;
}

/** What the deployment's object store holds, read directly through the AWS SDK. */
function objectStore() {
  const env = state().objectStore;
  const client = new S3Client({
    endpoint: env.OBJECT_STORE_URL,
    region: env.OBJECT_STORE_REGION,
    forcePathStyle: true,
    credentials: { accessKeyId: env.OBJECT_STORE_ACCESS_KEY, secretAccessKey: env.OBJECT_STORE_SECRET_KEY },
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
  const Bucket = env.OBJECT_STORE_BUCKET;
  return {
    async keys(): Promise<string[]> {
      const out: string[] = [];
      let token: string | undefined;
      do {
        const res = await client.send(new ListObjectsV2Command({ Bucket, ContinuationToken: token }));
        out.push(...(res.Contents ?? []).map((c) => c.Key!));
        token = res.NextContinuationToken;
      } while (token);
      return out;
    },
    async bytes(key: string): Promise<Buffer> {
      const res = await client.send(new GetObjectCommand({ Bucket, Key: key }));
      return Buffer.from(await res.Body!.transformToByteArray());
    },
  };
}
const sha256 = (b: Uint8Array) => crypto.createHash("sha256").update(b).digest("hex");

const workerLogs = () => state().workers.map((w) => ({ ...w, text: fs.readFileSync(w.log, "utf8") }));

test("server mode -- an audit started on instance A is computed by a worker and signed off on instance B", async ({
  browser,
}) => {
  const { a, b } = state();
  const tech = await signedIn(browser, a, "technician");
  const api = new AuditApi(tech.page);
  const fieldId = await api.fieldId("Long Acre");
  const store = objectStore();
  const uploadsBefore = new Set((await store.keys()).filter((k) => k.includes("/uploads/")));
  const planted = await api.upload(fieldId, "planted");
  const survey = await api.upload(fieldId, "survey");
  const hoeing = (await api.profiles()).find((p) => p.name === "Inter-row hoeing")!;
  const res = await tech.page.request.post("/api/audits", {
    data: {
      fieldId,
      plantedDatasetId: planted.id,
      surveyDatasetId: survey.id,
      profileId: hoeing.id,
      title: "Two-instance check",
    },
  });
  expect(res.status(), await res.text()).toBe(202); // accepted: a worker computes it
  const started = (await res.json()).audit as AuditDto;
  expect(started.state).toBe("computing");

  // The uploads went to the object store (two new objects with the uploads' SHA-256), not into PostgreSQL.
  const newUploads = (await store.keys()).filter((k) => k.includes("/uploads/") && !uploadsBefore.has(k));
  expect(newUploads).toHaveLength(2);
  const uploadHashes = await Promise.all(newUploads.map(async (k) => sha256(await store.bytes(k))));
  expect(uploadHashes.sort()).toEqual([planted.sha256, survey.sha256].sort());

  // The technician's session works on B too; B shows the audit once a worker has computed it.
  const techOnB = await onOtherInstance(browser, tech.context, b);
  const computed = await waitComputed(techOnB, started.id, 120_000);
  expect(computed.state).toBe("computed");
  expect(workerLogs().some((w) => w.text.includes(`computing audit ${started.id}`))).toBe(true);
  // Files cross instances through the object store: B gives out the upload A took and the reports a worker wrote,
  // byte for byte what the object store holds.
  const file = await techOnB.request.get(`/api/datasets/${planted.id}/file`);
  expect(file.status()).toBe(200);
  expect(sha256(await file.body())).toBe(planted.sha256);
  expect(file.headers()["x-content-sha256"]).toBe(planted.sha256);
  const reportKeys = (await store.keys()).filter((k) => k.includes(`/reports/${started.id}/`));
  expect(reportKeys.map((k) => k.split("/")[4]).sort()).toEqual(["residuals", "summary", "unpaired"]);
  const summaryKey = reportKeys.find((k) => k.includes("/summary/"))!;
  const summaryCsv = await techOnB.request.get(`/api/audits/${started.id}/summary.csv`);
  expect(summaryCsv.status()).toBe(200);
  expect(Buffer.compare(await summaryCsv.body(), await store.bytes(summaryKey))).toBe(0);
  await techOnB.goto(`/audits/${started.id}`);
  await expect(techOnB.getByTestId("audit-result")).toContainText("Two-instance check");
  await techOnB.goto(`/audits/${started.id}/map`);
  await expect(techOnB.getByTestId("field-map")).toHaveAttribute("data-pairs-total", String(computed.summary!.pairs), {
    timeout: 60_000,
  });
  const review = new ReviewPage(techOnB);
  await review.open(started.id);
  await review.submit("Computed on a worker, submitted on B.");

  // The QA lead signs off on B.
  const lead = await signedIn(browser, b, "qa_lead");
  const leadReview = new ReviewPage(lead.page);
  await leadReview.open(started.id);
  const f = leadReview.signoffForm;
  for (const item of [
    /Enough checkpoints/,
    /Survey instrument at least 3/,
    /Control mark checked/,
    /Right tolerance profile/,
  ]) {
    const box = f.getByRole("checkbox", { name: item });
    if (await box.count()) await box.check();
  }
  await f.getByLabel(/Type your full name to sign/).fill(demoPerson("qa_lead").name);
  await f.getByRole("button", { name: /^Sign off/ }).click();
  await expect(leadReview.badge).toHaveAttribute("data-state", "signed_off");

  // Instance A sees the signature at once: the grower's field map there comes from this audit.
  const grower = await signedIn(browser, a, "grower");
  await grower.page.goto(`/fields/${fieldId}/map`);
  await expect(grower.page.getByTestId("field-map-audit")).toHaveAttribute("data-audit-id", started.id);
  for (const c of [tech.context, techOnB.context(), lead.context, grower.context]) await c.close();
});

test("server mode -- a worker killed mid-audit: the queue gives the job to the other worker, which completes it", async ({
  browser,
}) => {
  const { a, b } = state();
  // Both workers are up and taking jobs before one of them is killed.
  expect(workerLogs().filter((w) => w.text.includes("takes jobs"))).toHaveLength(2);
  const tech = await signedIn(browser, a, "technician");
  const files = await benchFiles(100_000);
  const created = await tech.page.request.post("/api/fields", {
    data: {
      name: `Alder Bank kill test ${Date.now()}`,
      farm: "Alder Bank",
      crs: "EPSG:32632",
      timeZone: "Europe/Berlin",
    },
  });
  expect(created.status(), await created.text()).toBe(201);
  const fieldId = (await created.json()).field.id as string;
  const upload = async (file: string, kind: string, crs?: string) => {
    const r = await tech.page.request.post(`/api/fields/${fieldId}/datasets`, {
      multipart: {
        file: { name: path.basename(file), mimeType: "text/csv", buffer: fs.readFileSync(file) },
        kind,
        acceptWarnings: "true",
        ...(crs ? { crs } : {}),
      },
      timeout: 300_000,
    });
    expect(r.status(), await r.text()).toBe(201);
    return (await r.json()).dataset.id as string;
  };
  const plantedDatasetId = await upload(files.planted, "planted");
  const surveyDatasetId = await upload(files.survey, "survey", "EPSG:32632");
  const profiles = (await (await tech.page.request.get("/api/profiles")).json()).profiles as { id: string }[];
  const res = await tech.page.request.post("/api/audits", {
    data: {
      fieldId,
      plantedDatasetId,
      surveyDatasetId,
      profileId: profiles[0].id,
      match: "nearest",
      title: "Kill test",
    },
  });
  expect(res.status(), await res.text()).toBe(202);
  const id = ((await res.json()).audit as AuditDto).id;

  // Kill whichever worker took it, as soon as it says so.
  let victim: { pid: number; log: string } | undefined;
  await expect(async () => {
    victim = workerLogs().find((w) => w.text.includes(`computing audit ${id} (attempt 1)`));
    expect(victim).toBeTruthy();
  }).toPass({ timeout: 60_000, intervals: [100] });
  process.kill(victim!.pid, "SIGKILL");

  // The job expires on the dead worker and is retried by the other; B sees it finish.
  const techOnB = await onOtherInstance(browser, tech.context, b);
  const done = await waitComputed(techOnB, id, 240_000);
  expect(done.state).toBe("computed");
  const survivor = workerLogs().find((w) => w.pid !== victim!.pid)!;
  expect(survivor.text).toContain(`computing audit ${id} (attempt 2)`);
  expect(done.summary!.pairs).toBeGreaterThan(90_000);
  const activity = (await (await techOnB.request.get(`/api/audits/${id}/activity`)).json()) as {
    events?: { action: string }[];
  };
  expect(JSON.stringify(activity)).toContain("audit.resumed");
  await tech.context.close();
  await techOnB.context().close();
});
