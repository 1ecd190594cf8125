/**
 * Diagnostics of one audit: why the records are off and where. Pure: stored per-plant rows (and the as-planted
 * records for exact plant ranges) in, plain objects out. Computed on read, so nothing of a signed audit changes.
 */
export { diagnoseAudit, type AuditDiagnostics, type DiagnosticsHeadline } from "./diagnose";
export type { DiagnosticPair } from "./types";
export type { ArmDiagnostics } from "./arm-offsets";
export type { Episode, EpisodePart, PassPoint, PlantedTrack } from "./episodes";
export type { ClearanceMode, ClearanceResult } from "./clearance";
export type { DiagnosticsComparison } from "./compare";
export { compareDiagnostics } from "./compare";
export { trackFromTable } from "./episodes";
export { clearanceShare, DEFAULT_CLEARANCES_M } from "./clearance";
export { diagnosticsCsv, DIAGNOSTICS_CSV_COLUMNS } from "./csv";
