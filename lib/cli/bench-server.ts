/**
 * Does a large audit hold other users' requests? Run against a server with the demo accounts
 * (`npm run demo`, or the browser tests' server):
 *
 *   npm run bench:server -- --base http://127.0.0.1:3000 [--plants 100000] [--survey-every 12]
 *
 * As the demo technician: creates a field, uploads the benchmark's synthetic as-planted and survey
 * CSVs (lib/cli/bench-field.ts; every plant surveyed, or with --survey-every K only every K-th, so most
 * plants are records nobody surveyed) and starts an audit. From the first upload until the audit is computed, the
 * demo grower asks `GET /api/fields` every 100 ms; the figures are each upload's time, the audit's time, the time
 * from each progress stage first seen to the next (`stagesMs`; "saving" is storing the per-plant results and
 * reports) and the grower's response times during the uploads and during the audit (median, 95th percentile,
 * largest). Stage times are as polled: about ±0.2 s.
 */
import { readFileSync } from "node:fs";
import { basename } from "node:path";
import { parseArgs } from "node:util";
import { request, type APIRequestContext } from "playwright-core";
import { DEFAULT_MAX_PAIR_DISTANCE_M } from "@/lib/audit/settings";
import { benchFiles } from "./bench-field";

const { values } = parseArgs({
  options: {
    base: { type: "string", default: "http://127.0.0.1:3000" },
    plants: { type: "string", default: "100000" },
    "survey-every": { type: "string", default: "1" },
  },
});
const base = values.base!;
const n = Number(values.plants);
const surveyEvery = Number(values["survey-every"]);

async function signedIn(email: string): Promise<APIRequestContext> {
  const ctx = await request.newContext({ baseURL: base, extraHTTPHeaders: { origin: base } });
  const res = await ctx.post("/api/auth/sign-in/email", { data: { email, password: "kestrel-demo-26" } });
  if (!res.ok()) throw new Error(`sign-in as ${email}: ${res.status()} ${await res.text()}`);
  return ctx;
}

async function json<T>(p: Promise<import("playwright-core").APIResponse>, what: string): Promise<T> {
  const res = await p;
  if (!res.ok()) throw new Error(`${what}: ${res.status()} ${(await res.text()).slice(0, 500)}`);
  return (await res.json()) as T;
}

const pct = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];

async function main(): Promise<void> {
  const files = await benchFiles(n, false, surveyEvery);
  const tech = await signedIn("tamsin@kestrelfen.example");
  const grower = await signedIn("ansel@kestrelfen.example");
  const { field } = await json<{ field: { id: string } }>(
    tech.post("/api/fields", {
      data: {
        name: `Alder Bank bench ${n} ${Date.now()}`,
        farm: "Alder Bank",
        crs: "EPSG:32632",
        timeZone: "Europe/Berlin",
      },
    }),
    "create field",
  );
  // The other user: the grower asks for the field list every 100 ms, in its own loop, through uploads and the audit.
  const waits: Record<"upload" | "audit", number[]> = { upload: [], audit: [] };
  let phase = "upload" as "upload" | "audit" | "done";
  let resets = 0;
  /** A keep-alive connection the server closed while busy is tried again; the time until the retry answers counts. */
  const retried = async <T>(ask: () => Promise<T>): Promise<T> => {
    for (let attempt = 1; ; attempt++) {
      try {
        return await ask();
      } catch (err) {
        if (attempt === 3 || !/ECONNRESET|socket hang up/.test(String(err))) throw err;
        resets++;
      }
    }
  };
  const growerLoop = (async () => {
    while (phase !== "done") {
      const during = phase;
      const t = performance.now();
      await retried(() => json(grower.get("/api/fields", { timeout: 300_000 }), "grower's request"));
      waits[during].push(performance.now() - t);
      await new Promise((r) => setTimeout(r, 100));
    }
  })();
  const uploadMs: Record<string, number> = {};
  const upload = async (path: string, kind: string, crs?: string) => {
    const t = performance.now();
    const body = await json<{ dataset: { id: string } }>(
      tech.post(`/api/fields/${field.id}/datasets`, {
        multipart: {
          file: { name: basename(path), mimeType: "text/csv", buffer: readFileSync(path) },
          kind,
          acceptWarnings: "true",
          ...(crs ? { crs } : {}),
        },
        timeout: 600_000,
      }),
      `upload ${path}`,
    );
    uploadMs[kind] = Math.round(performance.now() - t);
    console.log(
      `uploaded ${basename(path)} (${(readFileSync(path).length / 1e6).toFixed(1)} MB) in ${uploadMs[kind]} ms`,
    );
    return body.dataset.id;
  };
  const plantedDatasetId = await upload(files.planted, "planted");
  const surveyDatasetId = await upload(files.survey, "survey", "EPSG:32632");
  const { profiles } = await json<{ profiles: { id: string; name: string }[] }>(tech.get("/api/profiles"), "profiles");

  phase = "audit";
  const t0 = performance.now();
  const { audit } = await json<{ audit: { id: string } }>(
    tech.post("/api/audits", {
      data: {
        fieldId: field.id,
        plantedDatasetId,
        surveyDatasetId,
        profileId: profiles[0].id,
        match: "nearest",
        maxDistanceM: DEFAULT_MAX_PAIR_DISTANCE_M,
      },
    }),
    "create audit",
  );
  let state = "computing",
    stage = "";
  const stages = new Set<string>();
  /** When each progress stage was first seen, ms after the audit was started. */
  const firstSeen: [string, number][] = [];
  while (state === "computing") {
    const a = await retried(() =>
      json<{ audit: { state: string; progressStage: string } }>(
        tech.get(`/api/audits/${audit.id}`, { timeout: 300_000 }),
        "poll",
      ),
    );
    state = a.audit.state;
    stage = a.audit.progressStage;
    if (!stages.has(stage)) firstSeen.push([stage, performance.now() - t0]);
    stages.add(stage);
    await new Promise((r) => setTimeout(r, 100));
  }
  const total = performance.now() - t0;
  phase = "done";
  await growerLoop;
  const summary = (list: number[]) => {
    const sorted = [...list].sort((a, b) => a - b);
    return {
      requests: sorted.length,
      median: Math.round(pct(sorted, 0.5)),
      p95: Math.round(pct(sorted, 0.95)),
      max: Math.round(sorted[sorted.length - 1]),
    };
  };
  const stagesMs = Object.fromEntries(
    firstSeen.map(([s, at], i) => [s, Math.round((i + 1 < firstSeen.length ? firstSeen[i + 1][1] : total) - at)]),
  );
  // Reading the results back as the audit page and the map do: the first request after computing, then another.
  const timed = async (path: string) => {
    const t = performance.now();
    const res = await tech.get(path, { timeout: 300_000 });
    if (!res.ok()) throw new Error(`${path}: ${res.status()}`);
    await res.body();
    return Math.round(performance.now() - t);
  };
  const readMs =
    state === "computed"
      ? {
          unpairedFirstPage: await timed(`/api/audits/${audit.id}/unpaired?kind=planted-not-found&page=1&pageSize=50`),
          unpairedLaterPage: await timed(`/api/audits/${audit.id}/unpaired?page=400&pageSize=50`),
          unpairedSplit: await timed(`/api/audits/${audit.id}/unpaired-split`),
          mapPayload: await timed(`/api/audits/${audit.id}/map-data`),
        }
      : null;
  console.log(
    JSON.stringify({
      plants: n,
      surveyEvery,
      state,
      stagesSeen: [...stages],
      uploadMs,
      auditMs: Math.round(total),
      stagesMs,
      readMs,
      connectionResets: resets,
      growerMsDuringUploads: summary(waits.upload),
      growerMsDuringAudit: summary(waits.audit),
    }),
  );
  if (state !== "computed") process.exitCode = 1;
}

await main();
