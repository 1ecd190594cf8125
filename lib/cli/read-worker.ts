/** Worker thread entry: reads the point files given and posts the ReadResults back (typed arrays transferred). */
import { parentPort, workerData } from "node:worker_threads";
import { tableBuffers, type ReadResult } from "@/geo";
import { readFileJob, type ReadJob } from "./file-read";

async function main(): Promise<void> {
  const results: ReadResult[] = [];
  for (const job of (workerData as { jobs: ReadJob[] }).jobs) results.push(await readFileJob(job));
  parentPort!.postMessage(
    results,
    results.flatMap((r) => (r.table ? tableBuffers(r.table) : [])),
  );
}

void main();
