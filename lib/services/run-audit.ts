import "server-only";
import { prepareAudit, resolveCrs, type PointTable } from "@/geo";
import { residualRecordRows, unpairedRecordRows } from "@/lib/review/result-rows";
import { computeAudit, residualsCsv, summaryCsv, unpairedCsv } from "@/lib/audit";
import { evaluateVerdict } from "@/lib/audit/verdict";
import { getDb, type DB } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { getDatasetById, loadDatasetPoints } from "@/db/queries/datasets";
import { getProfileById } from "@/db/queries/profiles";
import {
  createAudit, failAudit, getAuditById, setAuditProgress, storeAuditResult, type ProfileSnapshot,
} from "@/db/queries/audits";
import { AppError, notFound } from "@/lib/errors";
import type { AuditDto, AuditSettingsDto } from "@/lib/api-types";
import type { AuditCreateInput } from "@/lib/validation/audit";
import type { Viewer } from "@/lib/access";

/** Breakdowns every audit computes. */
const GROUP_BY = ["arm", "crop", "bed", "fix", "day"] as const;

/**
 * Check the request, create the audit ("computing") and start the computation in the background.
 * Returns the new audit; `wait` resolves only when the computation has finished (for scripts and tests).
 */
export async function startAudit(viewer: Viewer, input: AuditCreateInput, opts: { wait?: boolean } = {}): Promise<AuditDto> {
  const db = await getDb();
  const orgId = viewer.orgId;
  const field = await getFieldById(db, { id: input.fieldId, orgId });
  if (!field) throw notFound("Field");
  const [planted, survey] = await Promise.all([
    getDatasetById(db, { id: input.plantedDatasetId, orgId }),
    getDatasetById(db, { id: input.surveyDatasetId, orgId }),
  ]);
  const issues: { path: string[]; message: string }[] = [];
  if (!planted || planted.fieldId !== field.id) issues.push({ path: ["plantedDatasetId"], message: "No such as-planted dataset in this field." });
  else if (planted.kind !== "planted") issues.push({ path: ["plantedDatasetId"], message: `${planted.fileName} is a survey file, not as-planted records.` });
  if (!survey || survey.fieldId !== field.id) issues.push({ path: ["surveyDatasetId"], message: "No such survey dataset in this field." });
  else if (survey.kind !== "survey") issues.push({ path: ["surveyDatasetId"], message: `${survey.fileName} is as-planted records, not a survey file.` });
  const profile = await getProfileById(db, { id: input.profileId, orgId });
  if (!profile) issues.push({ path: ["profileId"], message: "No such tolerance profile." });
  if (issues.length) throw new AppError("invalid_input", issues.map((i) => i.message).join(" "), issues);

  let workCrs = field.crs;
  try {
    if (resolveCrs(field.crs).kind !== "projected") workCrs = "auto";
  } catch {
    workCrs = "auto";
  }
  const settings: AuditSettingsDto = {
    match: input.match, maxDistanceM: input.maxDistanceM,
    rowBearingDeg: input.rowBearingDeg ?? field.rowBearingDeg ?? null, timeZone: field.timeZone, workCrs,
  };
  const { builtIn: _b, note: _n, updatedAt: _u, ...snapshot } = profile!;
  const id = await createAudit(db, {
    orgId, userId: viewer.userId, fieldId: field.id, plantedDatasetId: planted!.id, surveyDatasetId: survey!.id,
    profileId: profile!.id, profileSnapshot: snapshot, settings,
    title: input.title ?? `${field.name} — ${profile!.name}`,
  });
  const run = computeStoredAudit(db, { id, orgId });
  if (opts.wait) await run;
  else void run;
  return (await getAuditById(db, { id, orgId }))!;
}

/** Compute an audit that exists in the database; failures are stored on the audit, never thrown. */
export async function computeStoredAudit(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<void> {
  try {
    const auditRow = await getAuditById(db, { id, orgId });
    if (!auditRow || !auditRow.planted || !auditRow.survey || !auditRow.settings || !auditRow.profile) throw new Error("audit inputs are missing");
    await setAuditProgress(db, { id, progress: 0.05, stage: "loading" });
    const [planted, survey] = await Promise.all([
      loadDatasetPoints(db, { id: auditRow.planted.id, orgId }),
      loadDatasetPoints(db, { id: auditRow.survey.id, orgId }),
    ]);
    if (!planted || !survey) throw new Error("a dataset of this audit has no stored points");
    await setAuditProgress(db, { id, progress: 0.15, stage: "pairing" });
    await yieldToOthers();
    const outcome = computeFromTables(planted.table, planted.dto.crs, survey.table, survey.dto.crs, auditRow.settings, auditRow.profile);
    if (!outcome.ok) {
      const errors = outcome.issues.filter((i) => i.severity === "error");
      await failAudit(db, { id, orgId, error: errors.map((i) => `${i.file}${i.line ? ` line ${i.line}` : ""}: ${i.message}`).slice(0, 5).join("; ") });
      return;
    }
    await setAuditProgress(db, { id, progress: 0.5, stage: "saving" });
    await yieldToOthers();
    const { result, plantedP, surveyP, verdict, settings } = outcome;
    await storeAuditResult(db, {
      id, orgId, summary: result.summary, verdict, settings,
      // The same row builders verification uses, so stored and re-computed rows cannot drift apart.
      residuals: residualRecordRows(result, plantedP, surveyP, settings.timeZone).map((row) => ({ auditId: id, ...row })),
      unpaired: unpairedRecordRows(outcome.pairing, plantedP, surveyP).map((row) => ({ auditId: id, ...row })),
      reports: [
        { kind: "residuals", bytes: joinChunks(residualsCsv({ planted: plantedP, survey: surveyP, residuals: result.residuals })) },
        { kind: "unpaired", bytes: joinChunks(unpairedCsv({ planted: plantedP, survey: surveyP, pairing: outcome.pairing })) },
        { kind: "summary", bytes: joinChunks(summaryCsv(result.summary)) },
      ],
      onBatch: (f) => setAuditProgress(db, { id, progress: 0.5 + 0.45 * f, stage: "saving" }),
    });
  } catch (err) {
    console.error("[plotproof] audit computation failed", err);
    await failAudit(db, { id, orgId, error: `The computation failed: ${(err as Error).message}` }).catch(() => {});
  }
}

/** The engine run shared with the command line: prepare (project, check, pair), statistics, verdict. */
export function computeFromTables(
  planted: PointTable, plantedCrs: string, survey: PointTable, surveyCrs: string,
  settings: AuditSettingsDto, profile: ProfileSnapshot,
) {
  const prepared = prepareAudit({ table: planted, crs: plantedCrs }, { table: survey, crs: surveyCrs }, {
    workCrs: settings.workCrs, match: settings.match, maxDistance: settings.maxDistanceM, rowBearingDeg: settings.rowBearingDeg ?? undefined,
  });
  if (!prepared.ok) return { ok: false as const, issues: prepared.issues };
  const bearing = Number.isFinite(prepared.rowBearing.bearingDeg) ? prepared.rowBearing.bearingDeg : undefined;
  const hasBearing = bearing !== undefined;
  const result = computeAudit({
    planted: prepared.planted, survey: prepared.survey, pairing: prepared.pairing,
    options: {
      toleranceRadial: profile.radialM ?? undefined,
      toleranceCross: hasBearing ? profile.crossM ?? undefined : undefined,
      toleranceAlong: hasBearing ? profile.alongM ?? undefined : undefined,
      confidence: profile.confidence,
      rowBearingDeg: bearing,
      rowBearingSource: hasBearing ? (prepared.rowBearing.given ? "given" : "derived") : "none",
      groupBy: [...GROUP_BY],
      timeZone: settings.timeZone,
    },
  });
  const r = result.residuals;
  const wt = result.summary.withinTolerance;
  const verdict = evaluateVerdict(profile, {
    pairs: result.summary.pairs, radial: r.radial, cross: r.cross, along: r.along,
    within: wt && wt.share !== null && wt.lower95 !== null ? { share: wt.share, lower95: wt.lower95 } : null,
  });
  return {
    ok: true as const, result, verdict, pairing: prepared.pairing, plantedP: prepared.planted, surveyP: prepared.survey,
    issues: prepared.issues, settings: { ...settings, workCrs: prepared.workCrs.code, rowBearingDeg: bearing ?? null },
  };
}

function joinChunks(chunks: Iterable<string>): Uint8Array {
  return new TextEncoder().encode([...chunks].join(""));
}

const yieldToOthers = () => new Promise((r) => setImmediate(r));
