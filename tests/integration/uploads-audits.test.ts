import fs from "node:fs";
import path from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";
import type { AuditDto, DatasetDto, Page, ResidualRowDto, ToleranceProfileDto } from "@/lib/api-types";

const demo = (name: string) => fs.readFileSync(path.join(import.meta.dirname, "../../public/demo", name));
const cookies: Record<string, string> = {};
let fieldId: string;
let foreignFieldId: string;
let datasetsRoute: typeof import("@/app/api/fields/[fieldId]/datasets/route");
let auditsRoute: typeof import("@/app/api/audits/route");
let auditRoute: typeof import("@/app/api/audits/[id]/route");
let residualsRoute: typeof import("@/app/api/audits/[id]/residuals/route");
let csvRoute: typeof import("@/app/api/audits/[id]/residuals.csv/route");
let datasetRoute: typeof import("@/app/api/datasets/[id]/route");
let profilesRoute: typeof import("@/app/api/profiles/route");

function upload(
  cookie: string,
  file: Buffer | string,
  name: string,
  fields: Record<string, string>,
  targetField = fieldId,
) {
  const form = new FormData();
  form.set("file", new File([typeof file === "string" ? file : new Uint8Array(file)], name, { type: "text/csv" }));
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  const r = new Request(`http://localhost:3000/api/fields/${targetField}/datasets`, {
    method: "POST",
    body: form,
    headers: { cookie },
  });
  return datasetsRoute.POST(r, ctx({ fieldId: targetField }));
}

async function datasetCount(): Promise<number> {
  const res = await datasetsRoute.GET(
    req(`/api/fields/${fieldId}/datasets`, { cookie: cookies.technician }),
    ctx({ fieldId }),
  );
  return ((await res.json()).datasets as DatasetDto[]).length;
}

beforeAll(async () => {
  await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  const fieldsRoute = await import("@/app/api/fields/route");
  datasetsRoute = await import("@/app/api/fields/[fieldId]/datasets/route");
  auditsRoute = await import("@/app/api/audits/route");
  auditRoute = await import("@/app/api/audits/[id]/route");
  residualsRoute = await import("@/app/api/audits/[id]/residuals/route");
  csvRoute = await import("@/app/api/audits/[id]/residuals.csv/route");
  datasetRoute = await import("@/app/api/datasets/[id]/route");
  profilesRoute = await import("@/app/api/profiles/route");
  const fields = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.technician }), ctx({}))).json())
    .fields;
  fieldId = fields.find((f: { name: string }) => f.name === "Long Acre").id;
  foreignFieldId = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.other }), ctx({}))).json())
    .fields[0].id;
}, 120_000);

describe("uploads and audits through the API", () => {
  let planted: DatasetDto;
  let survey: DatasetDto;
  let audit: AuditDto;

  it("upload -- a grower is refused (403) and nothing is saved", async () => {
    const res = await upload(cookies.grower, demo("long-acre-survey.csv"), "long-acre-survey.csv", {
      kind: "survey",
      crs: "EPSG:25831",
    });
    expect(res.status).toBe(403);
    expect(await datasetCount()).toBe(0);
  });

  it("upload -- another organisation's field is 404 for the upload", async () => {
    const res = await upload(
      cookies.technician,
      demo("long-acre-survey.csv"),
      "s.csv",
      { kind: "survey" },
      foreignFieldId,
    );
    expect(res.status).toBe(404);
  });

  it("upload -- text in a coordinate cell on line 57 names the line and column, and saves nothing", async () => {
    const lines = demo("long-acre-as-planted.csv").toString("utf8").split("\n");
    const header = lines[0].split(",");
    const latCol = header.indexOf("lat");
    const cells = lines[56].split(",");
    cells[latCol] = "fifty-two";
    lines[56] = cells.join(",");
    const res = await upload(cookies.technician, lines.join("\n"), "broken.csv", { kind: "planted", crs: "EPSG:4326" });
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe("invalid_file");
    expect(body.error.issues).toEqual(
      expect.arrayContaining([
        expect.objectContaining({ line: 57, column: "lat", value: "fifty-two", severity: "error" }),
      ]),
    );
    expect(await datasetCount()).toBe(0);
  });

  it("upload -- the demo files are saved with their hash and row count", async () => {
    const p = await upload(cookies.technician, demo("long-acre-as-planted.csv"), "long-acre-as-planted.csv", {
      kind: "planted",
      crs: "EPSG:4326",
      acceptWarnings: "true",
    });
    expect(p.status).toBe(201);
    planted = (await p.json()).dataset;
    expect(planted.rowCount).toBe(4800);
    expect(planted.sha256).toMatch(/^[0-9a-f]{64}$/);
    const s = await upload(cookies.technician, demo("long-acre-survey.csv"), "long-acre-survey.csv", {
      kind: "survey",
      crs: "EPSG:25831",
      acceptWarnings: "true",
      presetName: "Total station export",
    });
    expect(s.status).toBe(201);
    survey = (await s.json()).dataset;
    expect(survey.rowCount).toBe(demo("long-acre-survey.csv").toString("utf8").trim().split("\n").length - 1);
    expect(await datasetCount()).toBe(2);
  });

  it("audit -- computes the demo audit and finds the RTK-float stretch of bed 3", async () => {
    const profiles: ToleranceProfileDto[] = (
      await (await profilesRoute.GET(req("/api/profiles", { cookie: cookies.technician }), ctx({}))).json()
    ).profiles;
    const profile = profiles.find((p) => p.name === "In-row weeding around plants")!;
    const res = await auditsRoute.POST(
      req("/api/audits?wait=1", {
        method: "POST",
        cookie: cookies.technician,
        body: JSON.stringify({
          fieldId,
          plantedDatasetId: planted.id,
          surveyDatasetId: survey.id,
          profileId: profile.id,
        }),
      }),
      ctx({}),
    );
    expect(res.status).toBe(201);
    audit = (await res.json()).audit;
    expect(audit.state).toBe("computed");
    const s = audit.summary!;
    expect(s.pairs).toBeGreaterThan(350);
    expect(s.unmatchedSurvey).toBeGreaterThanOrEqual(6); // the weeds
    // The float stretch lies 30 mm along the row: in-row weeding (along-row limit 10 mm) must fail on the share criterion.
    expect(audit.verdict!.passed).toBe(false);
    expect(audit.verdict!.criteria.find((c) => c.id === "share")!.passed).toBe(false);
    expect(audit.verdict!.criteria.find((c) => c.id === "checkpoints")!.passed).toBe(true);
    expect(s.groups.fix!.find((g) => g.key === "rtk-float")!.rmseAlong).toBeGreaterThan(0.025);
    expect(s.groups.fix!.find((g) => g.key === "rtk-fixed")!.rmseR).toBeLessThan(0.006);
    expect(s.groups.day?.map((g) => g.key)).toEqual(["2026-04-14", "2026-04-15"]); // local days, not UTC
    expect(s.raw!.rmseR!).toBeGreaterThan(s.rmseR! * 2); // camera correction helps
  });

  it("audit -- the same files pass the inter-row hoeing profile (cross-row limit only)", async () => {
    const profiles: ToleranceProfileDto[] = (
      await (await profilesRoute.GET(req("/api/profiles", { cookie: cookies.technician }), ctx({}))).json()
    ).profiles;
    const hoeing = profiles.find((p) => p.name === "Inter-row hoeing")!;
    const res = await auditsRoute.POST(
      req("/api/audits?wait=1", {
        method: "POST",
        cookie: cookies.technician,
        body: JSON.stringify({
          fieldId,
          plantedDatasetId: planted.id,
          surveyDatasetId: survey.id,
          profileId: hoeing.id,
          title: "Hoeing check",
        }),
      }),
      ctx({}),
    );
    const hoeingAudit: AuditDto = (await res.json()).audit;
    expect(hoeingAudit.verdict!.criteria.map((c) => [c.id, c.passed])).toEqual([
      ["checkpoints", true],
      ["cross", true],
      ["share", true],
    ]);
    expect(hoeingAudit.verdict!.passed).toBe(true);
  });

  it("audit -- residuals page server-side, largest radial error first, and filter out-of-tolerance", async () => {
    const url = `/api/audits/${audit.id}/residuals?sort=radial&dir=desc&pageSize=10`;
    const page: Page<ResidualRowDto> = await (
      await residualsRoute.GET(req(url, { cookie: cookies.grower }), ctx({ id: audit.id }))
    ).json();
    expect(page.total).toBe(audit.summary!.pairs);
    expect(page.rows).toHaveLength(10);
    expect(page.rows[0].radial).toBeGreaterThanOrEqual(page.rows[9].radial);
    expect(page.rows[0].bed).toBe("3");
    const out: Page<ResidualRowDto> = await (
      await residualsRoute.GET(
        req(`/api/audits/${audit.id}/residuals?only=out&pageSize=500`, { cookie: cookies.grower }),
        ctx({ id: audit.id }),
      )
    ).json();
    expect(out.rows.every((r) => r.within === false)).toBe(true);
    expect(out.total).toBe(audit.summary!.pairs - audit.summary!.withinTolerance!.within);
  });

  it("audit -- the per-plant CSV has one row per pair; another organisation gets 404 for audit, residuals and CSV", async () => {
    const csv = await (
      await csvRoute.GET(
        req(`/api/audits/${audit.id}/residuals.csv`, { cookie: cookies.grower }),
        ctx({ id: audit.id }),
      )
    ).text();
    expect(csv.trim().split("\n")).toHaveLength(audit.summary!.pairs + 1);
    for (const route of [auditRoute, residualsRoute, csvRoute]) {
      const res = await route.GET(req(`/api/audits/${audit.id}`, { cookie: cookies.other }), ctx({ id: audit.id }));
      expect(res.status).toBe(404);
    }
  });

  it("datasets -- a dataset used by an audit cannot be deleted (409 with the reason)", async () => {
    const res = await datasetRoute.DELETE(
      req(`/api/datasets/${survey.id}`, { method: "DELETE", cookie: cookies.technician }),
      ctx({ id: survey.id }),
    );
    expect(res.status).toBe(409);
    expect((await res.json()).error.message).toContain("input of");
    expect(await datasetCount()).toBe(2);
  });

  it("audit -- a grower cannot create an audit (403)", async () => {
    const res = await auditsRoute.POST(
      req("/api/audits", { method: "POST", cookie: cookies.grower, body: JSON.stringify({}) }),
      ctx({}),
    );
    expect(res.status).toBe(403);
  });
  it("audit storage -- other work gets a turn of the event loop between batches of rows; a large report is stored in parts", async () => {
    const { getDb } = await import("@/db/client");
    const { createAudit, storeAuditResult, getAuditById, REPORT_PART_BYTES } = await import("@/db/queries/audits");
    const { readAuditReport } = await import("@/lib/server/audits/report-files");
    const { audit: auditTable } = await import("@/db/schema");
    const { eq } = await import("drizzle-orm");
    const db = await getDb();
    const [src] = await db.select().from(auditTable).where(eq(auditTable.id, audit.id));
    const id = await createAudit(db, {
      orgId: src.orgId,
      userId: src.createdBy!,
      fieldId,
      plantedDatasetId: planted.id,
      surveyDatasetId: survey.id,
      profileId: src.profileId!,
      profileSnapshot: audit.profile!,
      settings: audit.settings!,
      title: "Batches",
    });
    const row = (seq: number) => ({
      auditId: id,
      seq,
      plantId: `B-${seq}`,
      surveyId: null,
      crop: null,
      bed: null,
      row: null,
      arm: null,
      fix: null,
      day: null,
      plantedE: 1,
      plantedN: 2,
      surveyE: 1,
      surveyN: 2,
      dE: 0,
      dN: 0,
      along: null,
      cross: null,
      radial: 0,
      within: true,
      outlier: false,
      pairedBy: "position",
      beyondMaxDistance: false,
    });
    const batches = [0, 1, 2].map((b) => ({
      kind: "residual" as const,
      rows: Array.from({ length: 2000 }, (_, k) => row(b * 2000 + k)),
    }));
    const report = new Uint8Array(REPORT_PART_BYTES + 1234).map((_, i) => (i * 7919) % 251);
    let storedWhenOthersRan = -1,
      stored = 0;
    // A request arriving now is served at the next turn of the event loop: before the last batch, not after it.
    setImmediate(() => {
      storedWhenOthersRan = stored;
    });
    await storeAuditResult(db, {
      id,
      orgId: src.orgId,
      summary: audit.summary!,
      verdict: audit.verdict!,
      settings: audit.settings!,
      rows: batches,
      total: 6000,
      reports: [{ kind: "residuals", bytes: report }],
      onBatch: (f) => {
        stored = Math.round(f * 6000);
      },
    });
    // A report larger than one stored part comes back byte for byte.
    const back = await readAuditReport(db, { auditId: id, kind: "residuals" });
    expect(back!.length).toBe(report.length);
    expect(Buffer.compare(Buffer.from(back!), Buffer.from(report))).toBe(0);
    expect(storedWhenOthersRan).toBeGreaterThanOrEqual(0);
    expect(storedWhenOthersRan).toBeLessThan(6000);
    expect((await getAuditById(db, { id, orgId: src.orgId }))!.state).toBe("computed");
  });
});
