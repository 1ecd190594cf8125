import "server-only";
import { getDb } from "@/db/client";
import { getAuditById, removeAuditRows } from "@/db/queries/audits";
import { logActivity } from "@/db/queries/activity";
import { computeStoredAudit } from "@/lib/server/audits/run-audit";
import type { Viewer } from "@/lib/server/access";
import { reviewAuditFor } from "@/lib/server/review/review-service";
import { requireResults } from "@/lib/server/review/record-sources";
import { verifyAudit } from "@/lib/server/review/verify";
import { discardObjects } from "@/lib/server/storage";
import { type ComputeJob, getQueue, QUEUES } from "./queue";

/** Data of a verification job: who asked (the viewer, as checked by the route) and which audit. */
export interface VerifyJob {
  viewer: Viewer;
  auditId: string;
}

/** The verification itself, for the route (embedded) and the worker (server) alike. */
export async function verifyForViewer({ viewer, auditId }: VerifyJob) {
  const { db, audit } = await reviewAuditFor(viewer, { id: auditId });
  requireResults(audit);
  return verifyAudit(viewer, db, audit);
}

/**
 * One computation job on a worker. A retried job (its first worker died or the job expired) starts from a clean
 * slate: the partial rows of the earlier attempt go first. An audit no longer "computing" was finished meanwhile.
 */
export async function runComputeJob(job: ComputeJob, attempt: number): Promise<void> {
  const db = await getDb();
  const audit = await getAuditById(db, { id: job.auditId, orgId: job.orgId });
  if (!audit || audit.state !== "computing") return;
  if (attempt > 0) {
    await discardObjects(await removeAuditRows(db, { id: job.auditId }));
    await logActivity(db, {
      orgId: job.orgId,
      actorId: null,
      action: "audit.resumed",
      subjectType: "audit",
      subjectId: job.auditId,
      detail: { reason: "worker stopped or timed out", attempt: String(attempt + 1) },
    });
  }
  await computeStoredAudit(db, { id: job.auditId, orgId: job.orgId });
}

/**
 * Starts taking jobs in this process: `concurrency` computations at a time (each on its own worker thread) and
 * verifications alongside. Returns when the handlers are registered; the queue polls twice a second.
 */
export async function startJobWorkers({ concurrency = 1 }: { concurrency?: number } = {}): Promise<void> {
  const boss = await getQueue();
  for (let i = 0; i < concurrency; i++)
    await boss.work<ComputeJob>(
      QUEUES.compute,
      { batchSize: 1, pollingIntervalSeconds: 0.5, includeMetadata: true },
      async ([job]) => {
        console.log(
          `[plotproof] worker ${process.pid}: computing audit ${job.data.auditId} (attempt ${job.retryCount + 1})`,
        );
        await runComputeJob(job.data, job.retryCount);
      },
    );
  await boss.work<VerifyJob>(QUEUES.verify, { batchSize: 1, pollingIntervalSeconds: 0.5 }, async ([job]) =>
    verifyForViewer(job.data),
  );
}
