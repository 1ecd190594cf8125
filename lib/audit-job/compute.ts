/**
 * One audit from two point tables, as the web app runs it: prepare (project, check, pair),
 * statistics, verdict, CSV reports and the rows stored per plant. No database and no framework, so
 * it runs on a worker thread (audit-worker.ts) and in re-computation (lib/server/review).
 */
import { prepareAudit, type PointTable } from "@/geo";
import { computeAudit, residualsCsv, summaryCsv, unpairedCsv } from "@/lib/audit";
import { evaluateVerdict } from "@/lib/audit/verdict";
import type { AuditSettingsDto, ProfileSnapshot } from "@/lib/api-types";

/** Breakdowns an audit computes, each when the files have what it needs. */
export const GROUP_BY = ["arm", "crop", "bed", "fix", "day"] as const;

/** The breakdowns of GROUP_BY these tables can give: an attribute column in either file; planting times for "day". */
export function availableGroups(planted: PointTable, survey: PointTable): (typeof GROUP_BY)[number][] {
  return GROUP_BY.filter((g) => (g === "day" ? planted.time !== null : !!(planted.attrs[g] ?? survey.attrs[g])));
}

/** Stages reported while computing, in order. */
export type ComputeStage = "validate" | "project" | "check-files" | "pair" | "row-bearing" | "statistics";

/** The engine run shared with the command line: prepare (project, check, pair), statistics, verdict. */
export function computeFromTables(
  planted: PointTable,
  plantedCrs: string,
  survey: PointTable,
  surveyCrs: string,
  settings: AuditSettingsDto,
  profile: ProfileSnapshot,
  onStage: (stage: ComputeStage) => void = () => {},
) {
  const prepared = prepareAudit(
    { table: planted, crs: plantedCrs },
    { table: survey, crs: surveyCrs },
    {
      workCrs: settings.workCrs,
      match: settings.match,
      maxDistance: settings.maxDistanceM,
      rowBearingDeg: settings.rowBearingDeg ?? undefined,
      onStage: (s) => {
        if (s !== "done") onStage(s);
      },
    },
  );
  if (!prepared.ok) return { ok: false as const, issues: prepared.issues };
  onStage("statistics");
  const bearing = Number.isFinite(prepared.rowBearing.bearingDeg) ? prepared.rowBearing.bearingDeg : undefined;
  const hasBearing = bearing !== undefined;
  const result = computeAudit({
    planted: prepared.planted,
    survey: prepared.survey,
    pairing: prepared.pairing,
    options: {
      toleranceRadial: profile.radialM ?? undefined,
      toleranceCross: hasBearing ? (profile.crossM ?? undefined) : undefined,
      toleranceAlong: hasBearing ? (profile.alongM ?? undefined) : undefined,
      confidence: profile.confidence,
      rowBearingDeg: bearing,
      rowBearingSource: hasBearing ? (prepared.rowBearing.given ? "given" : "derived") : "none",
      groupBy: availableGroups(planted, survey),
      timeZone: settings.timeZone,
    },
  });
  const r = result.residuals;
  const wt = result.summary.withinTolerance;
  const verdict = evaluateVerdict(profile, {
    pairs: result.summary.pairs,
    radial: r.radial,
    cross: r.cross,
    along: r.along,
    within: wt && wt.share !== null && wt.lower95 !== null ? { share: wt.share, lower95: wt.lower95 } : null,
  });
  return {
    ok: true as const,
    result,
    verdict,
    pairing: prepared.pairing,
    plantedP: prepared.planted,
    surveyP: prepared.survey,
    issues: prepared.issues,
    settings: { ...settings, workCrs: prepared.workCrs.code, rowBearingDeg: bearing ?? null },
  };
}

export type ComputeOutcome = ReturnType<typeof computeFromTables>;
type Computed = Extract<ComputeOutcome, { ok: true }>;

/** The three CSV reports of a computed audit, as stored and as hashed for sign-off. */
export function auditReports(o: Computed): { kind: "residuals" | "unpaired" | "summary"; bytes: Uint8Array }[] {
  const { result, plantedP, surveyP, pairing } = o;
  return [
    {
      kind: "residuals",
      bytes: joinChunks(residualsCsv({ planted: plantedP, survey: surveyP, residuals: result.residuals })),
    },
    { kind: "unpaired", bytes: joinChunks(unpairedCsv({ planted: plantedP, survey: surveyP, pairing })) },
    { kind: "summary", bytes: joinChunks(summaryCsv(result.summary)) },
  ];
}

function joinChunks(chunks: Iterable<string>): Uint8Array {
  return new TextEncoder().encode([...chunks].join(""));
}
