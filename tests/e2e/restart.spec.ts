import fs from "node:fs";
import net from "node:net";
import path from "node:path";
import { spawn, type ChildProcess } from "node:child_process";
import { test, expect, type APIRequestContext } from "@playwright/test";
import { SignInPage } from "./pages/session";
import { AuditResultPage } from "./pages/audit";
import { bigAsPlanted } from "./pages/big-file";
import type { AuditDto } from "@/lib/api-types";

// A server of its own (not the one the config starts), so this test may kill it with SIGKILL and start it again
// on the same data directory, as a crash or an out-of-memory kill would.
const DATA = path.resolve("data/e2e-restart");
const PLANTS = 100_000;

let server: ChildProcess | null = null;
let output = "";
// Shared with the second test, which runs on the same server and the same uploaded files.
let port = 0;
let audit: { fieldId: string; plantedDatasetId: string; surveyDatasetId: string; profileId: string } | null = null;

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = net.createServer();
    s.once("error", reject);
    s.listen(0, "127.0.0.1", () => {
      const { port } = s.address() as net.AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

/** Start `node lib/server/http/serve.mjs` on `port` and wait until /api/health answers 200. */
async function startServer(port: number): Promise<ChildProcess> {
  const base = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, ["lib/server/http/serve.mjs", "-p", String(port)], {
    env: {
      ...process.env,
      HOSTNAME: "127.0.0.1",
      PLOTPROOF_DEMO: "1",
      OPEN_SIGNUP: "1",
      AUTH_SIGNIN_PER_MINUTE: "1000",
      PGLITE_DIR: path.join(DATA, "db"),
      BETTER_AUTH_URL: base,
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout!.on("data", (b: Buffer) => {
    output += b.toString();
  });
  child.stderr!.on("data", (b: Buffer) => {
    output += b.toString();
  });
  const deadline = Date.now() + 90_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server exited with ${child.exitCode}:\n${output}`);
    const ok = await fetch(`${base}/api/health`)
      .then((r) => r.ok)
      .catch(() => false);
    if (ok) return child;
    if (Date.now() > deadline) throw new Error(`the server did not answer /api/health within 90 s:\n${output}`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

/** SIGKILL, as the kernel's out-of-memory killer or `kill -9` would: no handler runs, nothing is flushed. */
async function killServer(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const gone = new Promise<void>((resolve) => child.once("exit", () => resolve()));
  process.kill(child.pid!, "SIGKILL");
  await gone;
}

async function auditOf(request: APIRequestContext, id: string): Promise<AuditDto> {
  const res = await request.get(`/api/audits/${id}`);
  expect(res.status()).toBe(200);
  return ((await res.json()) as { audit: AuditDto }).audit;
}

test.describe.configure({ mode: "serial" });

test.afterAll(async () => {
  if (server) await killServer(server);
  server = null;
});

test("restart -- an audit killed with SIGKILL while computing is computed again after the restart, not stuck", async ({
  browser,
}) => {
  test.setTimeout(180_000);
  fs.rmSync(DATA, { recursive: true, force: true });
  port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  server = await startServer(port);

  const context = await browser.newContext({ baseURL: base });
  const page = await context.newPage();
  await new SignInPage(page).signInAs("technician");

  const made = await page.request.post("/api/fields", {
    data: { name: "Great Drove restart", farm: "Kestrel Fen", crs: "EPSG:25831", timeZone: "Europe/Amsterdam" },
  });
  expect(made.status(), await made.text()).toBe(201);
  const fieldId = ((await made.json()) as { field: { id: string } }).field.id;
  // 100,000 plants, all surveyed at the same positions: storing the result rows takes several seconds.
  const buffer = bigAsPlanted(PLANTS);
  const upload = async (kind: "planted" | "survey") => {
    const res = await page.request.post(`/api/fields/${fieldId}/datasets`, {
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
  const profiles = await page.request.get("/api/profiles");
  const profile = ((await profiles.json()) as { profiles: { id: string; name: string }[] }).profiles.find(
    (p) => p.name === "Inter-row hoeing",
  )!;
  audit = { fieldId, plantedDatasetId, surveyDatasetId, profileId: profile.id };
  const started = await page.request.post("/api/audits", { data: { ...audit, title: "Great Drove killed" } });
  expect(started.status()).toBe(202);
  const id = ((await started.json()) as { audit: AuditDto }).audit.id;

  // The technician watches the audit's page while it computes.
  await page.goto(`/audits/${id}`);
  await expect(page.getByTestId("audit-progress")).toBeVisible();

  // Kill the server in the middle of storing the rows: some are in the database, the audit says "computing".
  let seen: AuditDto;
  for (;;) {
    seen = await auditOf(page.request, id);
    expect(seen.state, "the audit finished before the server could be killed").toBe("computing");
    if (seen.progressStage === "saving" && seen.progress >= 0.55) break;
    await new Promise((r) => setTimeout(r, 50));
  }
  await killServer(server);
  expect(server.signalCode).toBe("SIGKILL");
  const killedAt = seen.progressStage;

  // The same server on the same data directory.
  output = "";
  server = await startServer(port);
  expect(output).toContain(`[plotproof] audit ${id} (Great Drove killed) was interrupted at stage ${killedAt}`);
  expect(output).toContain("computing it again (resumption 1 of 2)");

  // Not stuck: the audit reaches "computed", with exactly one set of rows (the partial ones were removed).
  await expect
    .poll(async () => (await auditOf(page.request, id)).state, { timeout: 120_000, intervals: [500] })
    .toBe("computed");
  const residuals = await page.request.get(`/api/audits/${id}/residuals?pageSize=1`);
  expect(((await residuals.json()) as { total: number }).total).toBe(PLANTS);
  const log = await page.request.get(`/api/audits/${id}/activity`);
  const actions = ((await log.json()) as { activity: { action: string; text: string }[] }).activity.filter((a) =>
    a.action.startsWith("audit."),
  );
  expect(actions.map((a) => a.action)).toEqual(["audit.created", "audit.resumed", "audit.computed"]);
  expect(actions[1].text).toContain(`stage ${killedAt}`);

  // The page the technician kept open shows the result with its verdict.
  const result = new AuditResultPage(page);
  await result.waitUntilComputed();
  await expect(result.verdict).toBeVisible();
  await expect(page.getByTestId("audit-failed")).toHaveCount(0);
  await context.close();
});

test("restart -- an audit interrupted three times is marked failed with the reason, and Compute again computes it", async ({
  browser,
}) => {
  test.setTimeout(150_000);
  expect(server && audit, "the first test set up the server and the files").toBeTruthy();
  const context = await browser.newContext({ baseURL: `http://127.0.0.1:${port}` });
  const page = await context.newPage();
  await new SignInPage(page).signInAs("technician");
  const started = await page.request.post("/api/audits", { data: { ...audit!, title: "Great Drove killed thrice" } });
  expect(started.status()).toBe(202);
  const id = ((await started.json()) as { audit: AuditDto }).audit.id;
  const resumed = async () => {
    const res = await page.request.get(`/api/audits/${id}/activity`);
    return ((await res.json()) as { activity: { action: string }[] }).activity.filter(
      (a) => a.action === "audit.resumed",
    ).length;
  };

  // Killed while computing, then twice more right after each restart has started it again.
  for (let resumptions = 0; resumptions < 2; resumptions++) {
    await expect.poll(resumed, { timeout: 30_000, intervals: [50] }).toBe(resumptions);
    expect((await auditOf(page.request, id)).state).toBe("computing");
    await killServer(server!);
    output = "";
    server = await startServer(port);
    expect(output).toContain(`[plotproof] audit ${id} (Great Drove killed thrice) was interrupted at stage`);
    expect(output).toContain(`(resumption ${resumptions + 1} of 2)`);
  }
  await expect.poll(resumed, { timeout: 30_000, intervals: [50] }).toBe(2);
  expect((await auditOf(page.request, id)).state).toBe("computing");
  await killServer(server!);
  output = "";
  server = await startServer(port);
  expect(output).toMatch(/was interrupted at stage \w+ for the third time: marked failed/);

  // The technician sees why, and computes it again from the same files.
  await page.goto(`/audits/${id}`);
  const failed = page.getByTestId("audit-failed");
  await expect(failed).toContainText(/The server stopped while this audit was computing \(stage: [^)]+\), 3 times;/);
  await page.getByTestId("recompute").click();
  const result = new AuditResultPage(page);
  await result.waitUntilComputed();
  await expect(result.verdict).toBeVisible();
  await expect(failed).toHaveCount(0);
  const residuals = await page.request.get(`/api/audits/${id}/residuals?pageSize=1`);
  expect(((await residuals.json()) as { total: number }).total).toBe(PLANTS);
  await context.close();
});
