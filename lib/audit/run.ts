/**
 * The audit engine's one entry: two point tables as read, the audit settings and a tolerance profile
 * in; projected and paired tables, statistics, verdict and reports out. The command line, the web
 * app's audit worker and re-verification of a signed audit all run audits through `runAudit`.
 * Pure: no I/O, no clock; stages are reported through a callback so a caller can time them.
 */
import {
  prepareAudit,
  type FileInput,
  type InputIssue,
  type Pairing,
  type PointTable,
  type ProjectedTable,
} from "@/geo";
import { computeAudit } from "./index";
import type { GroupName } from "./options";
import type { ToleranceProfile } from "./profile";
import { residualsCsv, summaryCsv, unpairedCsv } from "./residuals-csv";
import type { AuditSettings } from "./settings";
import type { AuditResult } from "./types";
import { evaluateVerdict, type Verdict } from "./verdict";

/** Breakdowns an audit computes when the caller names none, each when the files have what it needs. */
export const DEFAULT_GROUP_BY = ["arm", "crop", "bed", "fix", "day"] as const satisfies readonly GroupName[];

/**
 * The breakdowns of {@link DEFAULT_GROUP_BY} these tables can give: an attribute column in either
 * file; planting times for "day".
 *
 * @example availableGroups(planted, survey) // ["arm", "bed", "day"]
 */
export function availableGroups(planted: PointTable, survey: PointTable): (typeof DEFAULT_GROUP_BY)[number][] {
  return DEFAULT_GROUP_BY.filter((g) =>
    g === "day" ? planted.time !== null : !!(planted.attrs[g] ?? survey.attrs[g]),
  );
}

/** Stages reported while running, in order. */
export type AuditStage = "validate" | "project" | "check-files" | "pair" | "row-bearing" | "statistics";

/** Input of {@link runAudit}. */
export interface AuditRunInput {
  /** As-planted records as read, with the CRS of their coordinates. */
  planted: FileInput;
  /** Survey points as read, with the CRS of their coordinates. */
  survey: FileInput;
  settings: AuditSettings;
  /** The profile the verdict is judged against; its limits and confidence feed the statistics. Null: no verdict. */
  profile: ToleranceProfile | null;
  /** Breakdowns to compute; default {@link availableGroups}. */
  groupBy?: readonly GroupName[];
  /** Called when each stage starts. */
  onStage?: (stage: AuditStage) => void;
}

/** How the row bearing of a run was obtained. */
export interface RunRowBearing {
  /** Degrees clockwise from grid north, [0, 180); null when none could be had. */
  deg: number | null;
  source: "given" | "derived" | "none";
  /** "given", or the derivation method of deriveRowBearing. */
  method: string;
  /** Linearity of the derivation (0–1); null when given or not derivable. */
  linearity: number | null;
}

/** A computed audit. */
export interface AuditRunOk {
  ok: true;
  /** Warnings about the input. */
  issues: InputIssue[];
  planted: ProjectedTable;
  survey: ProjectedTable;
  pairing: Pairing;
  rowBearing: RunRowBearing;
  result: AuditResult;
  /** Null without a profile. */
  verdict: Verdict | null;
  /** The settings as used: the work CRS resolved to its code, the row bearing given or derived. */
  settings: AuditSettings;
}

/** An audit the inputs do not allow (the issues say why), or a computed one. */
export type AuditRun = { ok: false; issues: InputIssue[] } | AuditRunOk;

/**
 * Runs one audit: prepare (validate, project, check the files against each other, pair, row bearing;
 * see `prepareAudit`), statistics (`computeAudit`) with the profile's limits and confidence — the
 * cross-row and along-row limits only when there is a row bearing — and the verdict
 * (`evaluateVerdict`) when a profile is given. Inputs are not changed.
 *
 * Throws `audit: ...` when the statistics refuse their options (e.g. grouping by a column neither
 * file has, or by day without a time zone).
 *
 * @example
 * const run = runAudit({ planted: { table: p, crs: "EPSG:4326" }, survey: { table: s, crs: "EPSG:32632" }, settings, profile });
 * if (run.ok) run.verdict?.passed;
 */
export function runAudit(input: AuditRunInput): AuditRun {
  const { settings, profile } = input;
  const onStage = input.onStage ?? (() => {});
  const prepared = prepareAudit(input.planted, input.survey, {
    workCrs: settings.workCrs,
    match: settings.match,
    maxDistanceM: settings.maxDistanceM,
    rowBearingDeg: settings.rowBearingDeg ?? undefined,
    onStage: (s) => {
      if (s !== "done") onStage(s);
    },
  });
  if (!prepared.ok) return { ok: false, issues: prepared.issues };
  onStage("statistics");

  const rb = prepared.rowBearing;
  const bearing = Number.isFinite(rb.bearingDeg) ? rb.bearingDeg : undefined;
  const hasBearing = bearing !== undefined;
  const source = hasBearing ? (rb.given ? "given" : "derived") : "none";
  const result = computeAudit({
    planted: prepared.planted,
    survey: prepared.survey,
    pairing: prepared.pairing,
    options: {
      toleranceRadial: profile?.radialM ?? undefined,
      toleranceCross: hasBearing ? (profile?.crossM ?? undefined) : undefined,
      toleranceAlong: hasBearing ? (profile?.alongM ?? undefined) : undefined,
      confidence: profile?.confidence,
      rowBearingDeg: bearing,
      rowBearingSource: source,
      groupBy: [...(input.groupBy ?? availableGroups(input.planted.table, input.survey.table))],
      timeZone: settings.timeZone,
    },
  });

  let verdict: Verdict | null = null;
  if (profile) {
    const r = result.residuals;
    const wt = result.summary.withinTolerance;
    verdict = evaluateVerdict(profile, {
      pairs: result.summary.pairs,
      radial: r.radial,
      cross: r.cross,
      along: r.along,
      within: wt ? { n: wt.n, within: wt.within } : null,
    });
  }
  return {
    ok: true,
    issues: prepared.issues,
    planted: prepared.planted,
    survey: prepared.survey,
    pairing: prepared.pairing,
    rowBearing: {
      deg: bearing ?? null,
      source,
      method: rb.given ? "given" : rb.method,
      linearity: Number.isFinite(rb.linearity) ? rb.linearity : null,
    },
    result,
    verdict,
    settings: { ...settings, workCrs: prepared.workCrs.code, rowBearingDeg: bearing ?? null },
  };
}

/** The three reports of an audit. */
export type AuditReportKind = "residuals" | "unpaired" | "summary";

/**
 * The three CSV reports of a computed audit as chunks of text, produced lazily (a caller may stream
 * the per-plant residuals of a million pairs without holding them as one string).
 *
 * @example for (const chunk of auditReportChunks(run).residuals) out.write(chunk);
 */
export function auditReportChunks(run: AuditRunOk): Record<AuditReportKind, Iterable<string>> {
  const { result, planted, survey, pairing } = run;
  return {
    residuals: { [Symbol.iterator]: () => residualsCsv({ planted, survey, residuals: result.residuals }) },
    unpaired: { [Symbol.iterator]: () => unpairedCsv({ planted, survey, pairing }) },
    summary: { [Symbol.iterator]: () => summaryCsv(result.summary) },
  };
}

/**
 * The three CSV reports of a computed audit as UTF-8 bytes, as the web app stores them and as
 * sign-off hashes them.
 *
 * @example auditReports(run).map((r) => r.kind) // ["residuals", "unpaired", "summary"]
 */
export function auditReports(run: AuditRunOk): { kind: AuditReportKind; bytes: Uint8Array }[] {
  const chunks = auditReportChunks(run);
  const encoder = new TextEncoder();
  return (["residuals", "unpaired", "summary"] as const).map((kind) => ({
    kind,
    bytes: encoder.encode([...chunks[kind]].join("")),
  }));
}
