/**
 * Plain-JavaScript bundles of this project's TypeScript entries: worker-thread entries for the server
 * (audit computation) and the command line (reading files), and the command line itself
 * (lib/cli/launch.mjs). Node 20 worker threads cannot load TypeScript, Next's bundler does not produce
 * Node worker chunks, and an entry started through tsx spends 0.3–1.5 s compiling the engine before it
 * reads a byte; a bundle starts in a few tens of milliseconds. Bundles live in .cache/workers under the
 * project root (the working directory of npm scripts, tests and `next start`) and are rebuilt with
 * esbuild when any of their inputs is newer (esbuild's metafile lists the inputs), so nothing ever runs
 * older code than its sources. Plain JavaScript so that the launcher can use it without tsx.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, statSync, writeFileSync } from "node:fs";
import { basename, join } from "node:path";

/** @param {string} path */
function mtime(path) {
  try {
    return statSync(path).mtimeMs;
  } catch {
    return Infinity;
  }
}

/**
 * True when the bundle exists and none of its recorded inputs changed after it was written.
 * @param {string} root @param {string} out @param {string} meta
 */
function fresh(root, out, meta) {
  if (!existsSync(out) || !existsSync(meta)) return false;
  const built = mtime(out);
  try {
    /** @type {string[]} */
    const inputs = JSON.parse(readFileSync(meta, "utf8"));
    return inputs.every((f) => mtime(join(root, f)) <= built);
  } catch {
    return false;
  }
}

/** @type {Map<string, Promise<string>>} */
const building = new Map();

// An ES module bundle keeps top-level await; `require` of Node's built-ins by CommonJS packages needs this.
const ESM_REQUIRE =
  "import { createRequire as __bundleRequire } from 'node:module'; const require = __bundleRequire(import.meta.url);";

/**
 * Path of a bundle of `entry` (a TypeScript file of this project, relative to its root), built if
 * missing or stale: CommonJS for worker threads, an ES module for a process entry. One build at a time
 * per bundle in this process; the file appears by rename, so nothing starts from a half-written bundle.
 * @param {string} entry
 * @param {"cjs" | "esm"} [format]
 * @returns {Promise<string>}
 * @example new Worker(await workerBundle("lib/cli/read-worker.ts"), { workerData })
 */
export function workerBundle(entry, format = "cjs") {
  const root = process.cwd();
  const dir = join(root, ".cache", "workers");
  const name = basename(entry).replace(/\.[cm]?tsx?$/, "");
  const out = join(dir, `${name}.${format === "esm" ? "mjs" : "cjs"}`);
  const meta = join(dir, `${name}.${format}.inputs.json`);
  if (fresh(root, out, meta)) return Promise.resolve(out);
  const pending = building.get(out);
  if (pending) return pending;
  const job = (async () => {
    const { build } = await import("esbuild");
    mkdirSync(dir, { recursive: true });
    const tmp = `${out}.${process.pid}.tmp`;
    const result = await build({
      absWorkingDir: root,
      entryPoints: [entry],
      bundle: true,
      platform: "node",
      format,
      target: "node20",
      outfile: tmp,
      metafile: true,
      logLevel: "silent",
      // The command line builds its read worker's bundle itself; esbuild's native binary cannot be bundled.
      external: ["esbuild"],
      ...(format === "esm" ? { banner: { js: ESM_REQUIRE } } : {}),
    });
    writeFileSync(meta, JSON.stringify(Object.keys(result.metafile.inputs)));
    renameSync(tmp, out);
    return out;
  })().finally(() => building.delete(out));
  building.set(out, job);
  return job;
}
