/**
 * Public API of the audit core's geometry part: reading point files, CRS registry and projection,
 * input validation, pairing and row bearing. Pure: no I/O, no clock, no environment.
 */
export * from "./types";
export { readPoints, formatFromName, type PointFileFormat } from "./read";
export { MAX_FIELD_CHARS, MAX_LINE_CHARS } from "./read/csv";
export { readCsv, detectDelimiter, type ReadOptions, type ReadResult } from "./read/csv";
export { readGeoJson } from "./read/geojson";
export { appendReadResults } from "./read/merge";
export { tallyIssues, addTallies, type Tally } from "./read/sink";
export {
  planColumns,
  normaliseHeader,
  COLUMN_ROLES,
  type ColumnGuess,
  type ColumnMapping,
  type ColumnRole,
  type CoordinateKind,
} from "./read/columns";
export {
  statusOf,
  RECORDED_MISSING_STATUSES,
  STATUS_VALUES_TEXT,
  type RecordedMissing,
  type RecordedMissingStatus,
} from "./read/status";
export { normaliseFix, parseNumber, TimeReader, type FixQuality } from "./read/values";
export type { TextInput } from "./read/text";
export {
  listCrs,
  findCrs,
  resolveCrs,
  utmFor,
  geographicOf,
  datumShiftBetween,
  containsLonLat,
  type CrsEntry,
  type LonLatBox,
} from "./crs/registry";
export {
  projectTable,
  convertArrays,
  convertPoint,
  toLonLat,
  resolveWorkCrs,
  centreLonLat,
  medianOf,
  type CrsLike,
} from "./project";
export { validateTable, type TableCheckOptions } from "./validate/table";
export { validateFiles, type FilesCheckOptions, type FileInCrs } from "./validate/files";
export {
  checkAgainstField,
  checkFileKind,
  lonLatBox,
  type FieldReference,
  type FieldFileCounts,
  type FieldFitOptions,
} from "./validate/field";
export { IssueCollector, formatIssue, hasErrors, DEFAULT_ISSUE_CAP } from "./validate/issues";
export { indexIds, findDuplicateIds, fnv1a, IdColumn, IdColumnBuilder, type IdIndex } from "./ids";
export {
  pairPoints,
  DEFAULT_MAX_PAIR_DISTANCE_M,
  type MatchMode,
  type PairInput,
  type PairOptions,
  type PairingNotes,
} from "./pair";
export { deriveRowBearing, type RowBearing } from "./row-bearing";
export { prepareAudit, type FileInput, type PrepareOptions, type Prepared } from "./prepare";
export { tableBuffers } from "./transfer";
