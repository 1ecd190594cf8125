import { beforeAll, describe, expect, it } from "vitest";
import { cookieFor, ctx, req, useMemoryDb } from "./helpers";
import { DEMO_FIELDS, DEMO_PASSWORD, DEMO_PEOPLE, OTHER_OWNER } from "@/lib/demo/farm";
import { generatePlanSurvey, readStakeoutCsv } from "@/lib/demo/plan-demo";
import { PLAN_DEMO_NAME } from "@/lib/demo/plan-seed";
import type { DatasetDto, ToleranceProfileDto } from "@/lib/api-types";
import type { ControlMarkDto, SurveyPlanDto, SurveyPlanWithPoints, SurveyRecordDto } from "@/lib/plan/dto";

const cookies: Record<string, string> = {};
let fieldId: string;
let foreignFieldId: string;
let demoPlan: SurveyPlanDto;
let planted: DatasetDto;
let hoeing: ToleranceProfileDto;
const routes = {} as {
  plans: typeof import("@/app/api/fields/[fieldId]/plans/route");
  plan: typeof import("@/app/api/plans/[planId]/route");
  csv: typeof import("@/app/api/plans/[planId]/stakeout.csv/route");
  geojson: typeof import("@/app/api/plans/[planId]/stakeout.geojson/route");
  records: typeof import("@/app/api/plans/[planId]/records/route");
  marks: typeof import("@/app/api/fields/[fieldId]/control-marks/route");
  mark: typeof import("@/app/api/control-marks/[markId]/route");
  datasets: typeof import("@/app/api/fields/[fieldId]/datasets/route");
  record: typeof import("@/app/api/datasets/[id]/survey-record/route");
  audits: typeof import("@/app/api/audits/route");
  split: typeof import("@/app/api/audits/[id]/unpaired-split/route");
  unpairedCsv: typeof import("@/app/api/audits/[id]/unpaired.csv/route");
};
const WILLOW = DEMO_FIELDS.find((f) => f.name === "Willow Strip")!;

function upload(cookie: string, csv: string, name: string, fields: Record<string, string>, target = fieldId) {
  const form = new FormData();
  form.set("file", new File([csv], name, { type: "text/csv" }));
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return routes.datasets.POST(
    new Request(`http://localhost:3000/api/fields/${target}/datasets`, {
      method: "POST",
      body: form,
      headers: { cookie },
    }),
    ctx({ fieldId: target }),
  );
}

const post = (url: string, cookie: string, body: unknown) =>
  req(url, { method: "POST", cookie, body: JSON.stringify(body) });

async function datasets(): Promise<DatasetDto[]> {
  const res = await routes.datasets.GET(
    req(`/api/fields/${fieldId}/datasets`, { cookie: cookies.technician }),
    ctx({ fieldId }),
  );
  return (await res.json()).datasets;
}

beforeAll(async () => {
  await useMemoryDb();
  const { seedDemo } = await import("@/lib/demo/seed");
  await seedDemo();
  for (const p of DEMO_PEOPLE) cookies[p.role] = await cookieFor(p.email, DEMO_PASSWORD);
  cookies.other = await cookieFor(OTHER_OWNER.email, DEMO_PASSWORD);
  routes.plans = await import("@/app/api/fields/[fieldId]/plans/route");
  routes.plan = await import("@/app/api/plans/[planId]/route");
  routes.csv = await import("@/app/api/plans/[planId]/stakeout.csv/route");
  routes.geojson = await import("@/app/api/plans/[planId]/stakeout.geojson/route");
  routes.records = await import("@/app/api/plans/[planId]/records/route");
  routes.marks = await import("@/app/api/fields/[fieldId]/control-marks/route");
  routes.mark = await import("@/app/api/control-marks/[markId]/route");
  routes.datasets = await import("@/app/api/fields/[fieldId]/datasets/route");
  routes.record = await import("@/app/api/datasets/[id]/survey-record/route");
  routes.audits = await import("@/app/api/audits/route");
  routes.split = await import("@/app/api/audits/[id]/unpaired-split/route");
  routes.unpairedCsv = await import("@/app/api/audits/[id]/unpaired.csv/route");
  const fieldsRoute = await import("@/app/api/fields/route");
  const fields = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.technician }), ctx({}))).json())
    .fields;
  fieldId = fields.find((f: { name: string }) => f.name === "Willow Strip").id;
  foreignFieldId = (await (await fieldsRoute.GET(req("/api/fields", { cookie: cookies.other }), ctx({}))).json())
    .fields[0].id;
  const list = await routes.plans.GET(
    req(`/api/fields/${fieldId}/plans`, { cookie: cookies.grower }),
    ctx({ fieldId }),
  );
  demoPlan = (await list.json()).plans[0];
  planted = (await datasets()).find((d) => d.kind === "planted")!;
  const profilesRoute = await import("@/app/api/profiles/route");
  hoeing = (
    (await (await profilesRoute.GET(req("/api/profiles", { cookie: cookies.qa_lead }), ctx({}))).json())
      .profiles as ToleranceProfileDto[]
  ).find((p) => p.name === "Inter-row hoeing")!;
}, 180_000);

describe("survey plans through the API", () => {
  it("demo -- Willow Strip has a plan, used by the planned survey, with its coverage", async () => {
    expect(demoPlan.name).toBe(PLAN_DEMO_NAME);
    expect(demoPlan.sampleSize.byShare).toBe(59); // Collins, ARL-TR-5214: ⌈ln 0.05 / ln 0.95⌉
    expect(demoPlan.checkpoints).toBeGreaterThanOrEqual(59);
    expect(demoPlan.usedBy).toBe(1);
    const survey = (await datasets()).find((d) => d.fileName === "willow-strip-planned-survey.csv")!;
    const res = await routes.record.GET(
      req(`/api/datasets/${survey.id}/survey-record`, { cookie: cookies.grower }),
      ctx({ id: survey.id }),
    );
    const { record } = (await res.json()) as { record: SurveyRecordDto };
    expect(record.planName).toBe(PLAN_DEMO_NAME);
    expect(record.instrumentCheck!.word).toBe("meets");
    expect(record.coverage!.planned).toBe(demoPlan.checkpoints);
    expect(record.coverage!.checkpointsSurveyed + record.coverage!.missing.length).toBe(demoPlan.checkpoints);
    // The demo survey records its dead and not-found plants in the file's status column (lib/demo/plan-demo.ts).
    expect(record.coverage!.missing.length).toBeGreaterThan(0);
    for (const m of record.coverage!.missing) expect(m.line).toBeGreaterThan(1);
  });

  it("plan -- a technician and a grower may not make a plan (403); a grower may read it", async () => {
    const body = { name: "x", plantedDatasetId: planted.id, profileId: hoeing.id };
    for (const role of ["technician", "grower"])
      expect(
        (await routes.plans.POST(post(`/api/fields/${fieldId}/plans`, cookies[role], body), ctx({ fieldId }))).status,
      ).toBe(403);
    const read = await routes.plan.GET(
      req(`/api/plans/${demoPlan.id}`, { cookie: cookies.grower }),
      ctx({ planId: demoPlan.id }),
    );
    expect(read.status).toBe(200);
  });

  it("plan map -- a grower reads every as-planted record of the plan's dataset in the field's CRS", async () => {
    const res = await routes.records.GET(
      req(`/api/plans/${demoPlan.id}/records`, { cookie: cookies.grower }),
      ctx({ planId: demoPlan.id }),
    );
    expect(res.status).toBe(200);
    const { records } = await res.json();
    const ds = await routes.datasets.GET(
      req(`/api/fields/${fieldId}/datasets`, { cookie: cookies.grower }),
      ctx({ fieldId }),
    );
    const plantedDs = ((await ds.json()).datasets as DatasetDto[]).find((d) => d.id === demoPlan.plantedDatasetId)!;
    expect(records.crs).toBe(demoPlan.fieldCrs);
    expect(records.count + records.unplaced).toBe(plantedDs.rowCount);
    expect(records.xy).toHaveLength(2 * records.count);
    // A planned plant lies on one of the records (the plan chose it from them), to the centimetre.
    const plan = (
      await (
        await routes.plan.GET(
          req(`/api/plans/${demoPlan.id}`, { cookie: cookies.grower }),
          ctx({ planId: demoPlan.id }),
        )
      ).json()
    ).plan as SurveyPlanWithPoints;
    const p = plan.points[0];
    const ce = Math.round((p.e - records.origin[0]) * 100);
    const cn = Math.round((p.n - records.origin[1]) * 100);
    let hit = false;
    for (let i = 0; i < records.xy.length; i += 2) if (records.xy[i] === ce && records.xy[i + 1] === cn) hit = true;
    expect(hit).toBe(true);
  });

  it("plan -- another organisation gets 404 for the plan, its stakeout files, the field's plans and marks", async () => {
    const c = { cookie: cookies.other };
    const p = { planId: demoPlan.id };
    expect((await routes.plan.GET(req(`/api/plans/${demoPlan.id}`, c), ctx(p))).status).toBe(404);
    expect((await routes.csv.GET(req(`/api/plans/${demoPlan.id}/stakeout.csv`, c), ctx(p))).status).toBe(404);
    expect((await routes.geojson.GET(req(`/api/plans/${demoPlan.id}/stakeout.geojson`, c), ctx(p))).status).toBe(404);
    expect((await routes.records.GET(req(`/api/plans/${demoPlan.id}/records`, c), ctx(p))).status).toBe(404);
    expect((await routes.plans.GET(req(`/api/fields/${fieldId}/plans`, c), ctx({ fieldId }))).status).toBe(404);
    expect((await routes.marks.GET(req(`/api/fields/${fieldId}/control-marks`, c), ctx({ fieldId }))).status).toBe(404);
    const created = await routes.plans.POST(
      post(`/api/fields/${fieldId}/plans`, cookies.other, {
        name: "x",
        plantedDatasetId: planted.id,
        profileId: hoeing.id,
      }),
      ctx({ fieldId }),
    );
    expect(created.status).toBe(404);
    const marks = (
      await (
        await routes.marks.GET(
          req(`/api/fields/${fieldId}/control-marks`, { cookie: cookies.qa_lead }),
          ctx({ fieldId }),
        )
      ).json()
    ).marks as ControlMarkDto[];
    const m = { markId: marks[0].id };
    expect((await routes.mark.GET(req(`/api/control-marks/${m.markId}`, c), ctx(m))).status).toBe(404);
    const put = req(`/api/control-marks/${m.markId}`, {
      method: "PUT",
      cookie: cookies.other,
      body: JSON.stringify({ name: "Z", e: 1, n: 2 }),
    });
    expect((await routes.mark.PUT(put, ctx(m))).status).toBe(404);
    expect(
      (
        await routes.mark.DELETE(
          req(`/api/control-marks/${m.markId}`, { method: "DELETE", cookie: cookies.other }),
          ctx(m),
        )
      ).status,
    ).toBe(404);
    // and the other organisation cannot upload against this organisation's plan in its own field
    const r = await upload(
      cookies.other,
      "plant_id,easting,northing\nA,320620,5814920\n",
      "s.csv",
      { kind: "survey", crs: "EPSG:25831", acceptWarnings: "true", fieldwork: JSON.stringify({ planId: demoPlan.id }) },
      foreignFieldId,
    );
    expect(r.status).toBe(422);
    expect((await r.json()).error.message).toBe("The survey plan chosen is not a plan of this field.");
  });

  it("plan -- stakeout CSV in the field's CRS with our columns; same seed, same plants", async () => {
    const res = await routes.csv.GET(
      req(`/api/plans/${demoPlan.id}/stakeout.csv`, { cookie: cookies.technician }),
      ctx({ planId: demoPlan.id }),
    );
    expect(res.headers.get("content-type")).toContain("text/csv");
    const text = await res.text();
    expect(text.split("\r\n")[0]).toBe("point,easting,northing,plant_id,crop,bed,row,arm,kind");
    const first = text.split("\r\n")[1].split(",");
    expect(first[0]).toMatch(/^C0001-B1$/);
    expect(Number(first[1])).toBeGreaterThan(320_000); // ETRS89 / UTM 31N easting near the field's origin
    const again = await routes.plans.POST(
      post(`/api/fields/${fieldId}/plans`, cookies.qa_lead, {
        ...demoPlan.parameters,
        name: "Same seed again",
        plantedDatasetId: planted.id,
        profileId: hoeing.id,
        seed: demoPlan.seed,
      }),
      ctx({ fieldId }),
    );
    expect(again.status).toBe(201);
    const replay = (await again.json()).plan as SurveyPlanWithPoints;
    const original = (
      await (
        await routes.plan.GET(
          req(`/api/plans/${demoPlan.id}`, { cookie: cookies.qa_lead }),
          ctx({ planId: demoPlan.id }),
        )
      ).json()
    ).plan as SurveyPlanWithPoints;
    expect(replay.points.map((p) => p.plantId)).toEqual(original.points.map((p) => p.plantId));
  });

  it("plan -- too few plants or a stratum below its minimum: 422 naming the numbers, nothing saved", async () => {
    const before = (
      await (
        await routes.plans.GET(req(`/api/fields/${fieldId}/plans`, { cookie: cookies.qa_lead }), ctx({ fieldId }))
      ).json()
    ).plans.length;
    const tooMany = await routes.plans.POST(
      post(`/api/fields/${fieldId}/plans`, cookies.qa_lead, {
        name: "Too many",
        plantedDatasetId: planted.id,
        profileId: hoeing.id,
        allowedFailures: 10,
        strataBy: ["bed", "fix"],
        minPerStratum: 200,
      }),
      ctx({ fieldId }),
    );
    expect(tooMany.status).toBe(422);
    expect((await tooMany.json()).error.message).toMatch(
      /^1 stratum\(s\) have fewer plants than the minimum of 200 per stratum: bed 3 · fix quality rtk-float has 160\. /,
    );
    const small = await routes.plans.POST(
      post(`/api/fields/${fieldId}/plans`, cookies.qa_lead, {
        name: "Huge margin",
        plantedDatasetId: planted.id,
        profileId: hoeing.id,
        bedEndM: 20.5,
      }),
      ctx({ fieldId }),
    );
    expect(small.status).toBe(422);
    expect((await small.json()).error.message).toBe(
      "The profile needs 59 checkpoints but the as-planted dataset has 1920 plants (32 after leaving out 20.5 m at each bed end).",
    );
    const bad = await routes.plans.POST(
      post(`/api/fields/${fieldId}/plans`, cookies.qa_lead, {
        name: "",
        plantedDatasetId: "x",
        profileId: hoeing.id,
        minSpacingM: -1,
      }),
      ctx({ fieldId }),
    );
    expect(bad.status).toBe(422);
    const after = (
      await (
        await routes.plans.GET(req(`/api/fields/${fieldId}/plans`, { cookie: cookies.qa_lead }), ctx({ fieldId }))
      ).json()
    ).plans.length;
    expect(after).toBe(before);
  });

  it("control marks -- QA lead adds one; a technician may not; a duplicate name is refused", async () => {
    const body = { name: "WS-CM2", e: 320615.5, n: 5814910.25, h: null, description: "Second pin", source: "test" };
    expect(
      (
        await routes.marks.POST(
          post(`/api/fields/${fieldId}/control-marks`, cookies.technician, body),
          ctx({ fieldId }),
        )
      ).status,
    ).toBe(403);
    const ok = await routes.marks.POST(
      post(`/api/fields/${fieldId}/control-marks`, cookies.qa_lead, body),
      ctx({ fieldId }),
    );
    expect(ok.status).toBe(201);
    const dup = await routes.marks.POST(
      post(`/api/fields/${fieldId}/control-marks`, cookies.owner, body),
      ctx({ fieldId }),
    );
    expect(dup.status).toBe(422);
    expect((await dup.json()).error.message).toBe('This field already has a control mark called "WS-CM2".');
  });

  it("survey upload -- a control mark 10 × the precision off is refused; a survey matching no plan point too; nothing saved", async () => {
    const plan = (
      await (
        await routes.plan.GET(
          req(`/api/plans/${demoPlan.id}`, { cookie: cookies.technician }),
          ctx({ planId: demoPlan.id }),
        )
      ).json()
    ).plan as SurveyPlanWithPoints;
    const marks = (
      await (
        await routes.marks.GET(
          req(`/api/fields/${fieldId}/control-marks`, { cookie: cookies.technician }),
          ctx({ fieldId }),
        )
      ).json()
    ).marks as ControlMarkDto[];
    const mark = marks.find((m) => m.name === "WS-CM1")!;
    const count = (await datasets()).length;
    const csvText = await (
      await routes.csv.GET(
        req(`/api/plans/${plan.id}/stakeout.csv`, { cookie: cookies.technician }),
        ctx({ planId: plan.id }),
      )
    ).text();
    const survey = generatePlanSurvey(WILLOW, readStakeoutCsv(csvText), 99);
    const fieldwork = {
      planId: plan.id,
      controlMarkId: mark.id,
      before: { e: mark.e + 0.03, n: mark.n - 0.04 },
      after: survey.after,
      precisionMm: 2,
    };
    const far = await upload(cookies.technician, survey.csv, "far.csv", {
      kind: "survey",
      crs: "EPSG:25831",
      acceptWarnings: "true",
      fieldwork: JSON.stringify(fieldwork),
    });
    expect(far.status).toBe(422);
    expect((await far.json()).error.message).toContain(
      "the measurement before the survey lies 50 mm from the known position of WS-CM1 (east 30 mm, north -40 mm), more than ten times the instrument's stated precision (10 × 2 mm = 20 mm)",
    );
    const nomatch = await upload(
      cookies.technician,
      "plant_id,easting,northing\nQQ-1,320620.1,5814920.1\nQQ-2,320621.1,5814920.1\n",
      "nomatch.csv",
      {
        kind: "survey",
        crs: "EPSG:25831",
        acceptWarnings: "true",
        fieldwork: JSON.stringify({ planId: plan.id }),
      },
    );
    expect(nomatch.status).toBe(422);
    expect((await nomatch.json()).error.message).toMatch(
      /^Nomatch\.csv was not saved: none of the 2 named survey points matches a point of the plan \(\d+ points, e\.g\. C0001-B1/,
    );
    expect((await datasets()).length).toBe(count);
  });

  it("survey upload -- the file's status rows and the form's list count as recorded missing; bad status rows are refused", async () => {
    const csvText = await (
      await routes.csv.GET(
        req(`/api/plans/${demoPlan.id}/stakeout.csv`, { cookie: cookies.technician }),
        ctx({ planId: demoPlan.id }),
      )
    ).text();
    const points = readStakeoutCsv(csvText);
    const [byFile, byForm] = points.filter((p) => !p.spare).slice(0, 2);
    const survey = generatePlanSurvey(WILLOW, points, 99);
    const lines = survey.csv.trimEnd().split("\n");
    // The first checkpoint is recorded dead in the file (point name, no position); the second is left out of the file
    // and reported "not found" on the form.
    const at = lines.findIndex((l) => l.startsWith(`${byFile.plantId},`));
    lines[at] = `${byFile.name},Dead,,,,,`;
    const text = `${lines.filter((l) => !l.startsWith(`${byForm.plantId},`)).join("\n")}\n`;
    const fieldwork = { planId: demoPlan.id, missing: [{ name: byForm.name, status: "not found" }] };
    const count = (await datasets()).length;

    // A status row naming a point the plan does not have: refused with file, line and column.
    const stranger = await upload(cookies.technician, `${text}WS-NOPE,dead,,,,,\n`, "stranger.csv", {
      kind: "survey",
      crs: "EPSG:25831",
      acceptWarnings: "true",
      fieldwork: JSON.stringify(fieldwork),
    });
    expect(stranger.status).toBe(422);
    const strangerBody = (await stranger.json()).error;
    const strangerLine = text.trimEnd().split("\n").length + 1;
    expect(strangerBody.message).toBe(
      `stranger.csv was not saved: 1 row(s) record a point as dead or not found that is not in the plan "${PLAN_DEMO_NAME}"; first: line ${strangerLine}, column id, "WS-NOPE".`,
    );
    expect(strangerBody.issues[0]).toMatchObject({
      file: "stranger.csv",
      line: strangerLine,
      column: "id",
      value: "WS-NOPE",
    });

    // An unknown status value: refused by the reader, naming line, column and value.
    const unknown = await upload(cookies.technician, `${text}${byForm.name},broken,,,,,\n`, "unknown.csv", {
      kind: "survey",
      crs: "EPSG:25831",
      acceptWarnings: "true",
      fieldwork: JSON.stringify(fieldwork),
    });
    expect(unknown.status).toBe(422);
    expect((await unknown.json()).error.issues[0]).toMatchObject({
      code: "status-unknown",
      file: "unknown.csv",
      column: "status",
      value: "broken",
    });

    // Without a plan the status rows cannot be counted: a warning the uploader must accept.
    const noPlan = await upload(cookies.technician, text, "no-plan.csv", { kind: "survey", crs: "EPSG:25831" });
    expect(noPlan.status).toBe(422);
    const noPlanBody = (await noPlan.json()).error;
    expect(noPlanBody.code).toBe("warnings_unaccepted");
    expect(noPlanBody.issues).toContainEqual(
      expect.objectContaining({ code: "status-without-plan", file: "no-plan.csv", line: at + 1 }),
    );
    expect((await datasets()).length).toBe(count);

    const ok = await upload(cookies.technician, text, "status-column.csv", {
      kind: "survey",
      crs: "EPSG:25831",
      acceptWarnings: "true",
      fieldwork: JSON.stringify(fieldwork),
    });
    expect(ok.status, await ok.clone().text()).toBe(201);
    const saved = (await ok.json()).dataset as DatasetDto;
    const { record } = (await (
      await routes.record.GET(
        req(`/api/datasets/${saved.id}/survey-record`, { cookie: cookies.grower }),
        ctx({ id: saved.id }),
      )
    ).json()) as { record: SurveyRecordDto };
    const missing = record.coverage!.missing;
    expect(missing.find((m) => m.name === byFile.name)).toMatchObject({ status: "dead", line: at + 1 });
    expect(missing.find((m) => m.name === byForm.name)).toMatchObject({ status: "not found" });
    expect(missing.find((m) => m.name === byForm.name)!.line).toBeUndefined();
    for (const m of survey.missing) expect(missing.find((x) => x.name === m.name)).toMatchObject({ status: m.status });
    expect(record.coverage!.checkpointsSurveyed).toBe(demoPlan.checkpoints - missing.length);
    expect(record.missingReported).toContainEqual({ name: byFile.name, status: "dead", line: at + 1 });
  });

  it("audit -- unpaired counts split by the plan; the unpaired CSV holds only sampled and surveyed points unless all=1", async () => {
    const survey = (await datasets()).find((d) => d.fileName === "willow-strip-planned-survey.csv")!;
    const res = await routes.audits.POST(
      post("/api/audits?wait=1", cookies.technician, {
        fieldId,
        plantedDatasetId: planted.id,
        surveyDatasetId: survey.id,
        profileId: hoeing.id,
        title: "Planned check",
      }),
      ctx({}),
    );
    expect(res.status).toBe(201);
    const audit = (await res.json()).audit;
    const split = (
      await (
        await routes.split.GET(
          req(`/api/audits/${audit.id}/unpaired-split`, { cookie: cookies.grower }),
          ctx({ id: audit.id }),
        )
      ).json()
    ).split;
    expect(split.planName).toBe(PLAN_DEMO_NAME);
    expect(split.notSampled + split.sampledNotFound).toBe(audit.summary.unmatchedPlanted);
    expect(split.notSampled).toBeGreaterThan(1700);
    expect(split.sampledNotFound).toBeGreaterThan(0);
    expect(split.sampledNotFound).toBeLessThan(40);
    const few = await (
      await routes.unpairedCsv.GET(
        req(`/api/audits/${audit.id}/unpaired.csv`, { cookie: cookies.grower }),
        ctx({ id: audit.id }),
      )
    ).text();
    const all = await (
      await routes.unpairedCsv.GET(
        req(`/api/audits/${audit.id}/unpaired.csv?all=1`, { cookie: cookies.grower }),
        ctx({ id: audit.id }),
      )
    ).text();
    const lines = (t: string) => t.split("\n").filter((l) => l !== "").length - 1;
    expect(lines(few)).toBe(split.sampledNotFound + split.surveyedNoRecord + split.ambiguous);
    expect(lines(all)).toBe(
      audit.summary.unmatchedPlanted + audit.summary.unmatchedSurvey + audit.summary.ambiguousSurvey,
    );
    expect(
      (
        await routes.split.GET(
          req(`/api/audits/${audit.id}/unpaired-split`, { cookie: cookies.other }),
          ctx({ id: audit.id }),
        )
      ).status,
    ).toBe(404);
  });
});
