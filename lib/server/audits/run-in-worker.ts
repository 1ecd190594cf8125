/**
 * Runs an audit computation on a worker thread and hands its messages back in order. PGlite and
 * the request handlers share the server's main thread; the engine's seconds of arithmetic on a
 * large field would otherwise hold every other user's request.
 */
import { on } from "node:events";
import { Worker } from "node:worker_threads";
import { tableBuffers } from "@/geo";
import { workerBundle } from "@/lib/workers/bundle";
import type { AuditJobInput, AuditJobMessage, AuditJobRequest } from "@/lib/audit-job/messages";

export interface AuditWorkerJob {
  /** The worker's messages; ends when the worker exits, throws if it crashes. */
  messages: AsyncIterableIterator<AuditJobMessage>;
  /** Asks for the next batch of rows (answered by a `residuals`, `unpaired` or `done` message). */
  more(): void;
  /** Stops the worker (idempotent). */
  stop(): Promise<void>;
}

/** Starts the computation. The input tables' arrays are moved to the worker: do not use them afterwards. */
export async function startAuditWorker(input: AuditJobInput): Promise<AuditWorkerJob> {
  // A plain-JavaScript bundle of audit-worker.ts (see lib/workers/bundle.ts); no TypeScript loader in the worker.
  const worker = new Worker(await workerBundle("lib/audit-job/audit-worker.ts"), { execArgv: [] });
  const events = on(worker, "message", { close: ["exit"] }) as AsyncIterableIterator<[AuditJobMessage]>;
  worker.postMessage(input, [...tableBuffers(input.planted), ...tableBuffers(input.survey)]);
  async function* messages(): AsyncGenerator<AuditJobMessage> {
    for await (const [m] of events) yield m;
  }
  let stopped = false;
  return {
    messages: messages(),
    more: () => worker.postMessage({ type: "more" } satisfies AuditJobRequest),
    async stop() {
      if (stopped) return;
      stopped = true;
      await worker.terminate();
    },
  };
}
