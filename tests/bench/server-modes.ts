/**
 * `npm run bench:server:modes -- --mode embedded|server [--plants N] [--survey-every K]`: starts a fresh deployment
 * from the production build (`npm run build` first) and runs `npm run bench:server` against it, so the two modes are
 * measured the same way.
 *  - embedded: one `serve.mjs` on PGlite in a temporary directory, demo seeded, computing on its own worker thread;
 *  - server: the browser tests' server-mode deployment (tests/e2e-server/deployment.ts): a throwaway PostgreSQL,
 *    the fake object store, two app instances taking no jobs and two job workers; the benchmark uses instance A.
 */
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { parseArgs } from "node:util";
import { healthy } from "../e2e-server/deployment";
import { freePort } from "../pg/throwaway-postgres.mjs";

const { values, positionals } = parseArgs({
  options: { mode: { type: "string", default: "embedded" } },
  allowPositionals: true,
  strict: false,
});
const benchArgs = process.argv.slice(2).filter((a, i, all) => a !== "--mode" && all[i - 1] !== "--mode");
void positionals;

function exited(child: ChildProcess): Promise<number> {
  return new Promise((resolve) => child.on("exit", (code) => resolve(code ?? 1)));
}

async function startEmbedded(): Promise<{ base: string; stop: () => Promise<void> }> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "plotproof-bench-"));
  const port = await freePort();
  const base = `http://127.0.0.1:${port}`;
  const log = fs.openSync(path.join(dir, "server.log"), "w");
  const env: Record<string, string | undefined> = {
    ...process.env,
    PGLITE_DIR: path.join(dir, "pglite"),
    PLOTPROOF_DEMO: "1",
    BETTER_AUTH_URL: base,
  };
  delete env.DATABASE_URL;
  const server = spawn(process.execPath, ["lib/server/http/serve.mjs", "-p", String(port)], {
    env: { ...env, AUTH_SIGNIN_PER_MINUTE: "1000" } as unknown as NodeJS.ProcessEnv,
    stdio: ["ignore", log, log],
  });
  await healthy(base, 300_000);
  // The demo is seeded before the first page answers.
  if (!(await fetch(`${base}/login`)).ok) throw new Error(`${base}: /login did not answer`);
  return {
    base,
    stop: async () => {
      server.kill("SIGTERM");
      await exited(server);
      fs.rmSync(dir, { recursive: true, force: true });
    },
  };
}

async function startServerMode(): Promise<{ base: string; stop: () => Promise<void> }> {
  const { default: globalSetup, STATE_FILE } = await import("../e2e-server/deployment");
  const teardown = await globalSetup();
  const { a } = JSON.parse(fs.readFileSync(STATE_FILE, "utf8")) as { a: string };
  return { base: a, stop: teardown };
}

const deployment = values.mode === "server" ? await startServerMode() : await startEmbedded();
let code = 1;
try {
  // Not spawnSync: the fake object store runs in this process and must keep answering.
  const bench = spawn(
    process.execPath,
    ["--import", "tsx", "lib/cli/bench-server.ts", "--base", deployment.base, ...benchArgs],
    {
      stdio: "inherit",
    },
  );
  code = await exited(bench);
} finally {
  await deployment.stop();
}
process.exit(code);
