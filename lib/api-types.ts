/**
 * Shapes of the JSON API's answers (the contract between route handlers and the client).
 * Lengths in metres, times ISO 8601 UTC.
 */
import type { ColumnGuess, ColumnMapping, InputIssue } from "@/geo";
import type { AuditSummary } from "@/lib/audit/types";
import type { ToleranceProfile } from "@/lib/audit/profile";
import type { AuditSettings } from "@/lib/audit/settings";
import type { Verdict } from "@/lib/audit/verdict";
import type { Role } from "@/lib/roles";
import type { ApiKeyScope } from "@/lib/security/key-scope";

export type { Verdict, Criterion } from "@/lib/audit/verdict";
export type { AuditSummary } from "@/lib/audit/types";
export type { InputIssue, ColumnGuess, ColumnMapping };

export interface FieldDto {
  id: string;
  name: string;
  farm: string;
  crs: string;
  timeZone: string;
  rowBearingDeg: number | null;
  bedSpacingM: number | null;
  rowsPerBed: number | null;
  rowSpacingM: number | null;
  /** GeoJSON Polygon in WGS 84 (lon, lat), or null. */
  boundary: GeoJSON.Polygon | null;
  createdAt: string;
}

export interface DatasetDto {
  id: string;
  fieldId: string;
  kind: "planted" | "survey";
  fileName: string;
  format: "csv" | "geojson";
  sha256: string;
  sizeBytes: number;
  rowCount: number;
  crs: string;
  mapping: ColumnMapping | null;
  acceptedWarnings: InputIssue[] | null;
  uploadedBy: string | null;
  uploadedAt: string;
  /** True when an audit uses it (it can no longer be deleted). */
  inUse: boolean;
}

/** GET /api/fields/:id/derived — suggestions from the latest as-planted dataset. */
export interface FieldDerivedDto {
  datasetId: string | null;
  rowBearingDeg: number | null;
  /** Boundary of the records (turf concave hull, else convex), WGS 84. */
  boundary: GeoJSON.Polygon | null;
  /** UTM zone of the records' centre, e.g. "EPSG:32631". */
  suggestedCrs: string | null;
}

export interface CrsDto {
  code: string;
  name: string;
  kind: "geographic" | "projected";
}

export interface PresetDto {
  id: string;
  name: string;
  kind: "planted" | "survey";
  crs: string | null;
  mapping: ColumnMapping;
  createdAt: string;
}

/** 201 of POST /api/fields/:id/datasets. */
export interface UploadOkDto {
  dataset: DatasetDto;
  warnings: InputIssue[];
  columns: ColumnGuess;
  /** UTM zone of the file's centre, as a hint for the field's CRS. */
  suggestedCrs: string | null;
}

/** Lines of the NDJSON stream when the upload asks for `Accept: application/x-ndjson`. */
export type UploadStreamLine =
  | { type: "progress"; stage: "reading" | "checking" | "saving"; fraction: number }
  | {
      type: "done";
      status: number;
      body: UploadOkDto | { error: { code: string; message: string; issues?: InputIssue[] } };
    };

/** A stored tolerance profile: the engine's profile (lib/audit/profile.ts) with its bookkeeping. */
export interface ToleranceProfileDto extends ToleranceProfile {
  id: string;
  operation: string;
  builtIn: boolean;
  note: string | null;
  updatedAt: string;
}

/** The copy of a tolerance profile an audit keeps (`audit.profile_snapshot`): what it was computed with. */
export type ProfileSnapshot = Omit<ToleranceProfileDto, "updatedAt" | "builtIn" | "note">;

export type AuditState = "computing" | "computed" | "failed" | "submitted" | "signed_off" | "returned";

export type AuditSettingsDto = AuditSettings;

export interface AuditDto {
  id: string;
  title: string;
  state: AuditState;
  /** 1 for the first audit of a series, 2 for its first corrected revision, … */
  revision: number;
  progress: number;
  progressStage: string | null;
  error: string | null;
  field: { id: string; name: string; crs: string; timeZone: string };
  planted: { id: string; fileName: string; sha256: string; rowCount: number } | null;
  survey: { id: string; fileName: string; sha256: string; rowCount: number } | null;
  /** The machine the as-planted upload names (absent on DTOs made before machines). */
  machine?: { id: string; name: string } | null;
  profile: ProfileSnapshot | null;
  settings: AuditSettingsDto | null;
  summary: AuditSummary | null;
  verdict: Verdict | null;
  createdBy: string | null;
  createdAt: string;
  computedAt: string | null;
}

export interface AuditListItemDto {
  id: string;
  title: string;
  state: AuditState;
  /** Revision number within its series (1 for the first audit). */
  revision: number;
  /** Name of the tolerance profile this revision was computed against. */
  profileName: string | null;
  fieldId: string;
  fieldName: string;
  /** The field's IANA time zone, for showing times as the field's local time. */
  fieldTimeZone: string;
  rmseR: number | null;
  passed: boolean | null;
  updatedAt: string;
}

export interface ResidualRowDto {
  seq: number;
  plantId: string | null;
  surveyId: string | null;
  crop: string | null;
  bed: string | null;
  row: string | null;
  arm: string | null;
  fix: string | null;
  day: string | null;
  plantedE: number;
  plantedN: number;
  surveyE: number;
  surveyN: number;
  dE: number;
  dN: number;
  along: number | null;
  cross: number | null;
  radial: number;
  within: boolean | null;
  outlier: boolean;
  pairedBy: "id" | "position";
  beyondMaxDistance: boolean;
}

export interface Page<T> {
  rows: T[];
  total: number;
  page: number;
  pageSize: number;
}

export interface UnpairedRowDto {
  seq: number;
  kind: "planted-not-found" | "surveyed-not-planted" | "ambiguous";
  pointId: string | null;
  line: number;
  e: number;
  n: number;
  crop: string | null;
  bed: string | null;
  row: string | null;
}

/** GET /api/audits/:id/chart-data — every pair (or an even subsample above 20,000 pairs). */
export interface ChartDataDto {
  dE: number[];
  dN: number[];
  radial: number[];
  /** null entries where a pair has no cross-row value. */
  cross: (number | null)[] | null;
  within: (boolean | null)[];
  sampled: boolean;
  total: number;
}

export interface ApiKeyDto {
  id: string;
  name: string;
  prefix: string;
  createdBy: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  /** What the key may do within its creator's role. */
  scope: ApiKeyScope;
  /** From this instant on the key is refused; null when it does not expire. */
  expiresAt: string | null;
}

export interface MeDto {
  name: string;
  email: string;
  role: Role;
  organisation: string;
}
