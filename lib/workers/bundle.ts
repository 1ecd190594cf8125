/**
 * Plain-JavaScript bundles of worker-thread entries, for the server (audit computation) and the
 * command line (reading files). Node 20 worker threads cannot load TypeScript, Next's bundler does
 * not produce Node worker chunks, and a worker started through tsx spends about 0.3 s compiling the
 * engine before it reads a byte; a bundle starts in a few tens of milliseconds. Bundles live in
 * .cache/workers under the project root (the working directory of npm scripts, tests and
 * `next start`) and are rebuilt with esbuild when any of their inputs is newer (esbuild's metafile
 * lists the inputs), so a worker never runs older code than its sources.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, statSync, writeFileSync } from "node:fs";
import { basename, join } from "node:path";

function mtime(path: string): number {
  try {
    return statSync(path).mtimeMs;
  } catch {
    return Infinity;
  }
}

/** True when the bundle exists and none of its recorded inputs changed after it was written. */
function fresh(root: string, out: string, meta: string): boolean {
  if (!existsSync(out) || !existsSync(meta)) return false;
  const built = mtime(out);
  try {
    const inputs = JSON.parse(readFileSync(meta, "utf8")) as string[];
    return inputs.every((f) => mtime(join(root, f)) <= built);
  } catch {
    return false;
  }
}

const building = new Map<string, Promise<string>>();

/**
 * Path of a CommonJS bundle of `entry` (a TypeScript file of this project, relative to its root),
 * built if missing or stale. One build at a time per bundle in this process; the file appears by
 * rename, so a worker never starts from a half-written bundle.
 * @example new Worker(await workerBundle("lib/cli/read-worker.ts"), { workerData })
 */
export function workerBundle(entry: string): Promise<string> {
  const root = process.cwd();
  const dir = join(root, ".cache", "workers");
  const name = basename(entry).replace(/\.[cm]?tsx?$/, "");
  const out = join(dir, `${name}.cjs`);
  const meta = join(dir, `${name}.inputs.json`);
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
      format: "cjs",
      target: "node20",
      outfile: tmp,
      metafile: true,
      logLevel: "silent",
    });
    writeFileSync(meta, JSON.stringify(Object.keys(result.metafile.inputs)));
    renameSync(tmp, out);
    return out;
  })().finally(() => building.delete(out));
  building.set(out, job);
  return job;
}
