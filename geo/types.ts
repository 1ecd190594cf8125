/**
 * Shared shapes of the audit core. Columnar (typed arrays, one index per file row) so a
 * million-plant field needs no per-row objects on the hot path.
 *
 * Contract between `geo/` (reading, projection, pairing) and `lib/audit/` (statistics, reports).
 */
import type { IdColumn } from "./ids";

/** Which of the two input files a table came from. */
export type FileRole = "planted" | "survey";

/** Optional text attributes a record or survey point may carry; usable for grouping. */
export const ATTRIBUTE_NAMES = ["crop", "bed", "row", "cell", "arm", "fix", "method"] as const;
export type AttributeName = (typeof ATTRIBUTE_NAMES)[number];

/**
 * A low-cardinality text column stored as dictionary codes.
 * `codes[i]` indexes `values`; -1 means the cell was empty.
 */
export interface CodedColumn {
  codes: Int32Array;
  values: string[];
}

/** Points as read from one file, still in that file's CRS. */
export interface PointTable {
  /** File name used in messages, e.g. "planted.csv". */
  source: string;
  role: FileRole;
  length: number;
  /** Longitude / easting in the source CRS (degrees or metres). */
  x: Float64Array;
  /** Latitude / northing in the source CRS (degrees or metres). */
  y: Float64Array;
  /** 1-based line in the file for CSV (header = line 1), 1-based feature number for GeoJSON. */
  line: Int32Array;
  /** Plant id per row ("" = none), or null when the file has no id column. */
  id: IdColumn | null;
  /** Optional text attributes present in the file. */
  attrs: Partial<Record<AttributeName, CodedColumn>>;
  /** Planting (records) or observation (survey) time, epoch milliseconds UTC; NaN when missing. */
  time: Float64Array | null;
  /** Horizontal dilution of precision from the GNSS receiver; NaN when missing. */
  hdop: Float64Array | null;
  /** Stated horizontal precision of a survey point, metres; NaN when missing. */
  precision: Float64Array | null;
  /** Raw GNSS position before camera correction (same CRS as x/y); NaN when missing. */
  rawX: Float64Array | null;
  rawY: Float64Array | null;
}

/** A table after projection: `x`/`y` (and `rawX`/`rawY`) are easting/northing in metres in the work CRS. */
export type ProjectedTable = PointTable & { crs: string };

/** How one pair was formed. */
export const PAIRED_BY_ID = 0;
export const PAIRED_BY_POSITION = 1;

/** Output of pairing: parallel arrays, one entry per pair, sorted by planted index. */
export interface Pairing {
  plantedIndex: Int32Array;
  surveyIndex: Int32Array;
  /** PAIRED_BY_ID or PAIRED_BY_POSITION. */
  method: Uint8Array;
  /** 1 when paired by id but farther apart than the maximum pairing distance (a gross error to show). */
  beyondMaxDistance: Uint8Array;
  /** Planted rows with no surveyed partner (missing plant, or not surveyed). */
  unmatchedPlanted: Int32Array;
  /** Survey rows with no planted partner (weed, volunteer, unrecorded plant). */
  unmatchedSurvey: Int32Array;
  /** Survey rows left unpaired because two planted candidates were almost equally near. */
  ambiguousSurvey: Int32Array;
}

/** One problem found in an input file. `line`/`column` point at the cell when known. */
export interface InputIssue {
  severity: "error" | "warning";
  /** Stable machine code, e.g. "coordinate-not-numeric". */
  code: string;
  file: string;
  line?: number;
  column?: string;
  value?: string;
  /** What was expected, in plain words. */
  message: string;
}
