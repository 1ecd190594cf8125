/**
 * Benchmark: `npm run bench [-- --sizes 10000,100000,1000000] [--regen] [--sequential] [--compare]`.
 *
 * Generates the synthetic field of bench-field.ts as CSV in .bench/, then times the whole audit from files at each size in a fresh child process (read, validate,
 * project, check, pair, row bearing, statistics, total) and reports peak memory: the largest RSS
 * sampled every 20 ms and process.resourceUsage().maxRSS (the kernel's peak, which sampling can miss).
 * `--compare` also runs bench/analyst_audit.py (pandas + pyproj + scipy) on the same files right after each engine run,
 * when a python3 with those packages is found, and prints both processes' wall time from spawn to exit.
 */
import { spawnSync } from "node:child_process";
import { loadavg } from "node:os";
import { parseArgs } from "node:util";
import { radialToleranceProfile } from "@/lib/audit/profile";
import { DEFAULT_MAX_PAIR_DISTANCE_M } from "@/lib/audit/settings";
import { benchFiles, DIR } from "./bench-field";
import { runPipeline } from "./pipeline";

/** One measured run (in this process). */
async function runOnce(n: number, parallel: boolean): Promise<void> {
  let peak = 0;
  const timer = setInterval(() => {
    peak = Math.max(peak, process.memoryUsage.rss());
  }, 20);
  const result = await runPipeline({
    planted: `${DIR}/planted-${n}.csv`,
    survey: `${DIR}/survey-${n}.csv`,
    surveyCrs: "EPSG:32632",
    workCrs: "auto",
    match: "auto",
    maxDistanceM: DEFAULT_MAX_PAIR_DISTANCE_M,
    profile: radialToleranceProfile(0.02),
    groupBy: [],
    parallel,
  });
  clearInterval(timer);
  peak = Math.max(peak, process.memoryUsage.rss());
  const maxRss = process.resourceUsage().maxRSS * 1024;
  const s = result.report;
  process.stdout.write(
    JSON.stringify({
      n,
      exitCode: result.exitCode,
      timingsMs: Object.fromEntries(Object.entries(result.timings).map(([k, v]) => [k, Math.round(v)])),
      cpuMs: Object.fromEntries(Object.entries(result.cpuTimings).map(([k, v]) => [k, Math.round(v)])),
      loadAverage1m: Math.round(loadavg()[0] * 100) / 100,
      peakRssSampledMB: Math.round(peak / 1e6),
      maxRssMB: Math.round(maxRss / 1e6),
      pairs: s?.pairs,
      unmatchedPlanted: s?.unmatchedPlanted,
      unmatchedSurvey: s?.unmatchedSurvey,
      rmseR: s?.rmseR,
      meanDE: s?.meanDE,
      rowBearing: s?.run.rowBearing.deg,
      errors: result.issues.filter((i) => i.severity === "error").slice(0, 3),
    }) + "\n",
  );
}

async function main(): Promise<void> {
  const { values } = parseArgs({
    options: {
      sizes: { type: "string", default: "10000,100000,1000000" },
      regen: { type: "boolean", default: false },
      run: { type: "string" },
      sequential: { type: "boolean", default: false },
      repeat: { type: "string", default: "1" },
      compare: { type: "boolean", default: false },
    },
  });
  if (values.run) {
    await runOnce(Number(values.run), !values.sequential);
    return;
  }
  const sizes = values.sizes!.split(",").map(Number);
  for (const n of sizes) await benchFiles(n, values.regen);
  const python = values.compare ? findAnalystPython() : undefined;
  if (values.compare && !python)
    process.stderr.write("--compare: no python3 with pandas, pyproj and scipy found; skipped\n");
  const rows: string[] = [];
  const comparisons: Comparison[] = [];
  for (const n of sizes) {
    for (let k = 0; k < Number(values.repeat); k++) {
      // The engine as `npm run audit` starts it: from its cached bundle (lib/cli/launch.mjs), not through tsx.
      const args = ["lib/cli/launch.mjs", "lib/cli/bench.ts", "--run", String(n)];
      if (values.sequential) args.push("--sequential");
      const began = performance.now();
      const child = spawnSync(process.execPath, args, { encoding: "utf8", maxBuffer: 1 << 24 });
      const engineWallMs = performance.now() - began;
      if (child.status !== 0) throw new Error(`benchmark run at n=${n} failed:\n${child.stderr}`);
      const line = child.stdout.trim().split("\n").pop()!;
      rows.push(line);
      process.stdout.write(line + "\n");
      if (python) comparisons.push({ n, engineWallMs, engine: JSON.parse(line), script: runAnalystScript(python, n) });
    }
  }
  process.stdout.write(
    "\nwall ms (CPU ms of all threads)\n| N | read | validate | project | check | pair | row bearing | statistics | total | peak RSS sampled (maxRSS) | load avg |\n|---|---|---|---|---|---|---|---|---|---|---|\n",
  );
  for (const l of rows) {
    const r = JSON.parse(l);
    const t = r.timingsMs,
      c = r.cpuMs;
    const cell = (k: string) => `${t[k]} (${c[k]})`;
    process.stdout.write(
      `| ${r.n.toLocaleString("en")} | ${cell("read")} | ${cell("validate")} | ${cell("project")} | ${cell("check-files")} | ${cell("pair")} | ${cell("row-bearing")} | ${cell("statistics")} | ${cell("total")} | ${r.peakRssSampledMB} MB (${r.maxRssMB} MB) | ${r.loadAverage1m} |\n`,
    );
  }
  if (comparisons.length) printComparison(comparisons);
}

interface Comparison {
  n: number;
  engineWallMs: number;
  engine: { maxRssMB: number; pairs: number; rmseR: number };
  script: { wallMs: number; maxRssMB: number; pairs: number; rmseR: number; timingsMs: Record<string, number> };
}

const ANALYST_SCRIPT = "lib/cli/bench/analyst_audit.py";

/** Debian's python3 has the packages from apt (python3-pandas, python3-pyproj, python3-scipy); a pyenv one may not. */
function findAnalystPython(): string | undefined {
  for (const candidate of ["python3", "/usr/bin/python3"]) {
    const probe = spawnSync(candidate, ["-c", "import pandas, pyproj, scipy"], { encoding: "utf8" });
    if (probe.status === 0) return candidate;
  }
  return undefined;
}

function runAnalystScript(python: string, n: number): Comparison["script"] {
  const args = [ANALYST_SCRIPT, `${DIR}/planted-${n}.csv`, `${DIR}/survey-${n}.csv`, "EPSG:32632"];
  args.push(String(DEFAULT_MAX_PAIR_DISTANCE_M), "0.02");
  const began = performance.now();
  const child = spawnSync(python, args, { encoding: "utf8", maxBuffer: 1 << 24 });
  const wallMs = performance.now() - began;
  if (child.status !== 0) throw new Error(`analyst script at n=${n} failed:\n${child.stderr}`);
  const out = JSON.parse(child.stdout.trim().split("\n").pop()!);
  process.stdout.write(`analyst script n=${n}: ${JSON.stringify(out)}\n`);
  return { wallMs, ...out };
}

function printComparison(list: Comparison[]): void {
  process.stdout.write(
    "\nwhole process, spawn to exit (the same files, one after the other)\n| N | engine wall | script wall | script ÷ engine | engine peak | script peak | pairs engine / script | RMSE engine / script (mm) |\n|---|---|---|---|---|---|---|---|\n",
  );
  for (const c of list) {
    const mm = (m: number) => (m * 1000).toFixed(2);
    process.stdout.write(
      `| ${c.n.toLocaleString("en")} | ${Math.round(c.engineWallMs)} ms | ${Math.round(c.script.wallMs)} ms | ${(c.script.wallMs / c.engineWallMs).toFixed(2)}× | ${c.engine.maxRssMB} MB | ${c.script.maxRssMB} MB | ${c.engine.pairs} / ${c.script.pairs} | ${mm(c.engine.rmseR)} / ${mm(c.script.rmseR)} |\n`,
    );
  }
}

await main();
