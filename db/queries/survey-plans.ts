import "server-only";
import { and, asc, count, desc, eq, inArray, sql } from "drizzle-orm";
import type { DB } from "@/db/client";
import { auditUnpaired, controlMark, dataset, field, surveyPlan, surveyPlanPoint, surveyRecord } from "@/db/schema";
import { logActivity } from "@/db/queries/activity";
import { loadPlantedNotFound } from "./unpaired";
import type {
  ControlMarkDto,
  PlanParameters,
  PlanPointDto,
  PlanProfileCopy,
  SurveyPlanDto,
  SurveyPlanWithPoints,
  SurveyRecordDto,
  UnpairedSplitDto,
} from "@/lib/plan/dto";
import type { SampleSize } from "@/lib/plan/sample-size";
import type { StratumPlan } from "@/lib/plan/select";

// ---------------------------------------------------------------------------------------------------------------
// Plans
// ---------------------------------------------------------------------------------------------------------------

const planCols = {
  id: surveyPlan.id,
  fieldId: surveyPlan.fieldId,
  fieldName: field.name,
  fieldCrs: field.crs,
  plantedDatasetId: surveyPlan.plantedDatasetId,
  plantedFileName: dataset.fileName,
  name: surveyPlan.name,
  profileSnapshot: surveyPlan.profileSnapshot,
  parameters: surveyPlan.parameters,
  seed: surveyPlan.seed,
  sampleSize: surveyPlan.sampleSize,
  strata: surveyPlan.strata,
  selectionNotes: surveyPlan.selectionNotes,
  createdByName: surveyPlan.createdByName,
  createdAt: surveyPlan.createdAt,
  checkpoints: sql<number>`(select count(*)::int from ${surveyPlanPoint} where ${surveyPlanPoint.planId} = ${surveyPlan.id} and not ${surveyPlanPoint.spare})`,
  spares: sql<number>`(select count(*)::int from ${surveyPlanPoint} where ${surveyPlanPoint.planId} = ${surveyPlan.id} and ${surveyPlanPoint.spare})`,
  usedBy: sql<number>`(select count(*)::int from ${surveyRecord} where ${surveyRecord.planId} = ${surveyPlan.id})`,
};

type PlanRow = {
  [K in keyof typeof planCols]: unknown;
} & { id: string; createdAt: Date };

function toPlanDto(r: PlanRow): SurveyPlanDto {
  return {
    id: r.id,
    fieldId: r.fieldId as string,
    fieldName: r.fieldName as string,
    fieldCrs: r.fieldCrs as string,
    plantedDatasetId: r.plantedDatasetId as string,
    plantedFileName: r.plantedFileName as string,
    name: r.name as string,
    profile: r.profileSnapshot as PlanProfileCopy,
    parameters: r.parameters as PlanParameters,
    seed: Number(r.seed),
    sampleSize: r.sampleSize as SampleSize,
    strata: r.strata as StratumPlan[],
    selectionNotes: r.selectionNotes as SurveyPlanDto["selectionNotes"],
    checkpoints: Number(r.checkpoints),
    spares: Number(r.spares),
    createdByName: r.createdByName as string,
    createdAt: r.createdAt.toISOString(),
    usedBy: Number(r.usedBy),
  };
}

function planQuery(db: DB) {
  return db
    .select(planCols)
    .from(surveyPlan)
    .innerJoin(field, eq(field.id, surveyPlan.fieldId))
    .innerJoin(dataset, eq(dataset.id, surveyPlan.plantedDatasetId));
}

export interface NewPlan {
  orgId: string;
  fieldId: string;
  plantedDatasetId: string;
  userId: string;
  userName: string;
  name: string;
  profileId: string | null;
  profile: PlanProfileCopy;
  parameters: PlanParameters;
  seed: number;
  sampleSize: SampleSize;
  strata: StratumPlan[];
  selectionNotes: SurveyPlanDto["selectionNotes"];
  points: Omit<PlanPointDto, "seq">[];
}

/** Save a plan, its points and an activity entry in one transaction. */
export async function createSurveyPlan(db: DB, p: NewPlan): Promise<string> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(surveyPlan)
      .values({
        orgId: p.orgId,
        fieldId: p.fieldId,
        plantedDatasetId: p.plantedDatasetId,
        name: p.name,
        profileId: p.profileId,
        profileSnapshot: p.profile,
        parameters: p.parameters,
        seed: p.seed,
        sampleSize: p.sampleSize,
        strata: p.strata,
        selectionNotes: p.selectionNotes,
        createdBy: p.userId,
        createdByName: p.userName,
      })
      .returning({ id: surveyPlan.id });
    for (let i = 0; i < p.points.length; i += 1000)
      await tx.insert(surveyPlanPoint).values(
        p.points.slice(i, i + 1000).map((pt, k) => ({
          planId: row.id,
          seq: i + k + 1,
          name: pt.name,
          plantId: pt.plantId,
          stratum: pt.stratum,
          spare: pt.spare,
          e: pt.e,
          n: pt.n,
          crop: pt.crop,
          bed: pt.bed,
          row: pt.row,
          arm: pt.arm,
        })),
      );
    await logActivity(tx, {
      orgId: p.orgId,
      actorId: p.userId,
      action: "plan.created",
      subjectType: "survey_plan",
      subjectId: row.id,
      detail: { name: p.name, fieldId: p.fieldId, checkpoints: p.points.filter((x) => !x.spare).length, seed: p.seed },
    });
    return row.id;
  });
}

export async function listSurveyPlans(
  db: DB,
  { orgId, fieldId }: { orgId: string; fieldId: string },
): Promise<SurveyPlanDto[]> {
  const rows = await planQuery(db)
    .where(and(eq(surveyPlan.orgId, orgId), eq(surveyPlan.fieldId, fieldId)))
    .orderBy(desc(surveyPlan.createdAt));
  return rows.map((r) => toPlanDto(r as PlanRow));
}

export async function getSurveyPlan(
  db: DB,
  { id, orgId }: { id: string; orgId: string },
): Promise<SurveyPlanWithPoints | null> {
  const [row] = await planQuery(db).where(and(eq(surveyPlan.id, id), eq(surveyPlan.orgId, orgId)));
  if (!row) return null;
  const points = await db
    .select({
      seq: surveyPlanPoint.seq,
      name: surveyPlanPoint.name,
      plantId: surveyPlanPoint.plantId,
      stratum: surveyPlanPoint.stratum,
      spare: surveyPlanPoint.spare,
      e: surveyPlanPoint.e,
      n: surveyPlanPoint.n,
      crop: surveyPlanPoint.crop,
      bed: surveyPlanPoint.bed,
      row: surveyPlanPoint.row,
      arm: surveyPlanPoint.arm,
    })
    .from(surveyPlanPoint)
    .where(eq(surveyPlanPoint.planId, id))
    .orderBy(asc(surveyPlanPoint.seq));
  return { ...toPlanDto(row as PlanRow), points };
}

export async function planNameTaken(
  db: DB,
  { orgId, fieldId, name }: { orgId: string; fieldId: string; name: string },
): Promise<boolean> {
  const [row] = await db
    .select({ id: surveyPlan.id })
    .from(surveyPlan)
    .where(and(eq(surveyPlan.orgId, orgId), eq(surveyPlan.fieldId, fieldId), eq(surveyPlan.name, name)));
  return !!row;
}

// ---------------------------------------------------------------------------------------------------------------
// Control marks
// ---------------------------------------------------------------------------------------------------------------

const markCols = {
  id: controlMark.id,
  fieldId: controlMark.fieldId,
  name: controlMark.name,
  e: controlMark.e,
  n: controlMark.n,
  h: controlMark.h,
  description: controlMark.description,
  source: controlMark.source,
  updatedAt: controlMark.updatedAt,
};

const toMarkDto = (r: Omit<ControlMarkDto, "updatedAt"> & { updatedAt: Date }): ControlMarkDto => ({
  ...r,
  updatedAt: r.updatedAt.toISOString(),
});

export interface ControlMarkInput {
  name: string;
  e: number;
  n: number;
  h: number | null;
  description: string | null;
  source: string | null;
}

export async function listControlMarks(
  db: DB,
  { orgId, fieldId }: { orgId: string; fieldId: string },
): Promise<ControlMarkDto[]> {
  const rows = await db
    .select(markCols)
    .from(controlMark)
    .where(and(eq(controlMark.orgId, orgId), eq(controlMark.fieldId, fieldId)))
    .orderBy(asc(controlMark.name));
  return rows.map(toMarkDto);
}

export async function getControlMark(
  db: DB,
  { id, orgId }: { id: string; orgId: string },
): Promise<ControlMarkDto | null> {
  const [row] = await db
    .select(markCols)
    .from(controlMark)
    .where(and(eq(controlMark.id, id), eq(controlMark.orgId, orgId)));
  return row ? toMarkDto(row) : null;
}

export async function controlMarkNameTaken(
  db: DB,
  { orgId, fieldId, name, exceptId }: { orgId: string; fieldId: string; name: string; exceptId?: string },
): Promise<boolean> {
  const rows = await db
    .select({ id: controlMark.id })
    .from(controlMark)
    .where(and(eq(controlMark.orgId, orgId), eq(controlMark.fieldId, fieldId), eq(controlMark.name, name)));
  return rows.some((r) => r.id !== exceptId);
}

export async function createControlMark(
  db: DB,
  { orgId, fieldId, userId, input }: { orgId: string; fieldId: string; userId: string; input: ControlMarkInput },
): Promise<ControlMarkDto> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .insert(controlMark)
      .values({ orgId, fieldId, createdBy: userId, ...input })
      .returning(markCols);
    await logActivity(tx, {
      orgId,
      actorId: userId,
      action: "control_mark.created",
      subjectType: "control_mark",
      subjectId: row.id,
      detail: { name: input.name, fieldId },
    });
    return toMarkDto(row);
  });
}

/** Change a mark. Surveys that used it keep their own copy of it, so a change never alters their check. */
export async function updateControlMark(
  db: DB,
  { id, orgId, userId, input }: { id: string; orgId: string; userId: string; input: ControlMarkInput },
): Promise<ControlMarkDto | null> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .update(controlMark)
      .set({ ...input, updatedAt: new Date() })
      .where(and(eq(controlMark.id, id), eq(controlMark.orgId, orgId)))
      .returning(markCols);
    if (!row) return null;
    await logActivity(tx, {
      orgId,
      actorId: userId,
      action: "control_mark.updated",
      subjectType: "control_mark",
      subjectId: id,
      detail: { ...input },
    });
    return toMarkDto(row);
  });
}

/** Delete a mark no survey has used: "deleted", "missing", or how many surveys used it. */
export async function deleteControlMark(
  db: DB,
  { id, orgId, userId }: { id: string; orgId: string; userId: string },
): Promise<"deleted" | "missing" | { usedBy: number }> {
  return db.transaction(async (tx) => {
    const [row] = await tx
      .select({ id: controlMark.id, name: controlMark.name })
      .from(controlMark)
      .where(and(eq(controlMark.id, id), eq(controlMark.orgId, orgId)));
    if (!row) return "missing" as const;
    const [{ used }] = await tx.select({ used: count() }).from(surveyRecord).where(eq(surveyRecord.controlMarkId, id));
    if (used > 0) return { usedBy: used };
    await tx.delete(controlMark).where(eq(controlMark.id, id));
    await logActivity(tx, {
      orgId,
      actorId: userId,
      action: "control_mark.deleted",
      subjectType: "control_mark",
      subjectId: id,
      detail: { name: row.name },
    });
    return "deleted" as const;
  });
}

// ---------------------------------------------------------------------------------------------------------------
// Survey records
// ---------------------------------------------------------------------------------------------------------------

export type NewSurveyRecord = Omit<SurveyRecordDto, "planName" | "createdAt"> & {
  orgId: string;
  userId: string;
  controlMarkId: string | null;
};

export async function createSurveyRecord(db: Pick<DB, "insert">, r: NewSurveyRecord): Promise<void> {
  await db.insert(surveyRecord).values({
    datasetId: r.datasetId,
    orgId: r.orgId,
    planId: r.planId,
    controlMarkId: r.controlMarkId,
    markCheck: r.markCheck,
    instrumentCheck: r.instrumentCheck,
    instrument: r.instrument,
    serial: r.serial,
    calibrationDate: r.calibrationDate,
    precisionMm: r.precisionMm,
    surveyor: r.surveyor,
    method: r.method,
    missingReported: r.missingReported,
    coverage: r.coverage,
    createdBy: r.userId,
  });
}

export async function getSurveyRecord(
  db: DB,
  { datasetId, orgId }: { datasetId: string; orgId: string },
): Promise<SurveyRecordDto | null> {
  const [row] = await db
    .select({
      datasetId: surveyRecord.datasetId,
      planId: surveyRecord.planId,
      planName: surveyPlan.name,
      markCheck: surveyRecord.markCheck,
      instrumentCheck: surveyRecord.instrumentCheck,
      instrument: surveyRecord.instrument,
      serial: surveyRecord.serial,
      calibrationDate: surveyRecord.calibrationDate,
      precisionMm: surveyRecord.precisionMm,
      surveyor: surveyRecord.surveyor,
      method: surveyRecord.method,
      missingReported: surveyRecord.missingReported,
      coverage: surveyRecord.coverage,
      createdAt: surveyRecord.createdAt,
    })
    .from(surveyRecord)
    .leftJoin(surveyPlan, eq(surveyPlan.id, surveyRecord.planId))
    .where(and(eq(surveyRecord.datasetId, datasetId), eq(surveyRecord.orgId, orgId)));
  if (!row) return null;
  return {
    ...row,
    markCheck: row.markCheck as SurveyRecordDto["markCheck"],
    instrumentCheck: row.instrumentCheck as SurveyRecordDto["instrumentCheck"],
    missingReported: (row.missingReported as SurveyRecordDto["missingReported"]) ?? [],
    coverage: row.coverage as SurveyRecordDto["coverage"],
    createdAt: row.createdAt.toISOString(),
  };
}

// ---------------------------------------------------------------------------------------------------------------
// Unpaired points split by the survey's plan
// ---------------------------------------------------------------------------------------------------------------

/** The plan of a survey dataset, if it was uploaded against one. */
export async function planOfSurvey(
  db: DB,
  { surveyDatasetId, orgId }: { surveyDatasetId: string; orgId: string },
): Promise<{ id: string; name: string } | null> {
  const [row] = await db
    .select({ id: surveyPlan.id, name: surveyPlan.name })
    .from(surveyRecord)
    .innerJoin(surveyPlan, eq(surveyPlan.id, surveyRecord.planId))
    .where(and(eq(surveyRecord.datasetId, surveyDatasetId), eq(surveyRecord.orgId, orgId)));
  return row ?? null;
}

const inPlan = (planId: string) =>
  sql<boolean>`exists (select 1 from ${surveyPlanPoint} where ${surveyPlanPoint.planId} = ${planId} and not ${surveyPlanPoint.spare} and ${surveyPlanPoint.plantId} = ${auditUnpaired.pointId})`;

/** Unpaired counts of an audit, with the planted ones split into "not sampled" and "sampled but not found". */
export async function unpairedSplitCounts(
  db: DB,
  { auditId, plan }: { auditId: string; plan: { id: string; name: string } | null },
): Promise<UnpairedSplitDto> {
  const rows = await db
    .select({ kind: auditUnpaired.kind, n: count() })
    .from(auditUnpaired)
    .where(eq(auditUnpaired.auditId, auditId))
    .groupBy(auditUnpaired.kind);
  let sampled = 0;
  // Planted records nobody surveyed stored compactly (db/queries/unpaired.ts): counted here, not among the rows.
  const compact = await loadPlantedNotFound(db, { auditId });
  if (compact) {
    rows.push({ kind: "planted-not-found", n: compact.count });
    if (plan && compact.count > 0) {
      const planned = await plannedPlantIds(db, { planId: plan.id });
      const ids = compact.planted.id;
      for (const i of compact.part.indices) {
        const id = ids?.get(i) || null;
        if (id !== null && planned.has(id)) sampled++;
      }
    }
  } else if (plan) {
    const [row] = await db
      .select({ n: count() })
      .from(auditUnpaired)
      .where(and(eq(auditUnpaired.auditId, auditId), eq(auditUnpaired.kind, "planted-not-found"), inPlan(plan.id)));
    sampled = row.n;
  }
  const out: UnpairedSplitDto = {
    planId: plan?.id ?? null,
    planName: plan?.name ?? null,
    notSampled: 0,
    sampledNotFound: sampled,
    surveyedNoRecord: 0,
    ambiguous: 0,
  };
  for (const r of rows) {
    if (r.kind === "planted-not-found") out.notSampled += r.n - sampled;
    else if (r.kind === "surveyed-not-planted") out.surveyedNoRecord += r.n;
    else out.ambiguous += r.n;
  }
  return out;
}

/**
 * Plant ids of the plan's checkpoints, for filtering the unpaired CSV. Spares are left out: an unused spare was never
 * asked for, and a used one is paired.
 */
export async function plannedPlantIds(db: DB, { planId }: { planId: string }): Promise<Set<string>> {
  const rows = await db
    .select({ plantId: surveyPlanPoint.plantId })
    .from(surveyPlanPoint)
    .where(and(eq(surveyPlanPoint.planId, planId), eq(surveyPlanPoint.spare, false)));
  return new Set(rows.map((r) => r.plantId));
}

/** How many plans were made from these as-planted datasets (a dataset a plan uses is kept). */
export async function countPlansUsingDataset(db: DB, { datasetIds }: { datasetIds: string[] }): Promise<number> {
  if (datasetIds.length === 0) return 0;
  const [{ n }] = await db
    .select({ n: count() })
    .from(surveyPlan)
    .where(inArray(surveyPlan.plantedDatasetId, datasetIds));
  return n;
}

/** Surveys uploaded against a plan, newest first, with what their uploads recorded. */
export async function listPlanSurveys(
  db: DB,
  { planId, orgId }: { planId: string; orgId: string },
): Promise<(SurveyRecordDto & { fileName: string })[]> {
  const rows = await db
    .select({ datasetId: surveyRecord.datasetId, fileName: dataset.fileName })
    .from(surveyRecord)
    .innerJoin(dataset, eq(dataset.id, surveyRecord.datasetId))
    .where(and(eq(surveyRecord.planId, planId), eq(surveyRecord.orgId, orgId)))
    .orderBy(desc(surveyRecord.createdAt));
  const out: (SurveyRecordDto & { fileName: string })[] = [];
  for (const r of rows) {
    const rec = await getSurveyRecord(db, { datasetId: r.datasetId, orgId });
    if (rec) out.push({ ...rec, fileName: r.fileName });
  }
  return out;
}
