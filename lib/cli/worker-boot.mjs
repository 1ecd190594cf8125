// Starts a TypeScript worker under tsx: Node 20 worker threads do not inherit tsx's loader hooks.
import { register } from "tsx/esm/api";
import { workerData } from "node:worker_threads";

register();
await import(workerData.entry);
