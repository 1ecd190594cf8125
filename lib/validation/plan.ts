import { z } from "zod";
import { MISSING_STATUSES } from "@/lib/plan/coverage";
import { MAX_ALLOWED_FAILURES, STANDARD_MINIMUMS } from "@/lib/plan/sample-size";
import { STRATUM_ATTRIBUTES } from "@/lib/plan/select";
import { RecordId } from "./ids";

const metres = (what: string, max: number) =>
  z
    .number({ message: `${what} must be a number of metres` })
    .min(0, `${what} cannot be negative`)
    .max(max, `${what} can be at most ${max} m`);

/** A new survey plan (POST /api/fields/:fieldId/plans). */
export const PlanInput = z.object({
  name: z.string().trim().min(1, "Give the plan a name.").max(80),
  plantedDatasetId: RecordId,
  profileId: RecordId,
  allowedFailures: z
    .number()
    .int("Failures allowed for must be a whole number.")
    .min(0)
    .max(MAX_ALLOWED_FAILURES, `At most ${MAX_ALLOWED_FAILURES} failures can be allowed for.`)
    .default(0),
  standards: z
    .array(z.enum(Object.keys(STANDARD_MINIMUMS) as [keyof typeof STANDARD_MINIMUMS]))
    .default(["nssda", "asprs2023"]),
  strataBy: z.array(z.enum(STRATUM_ATTRIBUTES)).max(STRATUM_ATTRIBUTES.length).default(["bed"]),
  minPerStratum: z.number().int().min(0).max(1000).default(3),
  sparesPerStratum: z.number().int().min(0).max(50).default(1),
  minSpacingM: metres("The minimum spacing", 100).default(1),
  bedEndM: metres("The bed-end margin", 500).default(0),
  rowBearingDeg: z.number().min(0).max(360).nullable().default(null),
  /** Seed of the selection; a new one is drawn when absent. */
  seed: z
    .number()
    .int()
    .min(0)
    .max(2 ** 32 - 1)
    .optional(),
});
export type PlanInput = z.infer<typeof PlanInput>;

/** A control mark (POST /api/fields/:fieldId/control-marks, PATCH /api/control-marks/:id). */
export const ControlMarkInput = z.object({
  name: z.string().trim().min(1, "Give the mark its name.").max(40),
  e: z.number({ message: "The known easting must be a number of metres." }).finite(),
  n: z.number({ message: "The known northing must be a number of metres." }).finite(),
  h: z.number().finite().nullable().default(null),
  description: z.string().trim().max(300).nullable().default(null),
  source: z.string().trim().max(200).nullable().default(null),
});
export type ControlMarkInput = z.infer<typeof ControlMarkInput>;

const measured = z.object({
  e: z.number({ message: "a measured easting (metres) is needed" }).finite(),
  n: z.number({ message: "a measured northing (metres) is needed" }).finite(),
  h: z.number().finite().nullable().default(null),
});

/**
 * What a survey upload records about its fieldwork (the `fieldwork` form part, JSON): the plan it was made from, the
 * control mark measured before and after, the instrument, surveyor and method. Every part is optional.
 */
export const FieldworkInput = z
  .object({
    planId: RecordId.nullable().default(null),
    controlMarkId: RecordId.nullable().default(null),
    before: measured.nullable().default(null),
    after: measured.nullable().default(null),
    instrument: z.string().trim().max(120).nullable().default(null),
    serial: z.string().trim().max(60).nullable().default(null),
    calibrationDate: z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/, "the calibration date must be written YYYY-MM-DD")
      .nullable()
      .default(null),
    precisionMm: z
      .number()
      .positive("the instrument's stated precision must be above 0 mm")
      .max(1000)
      .nullable()
      .default(null),
    surveyor: z.string().trim().max(120).nullable().default(null),
    method: z.string().trim().max(120).nullable().default(null),
    missing: z
      .array(z.object({ name: z.string().trim().min(1).max(64), status: z.enum(MISSING_STATUSES) }))
      .max(10_000)
      .default([]),
  })
  .superRefine((v, ctx) => {
    if (v.controlMarkId && !v.before)
      ctx.addIssue({
        code: "custom",
        path: ["before"],
        message: "give the control mark as measured before the survey",
      });
    if (v.controlMarkId && v.precisionMm === null)
      ctx.addIssue({
        code: "custom",
        path: ["precisionMm"],
        message: "give the instrument's stated precision to judge the control-mark check",
      });
    if (!v.controlMarkId && (v.before || v.after))
      ctx.addIssue({ code: "custom", path: ["controlMarkId"], message: "choose which control mark was measured" });
  });
export type FieldworkInput = z.infer<typeof FieldworkInput>;

/** `fieldwork` as a multipart form field: JSON text. */
export const FieldworkField = z
  .string()
  .optional()
  .transform((s, ctx) => {
    if (!s) return null;
    let raw: unknown;
    try {
      raw = JSON.parse(s);
    } catch (e) {
      ctx.addIssue({ code: "custom", message: `fieldwork must be JSON (${(e as Error).message.slice(0, 120)})` });
      return z.NEVER;
    }
    const parsed = FieldworkInput.safeParse(raw);
    if (!parsed.success) {
      for (const i of parsed.error.issues)
        ctx.addIssue({ code: "custom", message: `fieldwork.${i.path.join(".")}: ${i.message}` });
      return z.NEVER;
    }
    return parsed.data;
  });

export const UnpairedCsvQuery = z.object({ all: z.enum(["0", "1"]).optional() });
