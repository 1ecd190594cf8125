/**
 * The audit from two files, as the command line and the benchmark run it: read both files (one on a
 * worker thread), then the engine's one entry (`runAudit`, lib/audit/run.ts: validate, project, pair,
 * statistics, verdict, reports). Not pure (reads files, times stages, writes the CSV); all
 * computation is in geo/ and lib/audit/.
 */
import { createWriteStream } from "node:fs";
import { once } from "node:events";
import { hasErrors, resolveCrs, type ColumnGuess, type InputIssue, type MatchMode, type ReadResult } from "@/geo";
import type { AuditSummary, GroupName } from "@/lib/audit";
import type { ToleranceProfile } from "@/lib/audit/profile";
import { auditReportChunks, runAudit, type AuditRun, type RunRowBearing } from "@/lib/audit/run";
import { auditTimeZone, type AuditSettings } from "@/lib/audit/settings";
import type { Verdict } from "@/lib/audit/verdict";
import { readBoth } from "./files";

export interface PipelineOptions {
  planted: string;
  survey: string;
  plantedCrs?: string;
  surveyCrs?: string;
  workCrs: string;
  match: MatchMode;
  /** Largest distance for pairing by position, metres. */
  maxDistanceM: number;
  /** The profile the verdict is judged against (its limits and confidence also feed the statistics); null: no verdict. */
  profile: ToleranceProfile | null;
  rowBearing?: number;
  groupBy: GroupName[];
  timeZone?: string;
  out?: string;
  /** Read on both cores (see `readBoth`). Default: when the files together exceed 8 MB (starting a worker under tsx costs a few hundred milliseconds). */
  parallel?: boolean;
}

export interface PipelineResult {
  /** 0 success, 2 bad input. */
  exitCode: 0 | 2;
  issues: InputIssue[];
  /** Summary plus the verdict (null without a profile) and a `run` block describing the inputs; absent when the input was refused. */
  report?: AuditSummary & { verdict: Verdict | null; run: RunInfo };
  /** Wall-clock milliseconds per stage. */
  timings: Record<string, number>;
  /** CPU milliseconds (user + system, all threads of the process) per stage. */
  cpuTimings: Record<string, number>;
}

export interface RunInfo {
  planted: { file: string; rows: number; crs: string; columns: ColumnGuess["columns"] };
  survey: { file: string; rows: number; crs: string; columns: ColumnGuess["columns"] };
  workCrs: string;
  match: MatchMode;
  maxDistanceM: number;
  rowBearing: RunRowBearing;
  /** The profile the verdict was judged against; null without one. */
  profile: ToleranceProfile | null;
  /** Warnings about the input, as structured issues. */
  warnings: InputIssue[];
}

/** CRS of a file as read: the one given, the file's own hint, or WGS 84 for latitude/longitude columns. */
function crsFor(
  given: string | undefined,
  r: ReadResult,
  file: string,
  flag: string,
): { crs?: string; issue?: InputIssue } {
  if (given) return { crs: given };
  if (r.crsHint) return { crs: r.crsHint };
  if (r.columns.coordinates === "geographic") return { crs: "EPSG:4326" };
  return {
    issue: {
      severity: "error",
      code: "crs-missing",
      file,
      message: `the file has easting/northing columns ("${r.columns.columns.x}", "${r.columns.columns.y}"); say which projected CRS they are in with ${flag} EPSG:n`,
    },
  };
}

/** Runs the whole audit from files. */
export async function runPipeline(o: PipelineOptions): Promise<PipelineResult> {
  const timings: Record<string, number> = {};
  const cpuTimings: Record<string, number> = {};
  const t0 = performance.now();
  const c0 = process.cpuUsage();
  let last = t0;
  let lastCpu = c0;
  const mark = (name: string) => {
    const now = performance.now();
    const cpu = process.cpuUsage();
    timings[name] = (timings[name] ?? 0) + (now - last);
    cpuTimings[name] = (cpuTimings[name] ?? 0) + (cpu.user - lastCpu.user + cpu.system - lastCpu.system) / 1000;
    last = now;
    lastCpu = cpu;
  };

  const plantedJob = { path: o.planted, role: "planted" as const, timeZone: o.timeZone };
  const surveyJob = { path: o.survey, role: "survey" as const, timeZone: o.timeZone };
  const [pr, sr] = await readBoth(plantedJob, surveyJob, { parallel: o.parallel });
  mark("read");

  const issues: InputIssue[] = [...pr.issues, ...sr.issues];
  if (!pr.table || !sr.table || hasErrors(issues)) return { exitCode: 2, issues, timings, cpuTimings };

  const pc = crsFor(o.plantedCrs, pr, o.planted, "--planted-crs");
  const sc = crsFor(o.surveyCrs, sr, o.survey, "--survey-crs");
  for (const c of [pc, sc]) if (c.issue) issues.push(c.issue);
  if (!pc.crs || !sc.crs) return { exitCode: 2, issues, timings, cpuTimings };

  if (o.groupBy.includes("day") && !o.timeZone) {
    issues.push({
      severity: "error",
      code: "audit-refused",
      file: o.planted,
      message: 'audit: grouping by "day" needs the field\'s time zone',
    });
    return { exitCode: 2, issues, timings, cpuTimings };
  }
  const settings: AuditSettings = {
    match: o.match,
    maxDistanceM: o.maxDistanceM,
    rowBearingDeg: o.rowBearing ?? null,
    timeZone: auditTimeZone(o.timeZone, null),
    workCrs: o.workCrs,
  };
  let stage = "validate";
  let audit: AuditRun;
  try {
    audit = runAudit({
      planted: { table: pr.table, crs: pc.crs, columns: pr.columns },
      survey: { table: sr.table, crs: sc.crs, columns: sr.columns },
      settings,
      profile: o.profile,
      groupBy: o.groupBy,
      onStage: (s) => {
        mark(stage);
        stage = s;
      },
    });
  } catch (e) {
    // The statistics refuse options the data cannot satisfy (e.g. grouping by a column neither file has).
    mark(stage);
    issues.push({ severity: "error", code: "audit-refused", file: o.planted, message: (e as Error).message });
    return { exitCode: 2, issues, timings, cpuTimings };
  }
  mark(stage);
  issues.push(...audit.issues);
  if (!audit.ok) return { exitCode: 2, issues, timings, cpuTimings };
  const { summary } = audit.result;

  if (o.out) {
    const out = createWriteStream(o.out);
    for (const chunk of auditReportChunks(audit).residuals) {
      if (!out.write(chunk)) await once(out, "drain");
    }
    out.end();
    await once(out, "finish");
    mark("write-csv");
  }
  timings.total = performance.now() - t0;
  const cEnd = process.cpuUsage();
  cpuTimings.total = (cEnd.user - c0.user + cEnd.system - c0.system) / 1000;

  const run: RunInfo = {
    planted: { file: o.planted, rows: pr.table.length, crs: resolveCrs(pc.crs).code, columns: pr.columns.columns },
    survey: { file: o.survey, rows: sr.table.length, crs: resolveCrs(sc.crs).code, columns: sr.columns.columns },
    workCrs: audit.settings.workCrs,
    match: o.match,
    maxDistanceM: o.maxDistanceM,
    rowBearing: audit.rowBearing,
    profile: o.profile,
    warnings: issues.filter((i) => i.severity === "warning"),
  };
  return { exitCode: 0, issues, report: { ...summary, verdict: audit.verdict, run }, timings, cpuTimings };
}
