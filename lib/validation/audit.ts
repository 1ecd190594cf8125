import { z } from "zod";
import { RecordId } from "./ids";

/** Body of POST /api/audits. Lengths in metres. */
export const AuditCreateInput = z.object({
  fieldId: RecordId,
  plantedDatasetId: RecordId,
  surveyDatasetId: RecordId,
  profileId: RecordId,
  title: z.string().trim().min(1).max(120).optional(),
  match: z.enum(["auto", "id", "nearest"]).default("auto"),
  maxDistanceM: z
    .number()
    .positive()
    .max(5, "Pairing by position farther than 5 m would pair unrelated plants.")
    .default(0.1),
  rowBearingDeg: z.number().min(0).max(360).nullable().optional(),
});
export type AuditCreateInput = z.infer<typeof AuditCreateInput>;

export const RESIDUAL_SORTS = ["seq", "plantId", "radial", "dE", "dN", "along", "cross", "bed", "arm"] as const;

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
