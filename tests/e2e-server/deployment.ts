/**
 * A server-mode deployment on this machine for the browser tests: a throwaway PostgreSQL, an S3-compatible object
 * store (s3rver) for the uploaded files and report files, two job workers (`npm run worker`'s command) and two app
 * instances (A seeds the demo farm; B starts after it), all from the same production build. Playwright's global
 * setup; the state (URLs, object store variables, worker pids and logs) goes to .test-report/.
 */
import { spawn, type ChildProcess } from "node:child_process";
import fs from "node:fs";
import path from "node:path";
import { freePort, startPostgres } from "../pg/throwaway-postgres.mjs";
import { startFakeS3 } from "../object-store/fake-s3.mjs";

export const STATE_FILE = ".test-report/deployment.json";

export interface DeploymentState {
  a: string;
  b: string;
  /** The OBJECT_STORE_* variables every instance and worker was started with. */
  objectStore: Record<string, string>;
  workers: { pid: number; log: string }[];
}

const children: ChildProcess[] = [];

function start(name: string, args: string[], env: Record<string, string>, log: string): ChildProcess {
  const out = fs.openSync(log, "w");
  const child = spawn(process.execPath, args, { env: { ...process.env, ...env }, stdio: ["ignore", out, out] });
  children.push(child);
  child.on("exit", (code, signal) => fs.appendFileSync(log, `\n[deployment] ${name} exited (${code ?? signal})\n`));
  return child;
}

export async function healthy(base: string, timeoutMs = 240_000): Promise<void> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    try {
      const res = await fetch(`${base}/api/health`);
      if (res.ok) return;
    } catch {
      // not listening yet
    }
    if (Date.now() > until) throw new Error(`${base} did not become healthy`);
    await new Promise((r) => setTimeout(r, 500));
  }
}

export default async function globalSetup() {
  const dir = path.resolve(".test-report/deployment");
  fs.rmSync(dir, { recursive: true, force: true });
  fs.mkdirSync(dir, { recursive: true });
  const pg = startPostgres(await freePort());
  const s3 = await startFakeS3({ bucket: "plotproof-deployment" });
  const [portA, portB] = [await freePort(), await freePort()];
  const a = `http://127.0.0.1:${portA}`;
  const b = `http://127.0.0.1:${portB}`;
  const common = {
    DATABASE_URL: pg.url,
    BETTER_AUTH_SECRET: "server-mode-test-secret-0123456789abcdef",
    AUTH_SIGNIN_PER_MINUTE: "1000",
    OPEN_SIGNUP: "1",
    QUEUE_MAINTENANCE_SECONDS: "1",
    ...s3.env,
  };
  const workerArgs = ["--conditions=react-server", "--import", "tsx", "lib/server/jobs/worker-main.ts"];
  const workers = [1, 2].map((i) => {
    const log = path.join(dir, `worker-${i}.log`);
    const child = start(`worker ${i}`, workerArgs, common, log);
    return { pid: child.pid!, log };
  });
  // App instances take no jobs: the two workers compute everything.
  start(
    "app A",
    ["lib/server/http/serve.mjs", "-p", String(portA)],
    { ...common, JOB_WORKERS: "0", PLOTPROOF_DEMO: "1", BETTER_AUTH_URL: a },
    path.join(dir, "app-a.log"),
  );
  await healthy(a);
  // The demo is seeded (its season computed by the workers) before A answers its first page; B comes after.
  const warm = await fetch(`${a}/login`);
  if (!warm.ok) throw new Error(`app A: /login answered ${warm.status}`);
  start(
    "app B",
    ["lib/server/http/serve.mjs", "-p", String(portB)],
    { ...common, JOB_WORKERS: "0", BETTER_AUTH_URL: b },
    path.join(dir, "app-b.log"),
  );
  await healthy(b);
  fs.writeFileSync(STATE_FILE, JSON.stringify({ a, b, objectStore: s3.env, workers } satisfies DeploymentState));
  return async () => {
    for (const c of children) if (c.exitCode === null) c.kill("SIGTERM");
    await new Promise((r) => setTimeout(r, 1500));
    for (const c of children) if (c.exitCode === null) c.kill("SIGKILL");
    pg.stop();
    await s3.stop();
  };
}
