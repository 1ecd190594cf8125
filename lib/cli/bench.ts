/**
 * Benchmark: `npm run bench [-- --sizes 10000,100000,1000000] [--regen] [--sequential]`.
 *
 * Generates the synthetic field of bench-field.ts as CSV in .bench/, then times the whole audit from files at each size in a fresh child process (read, validate,
 * project, check, pair, row bearing, statistics, total) and reports peak memory: the largest RSS
 * sampled every 20 ms and process.resourceUsage().maxRSS (the kernel's peak, which sampling can miss).
 */
import { spawnSync } from "node:child_process";
import { loadavg } from "node:os";
import { fileURLToPath } from "node:url";
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
    },
  });
  if (values.run) {
    await runOnce(Number(values.run), !values.sequential);
    return;
  }
  const sizes = values.sizes!.split(",").map(Number);
  for (const n of sizes) await benchFiles(n, values.regen);
  const self = fileURLToPath(import.meta.url);
  const rows: string[] = [];
  for (const n of sizes) {
    for (let k = 0; k < Number(values.repeat); k++) {
      const args = ["--import", "tsx", self, "--run", String(n)];
      if (values.sequential) args.push("--sequential");
      const child = spawnSync(process.execPath, args, { encoding: "utf8", maxBuffer: 1 << 24 });
      if (child.status !== 0) throw new Error(`benchmark run at n=${n} failed:\n${child.stderr}`);
      const line = child.stdout.trim().split("\n").pop()!;
      rows.push(line);
      process.stdout.write(line + "\n");
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
}

await main();
