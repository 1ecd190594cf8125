// Starts the TypeScript worker under tsx's in-thread CommonJS hook. Node 20 worker threads do not
// inherit tsx's loader, and tsx's ESM hooks would run on an extra thread with a round trip per module.
const { register } = require("tsx/cjs/api");
const { workerData } = require("node:worker_threads");

register();
require(workerData.entry);
