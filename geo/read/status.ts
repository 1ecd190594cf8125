/**
 * The optional status column of a survey file: whether the surveyor measured a point, or recorded a planned point as
 * dead or not found without measuring it. Our own words (documented in the README, "Survey files: the status column").
 */

/** Statuses that mean "planned, recorded missing": the row is a report, not a survey point. */
export const RECORDED_MISSING_STATUSES = ["dead", "not found"] as const;
export type RecordedMissingStatus = (typeof RECORDED_MISSING_STATUSES)[number];

/** A row of a survey file that records a planned point as missing (no measured position used). */
export interface RecordedMissing {
  /** 1-based line (CSV, header = 1) or feature number (GeoJSON). */
  line: number;
  /** The point name or plant id written in the row's id column. */
  id: string;
  status: RecordedMissingStatus;
}

/** Accepted spellings after normalising (lower case; spaces, underscores and hyphens removed). */
const MEASURED = new Set(["", "surveyed", "measured", "found", "ok"]);
const SPELLINGS: Record<string, RecordedMissingStatus> = {
  dead: "dead",
  notfound: "not found",
  missing: "not found",
};

/** The values a status cell may hold, in words for messages. */
export const STATUS_VALUES_TEXT =
  'empty, "surveyed" (or "measured", "found", "ok") for a measured point, "dead", or "not found" (or "missing")';

/**
 * Reads one status cell: "measured" when blank or a measured word, a recorded-missing status, or null when the value is
 * not one the reader knows. Case, spaces, underscores and hyphens do not matter.
 *
 * @example statusOf(" Not_Found ") // "not found"
 * @example statusOf("") // "measured"
 * @example statusOf("broken") // null
 */
export function statusOf(cell: string): RecordedMissingStatus | "measured" | null {
  const k = cell.toLowerCase().replace(/[\s_-]+/g, "");
  if (MEASURED.has(k)) return "measured";
  return SPELLINGS[k] ?? null;
}
