import { z } from "zod";
import { crsProblem } from "@/geo/crs/check";

const crsPattern = /^(EPSG:\d{4,5}|\+proj=.+)$/;

function isIanaZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat("en", { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

const position = z.tuple([z.number().min(-180).max(180), z.number().min(-90).max(90)]);
const ring = z
  .array(position)
  .min(4, "A boundary ring needs at least 4 positions (first = last).")
  .refine(
    (r) => r[0][0] === r[r.length - 1][0] && r[0][1] === r[r.length - 1][1],
    "A boundary ring must end where it starts.",
  );

/** Field boundary: a GeoJSON Polygon in WGS 84 longitude/latitude. */
export const BoundarySchema = z.object({ type: z.literal("Polygon"), coordinates: z.array(ring).min(1) });

/** A field as a technician sets it up. Lengths in metres, bearing in degrees clockwise from grid north. */
export const FieldInput = z.object({
  name: z.string().trim().min(1, "Give the field a name.").max(120),
  farm: z.string().trim().min(1, "Name the farm or site.").max(120),
  crs: z
    .string()
    .trim()
    .regex(crsPattern, "Use an EPSG code such as EPSG:25831, or a proj string starting with +proj=")
    .superRefine((spec, ctx) => {
      const problem = crsPattern.test(spec) ? crsProblem(spec) : null;
      if (problem) ctx.addIssue({ code: "custom", message: problem });
    }),
  timeZone: z.string().trim().refine(isIanaZone, "Use an IANA time zone such as Europe/Amsterdam."),
  rowBearingDeg: z.number().min(0).max(180).nullable().default(null),
  bedSpacingM: z.number().positive().max(20).nullable().default(null),
  rowsPerBed: z.number().int().min(1).max(24).nullable().default(null),
  rowSpacingM: z.number().positive().max(5).nullable().default(null),
  boundary: BoundarySchema.nullable().default(null),
});
export type FieldInput = z.infer<typeof FieldInput>;

/** PATCH: any subset of the fields. */
export const FieldPatch = z.object({
  name: z.string().trim().min(1, "Give the field a name.").max(120).optional(),
  farm: z.string().trim().min(1).max(120).optional(),
  crs: FieldInput.shape.crs.optional(),
  timeZone: FieldInput.shape.timeZone.optional(),
  rowBearingDeg: z.number().min(0).max(180).nullable().optional(),
  bedSpacingM: z.number().positive().max(20).nullable().optional(),
  rowsPerBed: z.number().int().min(1).max(24).nullable().optional(),
  rowSpacingM: z.number().positive().max(5).nullable().optional(),
  boundary: BoundarySchema.nullable().optional(),
});
export type FieldPatch = z.infer<typeof FieldPatch>;
