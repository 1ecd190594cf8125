import "server-only";
import { projectTable, resolveCrs, toLonLat } from "@/geo";
import { getDb } from "@/db/client";
import { getDatasetById, loadDatasetPoints } from "@/db/queries/datasets";
import { getFieldById } from "@/db/queries/fields";
import { getProfileById } from "@/db/queries/profiles";
import { createSurveyPlan, getSurveyPlan, planNameTaken } from "@/db/queries/survey-plans";
import { localDay } from "@/lib/audit/local-day";
import { AppError, notFound } from "@/lib/errors";
import { contentDisposition, fileSlug } from "@/lib/http";
import type { PlanParameters, SurveyPlanWithPoints } from "@/lib/plan/dto";
import { type PlanRecordsPayload, planRecordsPayload } from "@/lib/plan/plan-map";
import { planSampleSize } from "@/lib/plan/sample-size";
import { type PlanPlant, selectCheckpoints } from "@/lib/plan/select";
import { stakeoutCsv, stakeoutGeoJson } from "@/lib/plan/stakeout";
import type { Viewer } from "@/lib/server/access";
import type { PlanInput } from "@/lib/validation/plan";

/** A plan of the viewer's organisation, or 404. */
export async function planForViewer(viewer: Viewer, id: string): Promise<SurveyPlanWithPoints> {
  const plan = await getSurveyPlan(await getDb(), { id, orgId: viewer.orgId });
  if (!plan) throw notFound("Survey plan");
  return plan;
}

/** The plants of an as-planted dataset in the field's CRS, with the attributes a plan can stratify by. */
async function plantsOf(viewer: Viewer, datasetId: string, field: { crs: string; timeZone: string }) {
  const db = await getDb();
  const loaded = await loadDatasetPoints(db, { id: datasetId, orgId: viewer.orgId });
  if (!loaded) throw notFound("As-planted dataset");
  const table = projectTable(loaded.table, resolveCrs(loaded.dto.crs), resolveCrs(field.crs));
  const attr = (name: "bed" | "row" | "arm" | "crop" | "fix", i: number): string | null => {
    const col = table.attrs[name];
    if (!col) return null;
    const c = col.codes[i];
    return c >= 0 ? (col.values[c] ?? null) : null;
  };
  const plants: PlanPlant[] = [];
  let unnamed = 0;
  for (let i = 0; i < table.length; i++) {
    const id = table.id?.get(i) ?? "";
    if (!id || !Number.isFinite(table.x[i]) || !Number.isFinite(table.y[i])) {
      unnamed++;
      continue;
    }
    const t = table.time?.[i];
    plants.push({
      id,
      e: table.x[i],
      n: table.y[i],
      bed: attr("bed", i),
      row: attr("row", i),
      arm: attr("arm", i),
      crop: attr("crop", i),
      fix: attr("fix", i),
      day: t !== undefined && Number.isFinite(t) ? localDay(t, field.timeZone) : null,
    });
  }
  return { plants, dataset: loaded.dto, unnamed };
}

/**
 * Make and save a plan: the sample size from the profile, then the seeded selection. Throws 422 with the numbers
 * when the dataset is too small or a stratum cannot hold its minimum; nothing is saved then.
 */
export async function createPlan(viewer: Viewer, fieldId: string, input: PlanInput, drawSeed: () => number) {
  const db = await getDb();
  const field = await getFieldById(db, { id: fieldId, orgId: viewer.orgId });
  if (!field) throw notFound("Field");
  const ds = await getDatasetById(db, { id: input.plantedDatasetId, orgId: viewer.orgId });
  if (!ds || ds.fieldId !== fieldId)
    throw new AppError("invalid_input", "Choose an as-planted dataset of this field.", [
      { path: ["plantedDatasetId"], message: "not an as-planted dataset of this field" },
    ]);
  if (ds.kind !== "planted")
    throw new AppError(
      "invalid_input",
      `"${ds.fileName}" is a survey; a plan chooses plants from as-planted records.`,
      [{ path: ["plantedDatasetId"], message: "choose an as-planted dataset" }],
    );
  const profile = await getProfileById(db, { id: input.profileId, orgId: viewer.orgId });
  if (!profile)
    throw new AppError("invalid_input", "Choose a tolerance profile of your organisation.", [
      { path: ["profileId"], message: "unknown profile" },
    ]);
  if (await planNameTaken(db, { orgId: viewer.orgId, fieldId, name: input.name }))
    throw new AppError("invalid_input", `This field already has a plan called "${input.name}".`, [
      { path: ["name"], message: "name taken" },
    ]);
  const { plants, unnamed } = await plantsOf(viewer, ds.id, field);
  if (plants.length === 0)
    throw new AppError(
      "invalid_input",
      `"${ds.fileName}" has no plant with an id and a position${unnamed ? ` (${unnamed} rows without an id)` : ""}; a plan names the plants to survey by their id.`,
    );
  const seed = input.seed ?? drawSeed();
  const parameters: PlanParameters = {
    allowedFailures: input.allowedFailures,
    standards: input.standards,
    strataBy: input.strataBy,
    minPerStratum: input.minPerStratum,
    sparesPerStratum: input.sparesPerStratum,
    minSpacingM: input.minSpacingM,
    bedEndM: input.bedEndM,
    rowBearingDeg: input.rowBearingDeg,
  };
  let sampleSize: ReturnType<typeof planSampleSize>;
  let selection: ReturnType<typeof selectCheckpoints>;
  try {
    sampleSize = planSampleSize({
      requiredShare: profile.requiredShare,
      confidence: profile.confidence,
      allowedFailures: input.allowedFailures,
      profileMinimum: profile.minCheckpoints,
      standards: input.standards,
    });
    selection = selectCheckpoints(plants, {
      required: sampleSize.required,
      strataBy: input.strataBy,
      minPerStratum: input.minPerStratum,
      sparesPerStratum: input.sparesPerStratum,
      minSpacingM: input.minSpacingM,
      bedEndM: input.bedEndM,
      rowBearingDeg: input.rowBearingDeg ?? field.rowBearingDeg,
      seed,
    });
  } catch (e) {
    const message = (e as Error).message.replace(/^plan: /, "");
    throw new AppError("invalid_input", `${message[0].toUpperCase()}${message.slice(1)}.`, [{ path: [], message }]);
  }
  const id = await createSurveyPlan(db, {
    orgId: viewer.orgId,
    fieldId,
    plantedDatasetId: ds.id,
    userId: viewer.userId,
    userName: viewer.name,
    name: input.name,
    profileId: profile.id,
    profile: {
      id: profile.id,
      name: profile.name,
      operation: profile.operation,
      radialM: profile.radialM,
      crossM: profile.crossM,
      alongM: profile.alongM,
      requiredShare: profile.requiredShare,
      confidence: profile.confidence,
      minCheckpoints: profile.minCheckpoints,
    },
    parameters,
    seed,
    sampleSize,
    strata: selection.strata,
    selectionNotes: {
      excludedAtBedEnds: selection.excludedAtBedEnds,
      eligible: selection.eligible,
      bearingDeg: selection.bearingDeg,
      sparesShort: selection.sparesShort,
      plants: plants.length,
    },
    points: selection.points.map((p) => ({
      name: p.name,
      plantId: p.plantId,
      stratum: p.stratum,
      spare: p.spare,
      e: p.e,
      n: p.n,
      crop: p.crop,
      bed: p.bed,
      row: p.row,
      arm: p.arm,
    })),
  });
  return planForViewer(viewer, id);
}

function stakeoutName(plan: SurveyPlanWithPoints, ext: string): string {
  return `plotproof_${fileSlug(plan.fieldName)}_${fileSlug(plan.name)}_stakeout.${ext}`;
}

export function stakeoutCsvResponse(plan: SurveyPlanWithPoints): Response {
  return new Response(stakeoutCsv(plan.points), {
    headers: {
      "content-type": "text/csv; charset=utf-8",
      "content-disposition": contentDisposition(stakeoutName(plan, "csv")),
      "cache-control": "no-store",
    },
  });
}

export function stakeoutGeoJsonResponse(plan: SurveyPlanWithPoints): Response {
  const crs = resolveCrs(plan.fieldCrs);
  const lonLat = plan.points.map((p) => toLonLat(p.e, p.n, crs));
  const body = stakeoutGeoJson(plan.points, lonLat, { plan: plan.name, crs: plan.fieldCrs });
  return new Response(JSON.stringify(body), {
    headers: {
      "content-type": "application/geo+json; charset=utf-8",
      "content-disposition": contentDisposition(stakeoutName(plan, "geojson")),
      "cache-control": "no-store",
    },
  });
}

/** Every as-planted record of the plan's dataset in the field's CRS, for the plan's map (drawn faint). */
export async function planRecords(plan: SurveyPlanWithPoints, orgId: string): Promise<PlanRecordsPayload> {
  const loaded = await loadDatasetPoints(await getDb(), { id: plan.plantedDatasetId, orgId });
  if (!loaded) throw notFound("As-planted dataset");
  const table = projectTable(loaded.table, resolveCrs(loaded.dto.crs), resolveCrs(plan.fieldCrs));
  return planRecordsPayload(plan.fieldCrs, table.x, table.y, plan.points);
}
