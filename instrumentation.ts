// Runs once when the server starts: open the database (applying migrations), then seed the demo if asked.
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { getDb } = await import("./db/client");
  const db = await getDb();
  const { checkFileStorage } = await import("./lib/server/storage");
  console.log(await checkFileStorage());
  // Audits left "computing" by a server that stopped (kill, crash, power): compute them again, or mark them
  // failed after repeated interruptions. Before the demo seed and any request, so none of this process's own
  // computations is mistaken for an interrupted one; the computing itself goes on in the background.
  // Once per process: a second register() (the dev server may load this file again) would find this process's own
  // computations "computing".
  const g = globalThis as { __plotproofRecovered?: boolean };
  // In server mode the job queue retries a computation whose worker stopped; other instances may be computing now.
  const { isServerMode } = await import("./db/client");
  if (!g.__plotproofRecovered && !isServerMode()) {
    g.__plotproofRecovered = true;
    const { recoverInterruptedAudits } = await import("./lib/server/audits/recovery");
    await recoverInterruptedAudits(db);
  }
  // Server mode: this instance also takes jobs from the queue unless JOB_WORKERS=0 (dedicated `npm run worker`s).
  if (isServerMode() && Number(process.env.JOB_WORKERS ?? 1) > 0) {
    const { startJobWorkers } = await import("./lib/server/jobs/worker");
    await startJobWorkers({ concurrency: Number(process.env.JOB_WORKERS ?? 1) });
  }
  // Bundle the audit worker now (about a second when its sources changed) rather than on the first audit.
  const { workerBundle } = await import("./lib/workers/bundle");
  void workerBundle("lib/audit-job/audit-worker.ts").catch((err) =>
    console.error("[plotproof] could not bundle the audit worker", err),
  );
  if (process.env.PLOTPROOF_DEMO === "1") {
    const { seedDemo, demoCredentialsText } = await import("./lib/demo/seed");
    const result = await seedDemo();
    console.log(`[plotproof] demo data ${result === "created" ? "created" : "already present"}.`);
    console.log(demoCredentialsText());
    if (!process.env.SMTP_HOST) {
      // Demo e-mail goes to a fake SMTP server in this process; owners read it on /outbox.
      const { ensureDemoMailCapture } = await import("./lib/server/mail/demo");
      const smtp = await ensureDemoMailCapture();
      console.log(
        `[plotproof] demo e-mail is captured by a fake SMTP server on ${smtp.host}:${smtp.port}; owners read it on /outbox.`,
      );
    }
  }
}
