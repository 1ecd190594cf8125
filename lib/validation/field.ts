import { z } from "zod";

const crsPattern = /^(EPSG:\d{4,5}|\+proj=.+)$/;

function isIanaZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat("en", { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}

/** A field as a technician sets it up. Lengths in metres, bearing in degrees clockwise from grid north. */
export const FieldInput = z.object({
  name: z.string().trim().min(1, "Give the field a name.").max(120),
  farm: z.string().trim().min(1, "Name the farm or site.").max(120),
  crs: z.string().trim().regex(crsPattern, "Use an EPSG code such as EPSG:25831, or a proj string starting with +proj="),
  timeZone: z.string().trim().refine(isIanaZone, "Use an IANA time zone such as Europe/Amsterdam."),
  rowBearingDeg: z.number().min(0).max(180).nullable().default(null),
  bedSpacingM: z.number().positive().max(20).nullable().default(null),
  rowsPerBed: z.number().int().min(1).max(24).nullable().default(null),
  rowSpacingM: z.number().positive().max(5).nullable().default(null),
});
export type FieldInput = z.infer<typeof FieldInput>;

export const FieldIdParam = z.object({ fieldId: z.uuid() });
