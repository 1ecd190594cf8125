/**
 * Starts a command-line entry of this project from its cached plain-JavaScript bundle
 * (`node lib/cli/launch.mjs lib/cli/audit.ts --planted …`): about a second less than compiling the
 * engine with tsx at every start. The bundle is rebuilt whenever a source is newer (see bundle.mjs).
 */
import { pathToFileURL } from "node:url";
import { workerBundle } from "../workers/bundle.mjs";

const [entry, ...args] = process.argv.slice(2);
if (!entry) {
  process.stderr.write("usage: node lib/cli/launch.mjs lib/cli/<entry>.ts [arguments]\n");
  process.exit(2);
}
process.argv = [process.argv[0], entry, ...args];
await import(pathToFileURL(await workerBundle(entry, "esm")).href);
