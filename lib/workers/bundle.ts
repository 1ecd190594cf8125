/** Typed entry to the bundler (plain JavaScript so that lib/cli/launch.mjs can use it without tsx). */
export { workerBundle } from "./bundle.mjs";
