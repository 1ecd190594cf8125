import "server-only";
import type { AuditStage } from "@/lib/audit/run";
import type { AuditJobMessage } from "@/lib/audit-job/messages";
import { startAuditWorker, type AuditWorkerJob } from "@/lib/server/audits/run-in-worker";
import { getDb, type DB } from "@/db/client";
import { getFieldById } from "@/db/queries/fields";
import { getDatasetById, loadDatasetPoints } from "@/db/queries/datasets";
import { getProfileById } from "@/db/queries/profiles";
import {
  createAudit,
  failAudit,
  getAuditById,
  restartFailedAudit,
  setAuditProgress,
  storeAuditResult,
  type RowBatch,
} from "@/db/queries/audits";
import { AppError, notFound } from "@/lib/errors";
import type { AuditDto } from "@/lib/api-types";
import { buildAuditSettings } from "@/lib/audit/settings";
import type { AuditCreateInput } from "@/lib/validation/audit";
import type { Viewer } from "@/lib/server/access";
import { dispatchComputation } from "@/lib/server/jobs/queue";
import { scheduleAlertCheck } from "@/lib/server/alerts/check";
import { keepReportsThenStore } from "@/lib/server/audits/report-files";

/**
 * Check the request, create the audit ("computing") and start the computation in the background.
 * Returns the new audit; `wait` resolves only when the computation has finished (for scripts and tests).
 */
export async function startAudit(
  viewer: Viewer,
  input: AuditCreateInput,
  opts: { wait?: boolean } = {},
): Promise<AuditDto> {
  const db = await getDb();
  const orgId = viewer.orgId;
  const field = await getFieldById(db, { id: input.fieldId, orgId });
  if (!field) throw notFound("Field");
  const [planted, survey] = await Promise.all([
    getDatasetById(db, { id: input.plantedDatasetId, orgId }),
    getDatasetById(db, { id: input.surveyDatasetId, orgId }),
  ]);
  const issues: { path: string[]; message: string }[] = [];
  if (!planted || planted.fieldId !== field.id)
    issues.push({ path: ["plantedDatasetId"], message: "No such as-planted dataset in this field." });
  else if (planted.kind !== "planted")
    issues.push({
      path: ["plantedDatasetId"],
      message: `${planted.fileName} is a survey file, not as-planted records.`,
    });
  if (!survey || survey.fieldId !== field.id)
    issues.push({ path: ["surveyDatasetId"], message: "No such survey dataset in this field." });
  else if (survey.kind !== "survey")
    issues.push({ path: ["surveyDatasetId"], message: `${survey.fileName} is as-planted records, not a survey file.` });
  const profile = await getProfileById(db, { id: input.profileId, orgId });
  if (!profile) issues.push({ path: ["profileId"], message: "No such tolerance profile." });
  if (issues.length) throw new AppError("invalid_input", issues.map((i) => i.message).join(" "), issues);

  const settings = buildAuditSettings({
    field,
    // A new audit reads a null bearing as "not given": the field's bearing, else derived from the records.
    chosen: { match: input.match, maxDistanceM: input.maxDistanceM, rowBearingDeg: input.rowBearingDeg ?? undefined },
  });
  const { builtIn: _b, note: _n, updatedAt: _u, ...snapshot } = profile!;
  const id = await createAudit(db, {
    orgId,
    userId: viewer.userId,
    fieldId: field.id,
    plantedDatasetId: planted!.id,
    surveyDatasetId: survey!.id,
    profileId: profile!.id,
    profileSnapshot: snapshot,
    settings,
    title: input.title ?? `${field.name} — ${profile!.name}`,
  });
  await dispatchComputation(db, { auditId: id, orgId, plants: planted!.rowCount }, computeStoredAudit, opts);
  return (await getAuditById(db, { id, orgId }))!;
}

/**
 * Compute a failed audit again, as the same audit: its stored files, profile copy and settings. The caller has
 * checked role and state (lib/review/lifecycle.ts, "recompute"); a second click that lost the race gets 409.
 */
export async function recomputeAudit(
  viewer: Viewer,
  db: DB,
  auditId: string,
  opts: { wait?: boolean } = {},
): Promise<AuditDto> {
  const orgId = viewer.orgId;
  const restarted = await restartFailedAudit(db, { id: auditId, orgId, actorId: viewer.userId });
  if (!restarted) throw new AppError("conflict", "This audit is no longer failed: someone started it again first.");
  const before = await getAuditById(db, { id: auditId, orgId });
  const plants = before?.planted?.rowCount ?? 0;
  await dispatchComputation(db, { auditId, orgId, plants }, computeStoredAudit, opts);
  const audit = await getAuditById(db, { id: auditId, orgId });
  if (!audit) throw notFound("Audit");
  return audit;
}

/** Progress shown while each stage runs (saving then moves from 0.5 to 0.95 with the rows stored). */
const STAGE_PROGRESS: Record<AuditStage, number> = {
  validate: 0.15,
  project: 0.2,
  "check-files": 0.25,
  pair: 0.3,
  "row-bearing": 0.4,
  statistics: 0.42,
};

/**
 * Compute an audit that exists in the database; failures are stored on the audit, never thrown.
 * The engine runs on a worker thread (lib/audit-job); this thread only loads the points, records
 * progress and stores the rows as they arrive.
 */
export async function computeStoredAudit(db: DB, { id, orgId }: { id: string; orgId: string }): Promise<void> {
  let job: AuditWorkerJob | null = null;
  try {
    const auditRow = await getAuditById(db, { id, orgId });
    if (!auditRow?.planted || !auditRow.survey || !auditRow.settings || !auditRow.profile)
      throw new Error("audit inputs are missing");
    await setAuditProgress(db, { id, progress: 0.05, stage: "loading" });
    const [planted, survey] = await Promise.all([
      loadDatasetPoints(db, { id: auditRow.planted.id, orgId }),
      loadDatasetPoints(db, { id: auditRow.survey.id, orgId }),
    ]);
    if (!planted || !survey) throw new Error("a dataset of this audit has no stored points");
    await setAuditProgress(db, { id, progress: 0.1, stage: "computing" });
    const worker = await startAuditWorker({
      planted: planted.table,
      plantedCrs: planted.dto.crs,
      survey: survey.table,
      surveyCrs: survey.dto.crs,
      settings: auditRow.settings,
      profile: auditRow.profile,
    });
    job = worker;
    const messages = worker.messages;
    const next = async (): Promise<AuditJobMessage> => {
      const r = await messages.next();
      if (r.done) throw new Error("the audit worker stopped before it finished");
      if (r.value.type === "error") throw new Error(r.value.message);
      return r.value;
    };

    let m = await next();
    while (m.type === "stage") {
      await setAuditProgress(db, {
        id,
        progress: STAGE_PROGRESS[m.stage],
        stage: m.stage === "statistics" ? "statistics" : "pairing",
      });
      m = await next();
    }
    if (m.type === "refused") {
      await failAudit(db, {
        id,
        orgId,
        error: m.errors
          .map((e) => `${e.file}${e.line ? ` line ${e.line}` : ""}: ${e.message}`)
          .slice(0, 5)
          .join("; "),
      });
      return;
    }
    if (m.type !== "computed") throw new Error(`the audit worker sent "${m.type}" before its result`);
    const computed = m;
    await setAuditProgress(db, { id, progress: 0.5, stage: "saving" });
    async function* rows(): AsyncGenerator<RowBatch> {
      for (;;) {
        worker.more();
        const b = await next();
        if (b.type === "done") return;
        if (b.type === "residuals") yield { kind: "residual", rows: b.rows.map((row) => ({ auditId: id, ...row })) };
        else if (b.type === "unpaired")
          yield { kind: "unpaired", rows: b.rows.map((row) => ({ auditId: id, ...row })) };
        else throw new Error(`the audit worker sent "${b.type}" among the rows`);
      }
    }
    // Server mode with an object store: the report files go there first (and are removed again if storing fails).
    await keepReportsThenStore({ orgId, auditId: id }, computed.reports, (reports) =>
      storeAuditResult(db, {
        id,
        orgId,
        summary: computed.summary,
        verdict: computed.verdict,
        settings: computed.settings,
        // Rows come from the same builders verification uses, so stored and re-computed rows cannot drift apart.
        rows: rows(),
        total: computed.residualCount + computed.unpairedCount,
        reports,
        plantedNotFound: computed.plantedNotFound,
        onBatch: (f) => setAuditProgress(db, { id, progress: 0.5 + 0.45 * f, stage: "saving" }),
      }),
    );
    // Alerts (issue 13): checked in the background once the results are stored; a failure there is logged only.
    scheduleAlertCheck(db, { id, orgId });
  } catch (err) {
    console.error("[plotproof] audit computation failed", err);
    await failAudit(db, { id, orgId, error: `The computation failed: ${(err as Error).message}` }).catch(() => {});
  } finally {
    await job?.stop();
  }
}
