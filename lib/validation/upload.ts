import { z } from "zod";
import { COLUMN_ROLES } from "@/geo";
import { FieldworkField } from "./plan";

export const MAX_UPLOAD_BYTES = 300 * 1024 * 1024;

// Per role: a header name, or null for "not in this file" (no column is read for it); absent = guessed.
const roleShape = Object.fromEntries(COLUMN_ROLES.map((r) => [r, z.string().min(1).nullable().optional()])) as Record<
  (typeof COLUMN_ROLES)[number],
  z.ZodOptional<z.ZodNullable<z.ZodString>>
>;

export const ColumnMappingSchema = z
  .object({ ...roleShape, coordinates: z.enum(["geographic", "projected"]).optional() })
  .strict();

/** The non-file fields of an upload (multipart form). */
export const UploadFields = z.object({
  kind: z.enum(["planted", "survey"], { message: 'kind must be "planted" (as-planted records) or "survey"' }),
  crs: z.string().trim().min(1).optional(),
  mapping: z
    .string()
    .optional()
    .transform((s, ctx) => {
      if (!s) return undefined;
      try {
        return ColumnMappingSchema.parse(JSON.parse(s));
      } catch (e) {
        ctx.addIssue({
          code: "custom",
          message: `mapping must be a JSON object of column roles to header names, or to null for a role not in this file (${(e as Error).message.slice(0, 200)})`,
        });
        return z.NEVER;
      }
    }),
  acceptWarnings: z
    .enum(["true", "false"])
    .optional()
    .transform((v) => v === "true"),
  presetName: z.string().trim().min(1).max(80).optional(),
  /** A survey's fieldwork as JSON (lib/validation/plan.ts FieldworkInput). */
  fieldwork: FieldworkField,
  // Machines (issue 13): the machine that recorded an as-planted file; empty = not named.
  machineId: z.preprocess(
    (v) => (v === "" ? undefined : v),
    z.uuid({ message: "machineId must be the id of one of your machines" }).optional(),
  ),
});
