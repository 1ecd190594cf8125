/** Worker thread entry: reads the point files given and posts the ReadResults back (typed arrays transferred). */
import { parentPort, workerData } from "node:worker_threads";
import { readFileJob, transferList, type ReadJob } from "./files";

const results = [];
for (const job of (workerData as { jobs: ReadJob[] }).jobs) results.push(await readFileJob(job));
parentPort!.postMessage(results, results.flatMap(transferList));
