#!/usr/bin/env node
// The whole test suite: types, lint and format, layer rules (dependency-cruiser), unit + integration (vitest),
// the integration tests again on a throwaway PostgreSQL server (server mode), production build, browser tests
// (Playwright driving Debian's chromium) embedded and as a two-instance server deployment. Installs chromium and
// postgresql with apt-get when they are missing and we are root.
// Ends with one summary line: "tests: N passed, N failed".
import { spawnSync } from "node:child_process";
import fs from "node:fs";
import { freePort, postgresBin, startPostgres } from "./pg/throwaway-postgres.mjs";

const chromium = process.env.CHROMIUM_PATH ?? "/usr/bin/chromium";
const steps = [];
let failed = false;

function run(name, cmd, args, env = {}) {
  console.log(`\n▶ ${name}: ${cmd} ${args.join(" ")}`);
  const t0 = Date.now();
  const r = spawnSync(cmd, args, { stdio: "inherit", env: { ...process.env, ...env } });
  const ok = r.status === 0;
  steps.push({ name, ok, seconds: (Date.now() - t0) / 1000 });
  if (!ok) failed = true;
  return ok;
}

if (!fs.existsSync(chromium)) {
  if (process.getuid?.() === 0) {
    run("install chromium", "sh", [
      "-c",
      "apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq chromium",
    ]);
  } else {
    console.error(`Chromium not found at ${chromium}. Install it with: sudo apt-get install -y chromium`);
    failed = true;
  }
}

if (!postgresBin()) {
  if (process.getuid?.() === 0) {
    run("install postgresql", "sh", [
      "-c",
      "apt-get update -qq && DEBIAN_FRONTEND=noninteractive apt-get install -y -qq postgresql",
    ]);
  } else {
    console.error("PostgreSQL not found. Install it with: sudo apt-get install -y postgresql");
    failed = true;
  }
}

// Playwright empties test-results/ when it starts, so the runners' JSON reports live elsewhere.
fs.rmSync(".test-report", { recursive: true, force: true });
fs.mkdirSync(".test-report", { recursive: true });
run("type check", "npx", ["tsc", "--noEmit", "-p", "."]);
run("lint and format (Biome)", "npx", ["biome", "check", "."]);
run("layer rules (dependency-cruiser)", "npm", ["run", "--silent", "deps"]);
run("unit and integration tests", "npx", [
  "vitest",
  "run",
  "--reporter=default",
  "--reporter=json",
  "--outputFile=.test-report/unit.json",
]);
if (postgresBin()) {
  const pg = startPostgres(await freePort());
  try {
    run(
      "integration tests on PostgreSQL (server mode)",
      "npx",
      [
        "vitest",
        "run",
        "tests/integration",
        "db",
        "--reporter=default",
        "--reporter=json",
        "--outputFile=.test-report/unit-pg.json",
      ],
      { TEST_DATABASE_URL: pg.url },
    );
  } finally {
    pg.stop();
  }
}
const built = run("production build", "npx", ["next", "build"]);
if (built && fs.existsSync(chromium)) {
  fs.rmSync("data/e2e", { recursive: true, force: true });
  run("browser tests", "npx", ["playwright", "test"], { PLAYWRIGHT_SKIP_BROWSER_DOWNLOAD: "1" });
  if (postgresBin())
    run("browser tests, server mode (PostgreSQL, two instances, two workers)", "npx", [
      "playwright",
      "test",
      "-c",
      "playwright.server.config.ts",
    ]);
}

function readJson(path) {
  try {
    return JSON.parse(fs.readFileSync(path, "utf8"));
  } catch {
    return null;
  }
}
let passed = 0,
  failures = 0,
  skipped = 0;
for (const unit of [readJson(".test-report/unit.json"), readJson(".test-report/unit-pg.json")]) {
  if (!unit) continue;
  passed += unit.numPassedTests;
  failures += unit.numFailedTests;
  skipped += unit.numPendingTests + unit.numTodoTests;
}
for (const e2e of [readJson(".test-report/e2e.json"), readJson(".test-report/e2e-server.json")]) {
  if (!e2e) continue;
  passed += e2e.stats.expected + e2e.stats.flaky;
  failures += e2e.stats.unexpected;
  skipped += e2e.stats.skipped;
}
const stepFailures = steps.filter((s) => !s.ok).length;
console.log("\nSteps:");
for (const s of steps) console.log(`  ${s.ok ? "ok  " : "FAIL"} ${s.name} (${s.seconds.toFixed(1)} s)`);
if (failed && failures === 0) failures = stepFailures; // a step failed without failing tests (build, types, install)
console.log(`tests: ${passed} passed, ${failures} failed, ${skipped} skipped`);
process.exit(failed ? 1 : 0);
