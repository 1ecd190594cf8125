import "server-only";
import { setTimeout as sleep } from "node:timers/promises";
import pg from "pg";
import PgBoss from "pg-boss";
import { type DB, isServerMode } from "@/db/client";
import { getAuditById } from "@/db/queries/audits";
import { AppError } from "@/lib/errors";

/**
 * The one job interface of the app: audit computations and re-verifications.
 *
 * - Embedded mode (PGlite): one process owns the database, so a job runs in this process (the engine on a worker
 *   thread), as before.
 * - Server mode (DATABASE_URL): jobs go to a durable PostgreSQL queue (pg-boss) that any number of worker processes
 *   (`npm run worker`) share; a job whose worker dies is retried by another once it expires. Progress lives in the
 *   audit row, so every app instance sees it.
 */

export const QUEUES = { compute: "audit-compute", verify: "audit-verify" } as const;

/** Data of a computation job. */
export interface ComputeJob {
  auditId: string;
  orgId: string;
}

/** Retries after a worker died or failed (the computation stores its own failures; these are crashes). */
const RETRY_LIMIT = 3;

/**
 * How long a worker may hold a computation before the queue hands it to another: generous for the file's size,
 * short enough that a killed worker's audit goes on within a minute or two for a demo-sized field.
 */
export function computeExpirySeconds(plants: number): number {
  return Math.min(3600, Math.round(45 + plants / 5000));
}

const g = globalThis as unknown as { __plotproofBoss?: Promise<PgBoss> };

/** The queue of this process (server mode only), started once. `maintenanceIntervalSeconds` sweeps expired jobs. */
export function getQueue(): Promise<PgBoss> {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error("the job queue needs DATABASE_URL (server mode)");
  if (!g.__plotproofBoss) {
    g.__plotproofBoss = (async () => {
      const boss = new PgBoss({
        connectionString: url,
        maintenanceIntervalSeconds: Number(process.env.QUEUE_MAINTENANCE_SECONDS ?? 2),
        max: 4,
      });
      boss.on("error", (err) => console.error("[plotproof] job queue", err));
      // Instances and workers starting together would deadlock creating the queue's tables and queues: one at a time.
      const lock = new pg.Client({ connectionString: url });
      await lock.connect();
      try {
        await lock.query("select pg_advisory_lock(724520)");
        await boss.start();
        for (const name of Object.values(QUEUES)) await boss.createQueue(name);
      } finally {
        await lock.query("select pg_advisory_unlock(724520)").catch(() => {});
        await lock.end();
      }
      return boss;
    })();
    g.__plotproofBoss.catch(() => {
      g.__plotproofBoss = undefined;
    });
  }
  return g.__plotproofBoss;
}

/** Stops this process's queue (worker shutdown, tests). */
export async function stopQueue(): Promise<void> {
  const boss = await g.__plotproofBoss?.catch(() => null);
  g.__plotproofBoss = undefined;
  await boss?.stop({ graceful: true, wait: true, timeout: 10_000 });
}

/** Waits until the audit is no longer computing (server mode, `?wait=1`). */
async function waitForAudit(db: DB, { auditId, orgId }: ComputeJob, timeoutMs = 15 * 60_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const a = await getAuditById(db, { id: auditId, orgId });
    if (!a || a.state !== "computing") return;
    if (Date.now() > until) throw new AppError("conflict", "The audit is still computing; look again later.");
    await sleep(250);
  }
}

/**
 * Has an audit that is "computing" computed: here (embedded) or by a worker (server). `wait` resolves when done.
 * `computeHere` is the computation itself (lib/server/audits/run-audit.ts), passed in to keep this module free of it.
 */
export async function dispatchComputation(
  db: DB,
  job: ComputeJob & { plants: number },
  computeHere: (db: DB, job: { id: string; orgId: string }) => Promise<void>,
  opts: { wait?: boolean } = {},
): Promise<void> {
  if (!isServerMode()) {
    const run = computeHere(db, { id: job.auditId, orgId: job.orgId });
    if (opts.wait) await run;
    else void run;
    return;
  }
  const boss = await getQueue();
  await boss.send(QUEUES.compute, { auditId: job.auditId, orgId: job.orgId } satisfies ComputeJob, {
    retryLimit: RETRY_LIMIT,
    retryDelay: 0,
    expireInSeconds: computeExpirySeconds(job.plants),
  });
  if (opts.wait) await waitForAudit(db, job);
}

/**
 * Runs a re-verification: here (embedded) or on a worker (server), waiting for its answer either way.
 * `data` must survive JSON (it goes through the queue); the worker calls the same `verifyHere` with it.
 */
export async function dispatchVerification<D extends object, R>(
  data: D,
  verifyHere: (data: D) => Promise<R>,
  timeoutMs = 10 * 60_000,
): Promise<R> {
  if (!isServerMode()) return verifyHere(data);
  const boss = await getQueue();
  const id = await boss.send(QUEUES.verify, data, { retryLimit: 1, retryDelay: 0, expireInSeconds: 900 });
  if (!id) throw new Error("the job queue refused the verification");
  const until = Date.now() + timeoutMs;
  for (;;) {
    const job = await boss.getJobById<D>(QUEUES.verify, id, { includeArchive: true });
    if (job?.state === "completed") return job.output as R;
    if (job?.state === "failed" || job?.state === "cancelled") {
      const message = (job.output as { message?: string } | null)?.message ?? "the verification failed on the worker";
      throw new Error(message);
    }
    if (Date.now() > until) throw new AppError("conflict", "The verification is taking too long; try again later.");
    await sleep(300);
  }
}
