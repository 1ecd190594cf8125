/** Worker thread entry: reads one point file and posts the ReadResult back (typed arrays transferred). */
import { parentPort, workerData } from "node:worker_threads";
import { readFileJob, transferList, type ReadJob } from "./files";

const result = await readFileJob(workerData as ReadJob);
parentPort!.postMessage(result, transferList(result));
