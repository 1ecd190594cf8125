/**
 * A job worker for server mode: takes audit computations and re-verifications from the PostgreSQL queue that the
 * app instances fill (lib/server/jobs). Run as many as the machines allow, on any machine that reaches the database:
 *
 *   DATABASE_URL=postgres://… [OBJECT_STORE_URL=…] [JOB_WORKERS=1] npm run worker
 *
 * Stops cleanly on SIGINT/SIGTERM (the job in hand finishes first, up to 10 s); a killed worker's job is retried by
 * another worker once it expires.
 */
import { getDb, isServerMode } from "@/db/client";
import { startJobWorkers } from "@/lib/server/jobs/worker";
import { stopQueue } from "@/lib/server/jobs/queue";
import { checkFileStorage } from "@/lib/server/storage";

async function main() {
  if (!isServerMode()) {
    console.error("npm run worker needs DATABASE_URL: in embedded mode the app computes audits itself.");
    process.exit(2);
  }
  await getDb(); // applies pending migrations, like an app instance
  console.log(await checkFileStorage());
  const concurrency = Math.max(1, Number(process.env.JOB_WORKERS ?? 1));
  await startJobWorkers({ concurrency });
  console.log(`[plotproof] worker ${process.pid} takes jobs (${concurrency} at a time).`);
  const stop = async (signal: string) => {
    console.log(`[plotproof] worker ${process.pid}: ${signal}, stopping.`);
    await stopQueue().catch(() => {});
    process.exit(0);
  };
  process.on("SIGINT", () => void stop("SIGINT"));
  process.on("SIGTERM", () => void stop("SIGTERM"));
}

main().catch((err) => {
  console.error("[plotproof] worker failed to start", err);
  process.exit(1);
});
