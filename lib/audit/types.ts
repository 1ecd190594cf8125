/**
 * Shapes of the audit output. Every key is documented with its unit here and in SUMMARY.md.
 * Errors are SURVEY minus PLANTED, metres, in the work CRS (easting/northing).
 */
import type { GroupRow } from "./groups";
import type { NssdaCase } from "./nssda";
import type { Interval } from "./intervals";
import type { GroupName } from "./options";
import type { WithinTolerance } from "./tolerance";

export type { GroupRow } from "./groups";
export type { NssdaCase } from "./nssda";
export type { Interval } from "./intervals";
export type { ToleranceLimits, WithinTolerance } from "./tolerance";

/** Headline accuracy statistics of one set of pairs (used for the corrected and the raw positions). */
export interface HeadlineStats {
  /** Number of pairs the statistics are computed from. */
  pairs: number;
  /** Mean dE (bias east), m. */
  meanDE: number | null;
  /** Mean dN (bias north), m. */
  meanDN: number | null;
  /** t-based interval of meanDE at `confidence`, m; null for fewer than 2 pairs. */
  meanDECi: Interval | null;
  /** t-based interval of meanDN at `confidence`, m; null for fewer than 2 pairs. */
  meanDNCi: Interval | null;
  /** Sample SD of dE (n − 1), m; null for fewer than 2 pairs. */
  sdDE: number | null;
  /** Sample SD of dN (n − 1), m; null for fewer than 2 pairs. */
  sdDN: number | null;
  /** RMSE of dE, m. */
  rmseE: number | null;
  /** RMSE of dN, m. */
  rmseN: number | null;
  /** sqrt(rmseE² + rmseN²), m. */
  rmseR: number | null;
  /** Empirical 50th percentile of radial errors (Hyndman–Fan type 7), m. */
  cep50: number | null;
  /** Empirical 95th percentile of radial errors (Hyndman–Fan type 7), m. */
  r95: number | null;
  /** Circular-normal model CEP = 1.177410·σ_c, σ_c = rmseR/√2, m. */
  cep50Model: number | null;
  /** Circular-normal model R95 = 2.447747·σ_c, m. */
  r95Model: number | null;
  /** NSSDA horizontal accuracy at 95 % (or the empirical r95 when the standard's formula does not apply), m. */
  nssda95: number | null;
  /** Which NSSDA formula was used. */
  nssdaCase: NssdaCase | null;
  /** The standard's condition, in words, and what was done. */
  nssdaNote: string | null;
  /** Mean along-row error, m (positive = in the row direction); null without a row bearing. */
  meanAlong: number | null;
  /** Mean cross-row error, m (positive = right of the row direction); null without a row bearing. */
  meanCross: number | null;
  /** RMSE of along-row errors, m. */
  rmseAlong: number | null;
  /** RMSE of cross-row errors, m. */
  rmseCross: number | null;
  /** Sample SD (n − 1) of along-row errors, m. */
  sdAlong: number | null;
  /** Sample SD (n − 1) of cross-row errors, m. */
  sdCross: number | null;
  /** Share within tolerance with a Clopper–Pearson interval; null when no tolerance was given. */
  withinTolerance: WithinTolerance | null;
}

/** Outlier rule outcome (rule "median-mad-2d", see outliers.ts). */
export interface OutlierSummary {
  rule: "median-mad-2d";
  /** Multiplier of the scaled MAD. */
  k: number;
  /** Floor of the threshold, m. */
  minThreshold: number;
  /** Number of pairs flagged. */
  count: number;
  /** Threshold on the distance from (centreDE, centreDN), m; null without pairs. */
  threshold: number | null;
  /** Median dE, m; null without pairs. */
  centreDE: number | null;
  /** Median dN, m; null without pairs. */
  centreDN: number | null;
}

/** Statistics with outliers excluded. */
export interface WithoutOutliers {
  /** Pairs left after excluding outliers. */
  pairs: number;
  meanDE: number | null;
  meanDN: number | null;
  rmseE: number | null;
  rmseN: number | null;
  rmseR: number | null;
  cep50: number | null;
  r95: number | null;
}

/** 2D similarity (Helmert) fit planted → survey (EPSG method 9621 form). */
export interface HelmertSummary {
  /** Scale factor M, unitless. */
  scale: number;
  /** Rotation θ, arc-seconds (EPSG 9621 sign). */
  rotationArcsec: number;
  /** Shift X0 of the un-centred formula, m. */
  tE: number;
  /** Shift Y0 of the un-centred formula, m. */
  tN: number;
  /** Radial RMS of the fit residuals, m. */
  rmse: number;
  /** Largest radial residual, m. */
  residualMax: number;
  /** Pairs used. */
  pairs: number;
}

/** Statistics of the raw GNSS positions (before camera correction) against the survey. */
export interface RawSummary extends HeadlineStats {
  /** Paired plants without a finite raw position (left out of `raw`). */
  missingRaw: number;
}

/** Stable codes of the notes (see SUMMARY.md). */
export type AuditNoteCode =
  | "no-pairs"
  | "single-pair"
  | "few-checkpoints"
  | "nssda-not-applicable"
  | "beyond-max-distance"
  | "outliers"
  | "raw-partial";

/** A machine-readable note about the result. */
export interface AuditNote {
  code: AuditNoteCode;
  message: string;
}

/** The audit summary: stable keys, documented in SUMMARY.md. */
export interface AuditSummary extends HeadlineStats {
  /** The engine's rule version (lib/audit/engine-version.ts); absent in summaries written before it was kept (= 1). */
  engineVersion?: number;
  /** "no-pairs" when nothing could be paired (all statistics null), else "ok". */
  status: "ok" | "no-pairs";
  /** Work CRS of both tables (e.g. "EPSG:32631"). */
  crs: string;
  /** Confidence level of all intervals. */
  confidence: number;
  /** Planted rows with no surveyed partner. */
  unmatchedPlanted: number;
  /** Survey rows with no planted partner. */
  unmatchedSurvey: number;
  /** Survey rows left unpaired because two planted candidates were almost equally near. */
  ambiguousSurvey: number;
  /** Pairs formed by id that lie beyond the maximum pairing distance (included in the statistics). */
  pairedBeyondMaxDistance: number;
  /** Pairs formed by plant id. */
  pairedById: number;
  /** Pairs formed by position. */
  pairedByPosition: number;
  /** Row bearing used, degrees clockwise from grid north, normalised to [0, 360); null when none. */
  rowBearingDeg: number | null;
  rowBearingSource: "given" | "derived" | "none";
  outliers: OutlierSummary;
  withoutOutliers: WithoutOutliers | null;
  helmert: HelmertSummary | null;
  /** Breakdowns, one array per requested grouping. */
  groups: Partial<Record<GroupName, GroupRow[]>>;
  /** Raw GNSS statistics; null when the planted table has no raw position for any paired plant. */
  raw: RawSummary | null;
  notes: AuditNote[];
}

/** Per-pair residuals in columns (index i = pair i, in pairing order). Metres. */
export interface AuditResiduals {
  plantedIndex: Int32Array;
  surveyIndex: Int32Array;
  /** PAIRED_BY_ID (0) or PAIRED_BY_POSITION (1). */
  method: Uint8Array;
  /** 1 when paired by id beyond the maximum pairing distance. */
  beyondMaxDistance: Uint8Array;
  dE: Float64Array;
  dN: Float64Array;
  /** Along-row error; null without a row bearing. */
  along: Float64Array | null;
  /** Cross-row error (positive right of the row direction); null without a row bearing. */
  cross: Float64Array | null;
  radial: Float64Array;
  /** 1 = within every given tolerance; null when no tolerance was given. */
  withinTolerance: Uint8Array | null;
  /** 1 = flagged by the outlier rule. */
  outlier: Uint8Array;
  /** Raw GNSS error east (survey − raw), NaN where missing; null when the planted table has no raw columns. */
  rawDE: Float64Array | null;
  /** Raw GNSS error north, NaN where missing; null when the planted table has no raw columns. */
  rawDN: Float64Array | null;
}

/** Everything computeAudit returns. */
export interface AuditResult {
  summary: AuditSummary;
  residuals: AuditResiduals;
}
