import { z } from "zod";
import {
  DEFAULT_MAX_PAIR_DISTANCE_M,
  MATCH_MODES,
  maxDistanceMSchema,
  rowBearingDegSchema,
} from "@/lib/audit/settings";
import { SHEET_SEPARATORS, SHEET_UNITS } from "@/lib/audit/spreadsheet-csv";
import { RecordId } from "./ids";

/** Body of POST /api/audits. Lengths in metres. */
export const AuditCreateInput = z.object({
  fieldId: RecordId,
  plantedDatasetId: RecordId,
  surveyDatasetId: RecordId,
  profileId: RecordId,
  title: z.string().trim().min(1).max(120).optional(),
  match: z.enum(MATCH_MODES).default("auto"),
  maxDistanceM: maxDistanceMSchema.default(DEFAULT_MAX_PAIR_DISTANCE_M),
  rowBearingDeg: rowBearingDegSchema.optional(),
});
export type AuditCreateInput = z.infer<typeof AuditCreateInput>;

/** The residual columns a page of residuals can be sorted by: the one list for the API, the table and the query. */
export const RESIDUAL_SORTS = ["seq", "plantId", "radial", "dE", "dN", "along", "cross", "bed", "arm"] as const;
export type ResidualSort = (typeof RESIDUAL_SORTS)[number];

export const ResidualQuerySchema = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(50),
  sort: z.enum(RESIDUAL_SORTS).default("seq"),
  dir: z.enum(["asc", "desc"]).default("asc"),
  only: z.enum(["out", "outliers"]).optional(),
  arm: z.string().max(80).optional(),
  crop: z.string().max(80).optional(),
  bed: z.string().max(80).optional(),
  fix: z.string().max(80).optional(),
  day: z.string().max(20).optional(),
  q: z.string().max(80).optional(),
});
export type ResidualQueryInput = z.infer<typeof ResidualQuerySchema>;

export const UnpairedQuerySchema = z.object({
  kind: z.enum(["planted-not-found", "surveyed-not-planted", "ambiguous"]).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(500).default(50),
});

/**
 * Query of GET /api/audits/:id/residuals.csv and summary.csv. Neither parameter: the report exactly as the engine
 * wrote it (the bytes hashed at sign-off). Either one: a spreadsheet variant made from the stored rows, errors in
 * `units` (default mm), cells separated by `sep` (default comma; "semicolon" also writes decimal commas).
 */
export const ReportFormatQuery = z.object({
  units: z.enum(SHEET_UNITS).optional(),
  sep: z.enum(SHEET_SEPARATORS).optional(),
});
export type ReportFormatQuery = z.infer<typeof ReportFormatQuery>;

/**
 * Query of the trust by cause and the exclusion list: `profile` judges the records for another tolerance profile of
 * the organisation (default: the audit's own); `include=not-shown` adds the records not yet shown to the list;
 * `marks=1` adds the positions of the records not relied on or not yet shown (map overlay).
 */
export const RecordTrustQuery = z.object({
  // A form's "the audit's own profile" choice sends an empty value.
  profile: z.preprocess(
    (v) => (v === "" ? undefined : v),
    z.uuid({ message: "must be the id of a tolerance profile" }).optional(),
  ),
  include: z.enum(["not-shown"]).optional(),
  marks: z.enum(["1"]).optional(),
});
export type RecordTrustQuery = z.infer<typeof RecordTrustQuery>;
