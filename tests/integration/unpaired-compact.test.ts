/**
 * Planted records nobody surveyed stored compactly (issue 16; db/queries/unpaired.ts) against the same audit stored
 * the old way, a row per record: every reader of unpaired points must answer exactly the same. Two audits of the same
 * inputs are computed; the second is turned into the old form with rows built straight from the engine's output.
 * Run twice: the demo's planted file in the work CRS (positions read from the points blob) and the same file declared
 * in another CRS (projected positions stored).
 */
import { eq, sql } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import type { DB } from "@/db/client";
import { copyRows } from "@/db/copy";
import { audit, auditPlantedNotFound, auditUnpaired } from "@/db/schema";
import { pageUnpaired } from "@/db/queries/audits";
import { loadDatasetPoints } from "@/db/queries/datasets";
import { getMapExtent, getMapUnpaired, loadMapColumns } from "@/db/queries/map";
import { getAuditForReview, loadRecordMaterial } from "@/db/queries/review";
import { planOfSurvey, unpairedSplitCounts } from "@/db/queries/survey-plans";
import { clearPlantedNotFoundCache, countPlantedNotFound, loadPlantedNotFound } from "@/db/queries/unpaired";
import { runAudit } from "@/lib/audit/run";
import { DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";
import { unpairedRecordRows } from "@/lib/review/result-rows";
import { decodeMapPayload } from "@/lib/map/binary";
import { DICT_NAMES } from "@/lib/map/types";
import type { AuditDto, DatasetDto, ToleranceProfileDto, UnpairedRowDto } from "@/lib/api-types";

let db: DB;
const cookies: Record<string, string> = {};
let fieldId: string;
const fieldIds: Record<string, string> = {};
let hoeing: ToleranceProfileDto;
const routes = {} as {
  datasets: typeof import("@/app/api/fields/[fieldId]/datasets/route");
  audits: typeof import("@/app/api/audits/route");
  unpaired: typeof import("@/app/api/audits/[id]/unpaired/route");
  split: typeof import("@/app/api/audits/[id]/unpaired-split/route");
  mapData: typeof import("@/app/api/audits/[id]/map-data/route");
};

const post = (url: string, cookie: string, body: unknown) =>
  req(url, { method: "POST", cookie, body: JSON.stringify(body) });

async function datasets(): Promise<DatasetDto[]> {
  const res = await routes.datasets.GET(
    req(`/api/fields/${fieldId}/datasets`, { cookie: cookies.technician }),
    ctx({ fieldId }),
  );
  return (await res.json()).datasets;
}

async function computeAudit(plantedId: string, surveyId: string, title: string): Promise<AuditDto> {
  const res = await routes.audits.POST(
    post("/api/audits?wait=1", cookies.technician, {
      fieldId,
      plantedDatasetId: plantedId,
      surveyDatasetId: surveyId,
      profileId: hoeing.id,
      title,
    }),
    ctx({}),
  );
  expect(res.status).toBe(201);
  const audit = (await res.json()).audit as AuditDto;
  expect(audit.state).toBe("computed");
  return audit;
}

/**
 * Turn an audit computed in the compact form into the old form: its planted-not-found rows, built straight from a
 * fresh run of the engine on the stored inputs (not from the compact value), go into audit_unpaired.
 */
async function toRowForm(a: AuditDto): Promise<UnpairedRowDto[]> {
  const orgId = await orgOf(a.id);
  const planted = (await loadDatasetPoints(db, { id: a.planted!.id, orgId }))!;
  const survey = (await loadDatasetPoints(db, { id: a.survey!.id, orgId }))!;
  const run = runAudit({
    planted: { table: planted.table, crs: planted.dto.crs },
    survey: { table: survey.table, crs: survey.dto.crs },
    settings: a.settings!,
    profile: a.profile!,
  });
  if (!run.ok) throw new Error("the engine refused the demo audit");
  const all = unpairedRecordRows(run.pairing, run.planted, run.survey) as UnpairedRowDto[];
  const plantedRows = all.filter((r) => r.kind === "planted-not-found");
  expect(plantedRows.length).toBe(await countPlantedNotFound(db, { auditId: a.id }));
  await db.delete(auditPlantedNotFound).where(eq(auditPlantedNotFound.auditId, a.id));
  await copyRows(
    db,
    auditUnpaired,
    plantedRows.map((r) => ({ auditId: a.id, ...r })),
  );
  clearPlantedNotFoundCache();
  return all;
}

async function orgOf(auditId: string): Promise<string> {
  const [row] = await db.select({ orgId: audit.orgId }).from(audit).where(eq(audit.id, auditId));
  return row.orgId;
}

beforeAll(async () => {
  db = await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  routes.datasets = await import("@/app/api/fields/[fieldId]/datasets/route");
  routes.audits = await import("@/app/api/audits/route");
  routes.unpaired = await import("@/app/api/audits/[id]/unpaired/route");
  routes.split = await import("@/app/api/audits/[id]/unpaired-split/route");
  routes.mapData = await import("@/app/api/audits/[id]/map-data/route");
  const fieldsRoute = await import("@/app/api/fields/route");
  const fields = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.technician }), ctx({}))).json())
    .fields;
  for (const f of fields as { id: string; name: string }[]) fieldIds[f.name] = f.id;
  const profilesRoute = await import("@/app/api/profiles/route");
  hoeing = (
    (await (await profilesRoute.GET(req("/api/profiles", { cookie: cookies.qa_lead }), ctx({}))).json())
      .profiles as ToleranceProfileDto[]
  ).find((p) => p.name === "Inter-row hoeing")!;
}, 180_000);

function upload(csv: string, name: string, kind: "planted" | "survey") {
  const form = new FormData();
  form.set("file", new File([csv], name, { type: "text/csv" }));
  form.set("kind", kind);
  form.set("crs", "EPSG:25831");
  form.set("acceptWarnings", "true");
  return routes.datasets.POST(
    new Request(`http://localhost:3000/api/fields/${fieldId}/datasets`, {
      method: "POST",
      body: form,
      headers: { cookie: cookies.technician },
    }),
    ctx({ fieldId }),
  );
}

/**
 * Invented demo-style files for Long Acre in its work CRS (ETRS89 / UTM 31N): 6 beds × 5 rows × 40 plants, every 12th
 * plant surveyed 4 mm east and 3 mm south of its record, and two survey points without a record.
 */
async function uploadGridFiles(): Promise<void> {
  const planted = ["plant_id,crop,bed,row,easting,northing"];
  const survey = ["plant_id,easting,northing"];
  const b = (22.5 * Math.PI) / 180;
  let k = 0;
  for (let bed = 1; bed <= 6; bed++)
    for (let row = 1; row <= 5; row++)
      for (let i = 1; i <= 40; i++) {
        const across = (bed - 1) * 3 + (row - 1) * 0.5,
          along = i * 0.3;
        const e = 317_960 + along * Math.sin(b) + across * Math.cos(b);
        const n = 5_816_690 + along * Math.cos(b) - across * Math.sin(b);
        const id = `LG-${bed}-${row}-${String(i).padStart(3, "0")}`;
        planted.push(`${id},${row === 3 ? "" : "lettuce"},${bed},${row},${e.toFixed(4)},${n.toFixed(4)}`);
        if (k++ % 12 === 5) survey.push(`${id},${(e + 0.004).toFixed(4)},${(n - 0.003).toFixed(4)}`);
      }
  survey.push("LG-X-1,317975.0000,5816700.0000", "LG-X-2,317976.0000,5816701.0000");
  expect((await upload(`${planted.join("\n")}\n`, "long-acre-grid-as-planted.csv", "planted")).status).toBe(201);
  expect((await upload(`${survey.join("\n")}\n`, "long-acre-grid-survey.csv", "survey")).status).toBe(201);
}

/** Everything each reader answers for one audit, with the audit's own id left out. */
async function readersOf(audit: AuditDto, orgId: string) {
  // (the audit's own id appears in no answer compared below)
  const total = audit.summary!.unmatchedPlanted + audit.summary!.unmatchedSurvey + audit.summary!.ambiguousSurvey;
  const lead = audit.summary!.unmatchedPlanted;
  const pages: unknown[] = [];
  for (const kind of [undefined, "planted-not-found", "surveyed-not-planted", "ambiguous"] as const)
    for (const [page, pageSize] of [
      [1, 50],
      [Math.floor(lead / 50) + 1, 50], // straddles the last planted record and the first survey-side one
      [Math.ceil(total / 50), 50],
      [Math.ceil(total / 50) + 1, 50],
      [2, 7],
      [1, 500],
    ])
      pages.push(await pageUnpaired(db, { auditId: audit.id, kind, page, pageSize }));
  const viaRoute = await (
    await routes.unpaired.GET(
      req(`/api/audits/${audit.id}/unpaired?kind=planted-not-found&page=3&pageSize=25`, { cookie: cookies.grower }),
      ctx({ id: audit.id }),
    )
  ).json();
  const extent = await getMapExtent(db, { auditId: audit.id, orgId });
  const origin: [number, number] = [Math.round(extent!.minE), Math.round(extent!.minN)];
  const columns = await loadMapColumns(db, { auditId: audit.id, orgId, origin, textColumns: DICT_NAMES });
  const single = [];
  for (const seq of [-1, 0, 1, lead - 1, lead, lead + 1, total - 1, total, 10 ** 9])
    single.push(await getMapUnpaired(db, { auditId: audit.id, orgId, seq }));
  const payload = decodeMapPayload(
    new Uint8Array(
      await (
        await routes.mapData.GET(
          req(`/api/audits/${audit.id}/map-data`, { cookie: cookies.grower }),
          ctx({ id: audit.id }),
        )
      ).arrayBuffer(),
    ),
  );
  // The payload names its audit (id, title, time); everything else must agree.
  const { audit: _named, ...mapMeta } = payload.meta;
  const mapPayload = { meta: mapMeta, arrays: payload.arrays };
  const plan = await planOfSurvey(db, { surveyDatasetId: audit.survey!.id, orgId });
  const split = await unpairedSplitCounts(db, { auditId: audit.id, plan });
  const splitNoPlan = await unpairedSplitCounts(db, { auditId: audit.id, plan: null });
  const splitRoute = await (
    await routes.split.GET(
      req(`/api/audits/${audit.id}/unpaired-split`, { cookie: cookies.grower }),
      ctx({ id: audit.id }),
    )
  ).json();
  const material = await loadRecordMaterial(db, {
    auditId: audit.id,
    orgId,
    plantedDatasetId: audit.planted!.id,
    surveyDatasetId: audit.survey!.id,
  });
  const { storedRecordBody } = await import("@/lib/server/review/record-sources");
  const body = await storedRecordBody(db, (await getAuditForReview(db, { id: audit.id, orgId }))!);
  const { readAuditReport } = await import("@/lib/server/audits/report-files");
  const unpairedCsv = await readAuditReport(db, { auditId: audit.id, kind: "unpaired" });
  return {
    pages,
    viaRoute,
    extent,
    columns,
    single,
    mapPayload,
    split,
    splitNoPlan,
    splitRoute,
    unpaired: material.unpaired,
    results: body.results,
    unpairedCsv,
  };
}

describe.each([
  // Willow Strip: planted records in WGS 84 longitude/latitude, a survey made from a plan (projected positions stored)
  ["Willow Strip", "willow-strip-planned-survey.csv", true],
  // Long Acre: planted records in the work CRS (positions read from the points blob), no plan; files made below
  ["Long Acre", "long-acre-grid-survey.csv", false],
] as const)("planted records nobody surveyed, compact or as rows -- %s", (fieldName, surveyName, planned) => {
  let compact: AuditDto, rows: AuditDto;
  let engineRows: UnpairedRowDto[];
  let orgId: string;

  beforeAll(async () => {
    fieldId = fieldIds[fieldName];
    if (!planned) await uploadGridFiles();
    const all = await datasets();
    const planted = all.find((d) => d.kind === "planted")!;
    const survey = all.find((d) => (surveyName ? d.fileName === surveyName : d.kind === "survey"))!;
    compact = await computeAudit(planted.id, survey.id, `Compact unpaired ${fieldName}`);
    orgId = await orgOf(compact.id);
    rows = await computeAudit(planted.id, survey.id, `Unpaired as rows ${fieldName}`);
    engineRows = await toRowForm(rows);
  }, 180_000);

  it("stored -- the compact audit keeps no planted-not-found row; the old-form audit has no compact value", async () => {
    const count = await countPlantedNotFound(db, { auditId: compact.id });
    expect(count).toBe(compact.summary!.unmatchedPlanted);
    expect(count).toBeGreaterThan(1000);
    expect(count).toBeLessThan(compact.planted!.rowCount);
    const [{ n }] = (
      await db.execute(
        sql`select count(*)::int n from audit_unpaired where audit_id = ${compact.id} and kind = 'planted-not-found'`,
      )
    ).rows as { n: number }[];
    expect(n).toBe(0);
    expect(await countPlantedNotFound(db, { auditId: rows.id })).toBeNull();
    const set = await loadPlantedNotFound(db, { auditId: compact.id, orgId });
    // Positions are stored only when the work CRS moved them.
    expect(set!.part.e === null).toBe(!planned);
  });

  it("readers -- every reader answers the same for both forms, and as the engine's rows", async () => {
    const a = await readersOf(compact, orgId);
    clearPlantedNotFoundCache();
    const b = await readersOf(rows, orgId);
    expect(a.pages).toEqual(b.pages);
    expect(a.viaRoute).toEqual(b.viaRoute);
    expect(a.viaRoute.rows).toHaveLength(25);
    expect(a.extent).toEqual(b.extent);
    expect(a.columns).toEqual(b.columns);
    expect(a.single).toEqual(b.single);
    expect(a.single[1]).toEqual(engineRows[0]);
    expect(a.mapPayload).toEqual(b.mapPayload);
    expect(a.mapPayload.meta.unpaired).toBe(a.unpaired.length);
    expect(a.split).toEqual(b.split);
    if (planned) expect(a.split.sampledNotFound).toBeGreaterThan(0);
    expect(a.splitNoPlan).toEqual(b.splitNoPlan);
    expect(a.splitRoute).toEqual(b.splitRoute);
    expect(a.unpaired).toEqual(b.unpaired);
    expect(a.unpaired).toEqual(engineRows);
    expect(a.results).toEqual(b.results);
    expect(a.unpairedCsv).toEqual(b.unpairedCsv);
  });

  it("organisation -- another organisation reads no compactly stored record", async () => {
    expect(await loadPlantedNotFound(db, { auditId: compact.id, orgId: "another-org" })).toBeNull();
    expect(await getMapUnpaired(db, { auditId: compact.id, orgId: "another-org", seq: 0 })).toBeNull();
    const res = await routes.unpaired.GET(
      req(`/api/audits/${compact.id}/unpaired?kind=planted-not-found`, { cookie: cookies.other }),
      ctx({ id: compact.id }),
    );
    expect(res.status).toBe(404);
  });
});

describe("planted records nobody surveyed -- signed audits", () => {
  it("guard -- the compact value of a signed-off audit can no longer be changed, deleted or added", async () => {
    fieldId = fieldIds["Willow Strip"];
    const all = await datasets();
    const compute = (title: string) =>
      computeAudit(
        all.find((d) => d.kind === "planted")!.id,
        all.find((d) => d.fileName === "willow-strip-planned-survey.csv")!.id,
        title,
      );
    const signed = await compute("Compact unpaired, signed");
    const bare = await compute("Compact unpaired removed, signed");
    await db.delete(auditPlantedNotFound).where(eq(auditPlantedNotFound.auditId, bare.id));
    for (const a of [signed, bare]) await db.execute(sql`update audit set state = 'signed_off' where id = ${a.id}`);
    for (const statement of [
      sql`update audit_planted_not_found set count = count + 1 where audit_id = ${signed.id}`,
      sql`delete from audit_planted_not_found where audit_id = ${signed.id}`,
      sql`insert into audit_planted_not_found (audit_id, plants, count, bytes) values (${bare.id}, 1, 0, '\\x00')`,
    ]) {
      const err = await db.execute(statement).then(
        () => null,
        (e: Error & { cause?: Error }) => e,
      );
      expect(err, "the statement should have been refused").not.toBeNull();
      // drizzle wraps the database's error; the trigger's own message is its cause
      expect(String(err!.cause?.message ?? err!.message)).toMatch(/^plotproof: rows of the signed-off audit/);
    }
    expect(await countPlantedNotFound(db, { auditId: signed.id })).toBe(signed.summary!.unmatchedPlanted);
  });
});
