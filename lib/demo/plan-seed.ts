import "server-only";
import { eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { user } from "@/db/schema";
import { listFields } from "@/db/queries/fields";
import { listProfiles } from "@/db/queries/profiles";
import { createControlMark } from "@/db/queries/survey-plans";
import { ingestDataset } from "@/lib/server/datasets/ingest-dataset";
import { createPlan } from "@/lib/server/plans/plans";
import type { Viewer } from "@/lib/server/access";
import { PlanInput } from "@/lib/validation/plan";
import { DEMO_FIELDS, DEMO_ORG, DEMO_PEOPLE } from "./farm";
import { generateDemoFiles } from "./generate";
import { demoControlMark, generatePlanSurvey, PLAN_DEMO_FIELD, PLAN_DEMO_NAME } from "./plan-demo";

export { PLAN_DEMO_FIELD, PLAN_DEMO_NAME };

async function viewerFor(orgId: string, role: "qa_lead" | "technician"): Promise<Viewer> {
  const person = DEMO_PEOPLE.find((p) => p.role === role)!;
  const [row] = await (await getDb()).select({ id: user.id }).from(user).where(eq(user.email, person.email));
  return { userId: row.id, name: person.name, email: person.email, orgId, orgName: DEMO_ORG.name, role };
}

/**
 * Demo of survey planning on first start: Willow Strip gets its as-planted records, a control mark, a plan made by
 * the QA lead and a survey the technician made from it (with the control-mark check; the planned plants found dead or
 * not found are rows of the file's status column, without a position).
 */
export async function seedPlanDemo(orgId: string): Promise<void> {
  const db = await getDb();
  const spec = DEMO_FIELDS.find((f) => f.name === PLAN_DEMO_FIELD)!;
  const field = (await listFields(db, { orgId })).find((f) => f.name === PLAN_DEMO_FIELD)!;
  const lead = await viewerFor(orgId, "qa_lead");
  const technician = await viewerFor(orgId, "technician");
  const files = generateDemoFiles(spec);
  const slug = spec.name.toLowerCase().replace(/\s+/g, "-");
  const planted = await ingestDataset({
    viewer: technician,
    fieldId: field.id,
    kind: "planted",
    fileName: `${slug}-as-planted.csv`,
    contentType: "text/csv",
    bytes: new TextEncoder().encode(files.plantedCsv),
    crs: "EPSG:4326",
    acceptWarnings: true,
  });
  const mark = await createControlMark(db, {
    orgId,
    fieldId: field.id,
    userId: lead.userId,
    input: demoControlMark(spec),
  });
  const profile = (await listProfiles(db, { orgId })).find((p) => p.name === "Inter-row hoeing")!;
  const plan = await createPlan(
    lead,
    field.id,
    PlanInput.parse({
      name: PLAN_DEMO_NAME,
      plantedDatasetId: planted.dataset.id,
      profileId: profile.id,
      strataBy: ["bed"],
      minPerStratum: 8,
      sparesPerStratum: 2,
      minSpacingM: 1,
      bedEndM: 1,
      seed: 20260509,
    }),
    () => 20260509,
  );
  const survey = generatePlanSurvey(spec, plan.points, 20260516);
  await ingestDataset({
    viewer: technician,
    fieldId: field.id,
    kind: "survey",
    fileName: `${slug}-planned-survey.csv`,
    contentType: "text/csv",
    bytes: new TextEncoder().encode(survey.csv),
    crs: "EPSG:25831",
    acceptWarnings: true,
    fieldwork: {
      planId: plan.id,
      controlMarkId: mark.id,
      before: survey.before,
      after: survey.after,
      instrument: 'Total station, 1" class (demo)',
      serial: "KF-TS-0412",
      calibrationDate: "2026-03-02",
      precisionMm: 2,
      surveyor: technician.name,
      method: "Total station from two setups on the headland",
      missing: [],
    },
  });
}
