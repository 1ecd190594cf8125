import { z } from "zod";
import { BoundarySchema, FieldInput } from "@/lib/validation/field";

/** A number typed into a text box: empty means "not set" (null); a decimal comma is accepted. */
function numberText(what: string, check: (n: number) => boolean, rangeMessage: string) {
  return z
    .string()
    .trim()
    .transform((text, ctx) => {
      if (text === "") return null;
      const n = Number(text.replace(",", "."));
      if (!Number.isFinite(n)) {
        ctx.addIssue({ code: "custom", message: `Type ${what} as a number, or leave it empty.` });
        return z.NEVER;
      }
      if (!check(n)) {
        ctx.addIssue({ code: "custom", message: rangeMessage });
        return z.NEVER;
      }
      return n;
    });
}

const lon = z.number().min(-180).max(180);
const lat = z.number().min(-90).max(90);
const position = z.array(z.number()).min(2).max(3);

/**
 * A GeoJSON Polygon as read from a file, in WGS 84 longitude/latitude (RFC 7946 §3.1.6): each ring has
 * at least four positions and ends where it starts; an altitude may follow (it is dropped).
 * The messages say which ring and which position is wrong.
 */
const PolygonInFile = z
  .object({
    type: z.literal("Polygon"),
    coordinates: z
      .array(
        z
          .array(position)
          .min(4, "A boundary ring needs at least four positions (three corners and the first one again)."),
      )
      .min(1),
  })
  .superRefine((poly, ctx) => {
    poly.coordinates.forEach((ring, r) => {
      const which = r === 0 ? "The outer ring" : `Hole ${r}`;
      const first = ring[0],
        last = ring[ring.length - 1];
      if (first[0] !== last[0] || first[1] !== last[1]) {
        ctx.addIssue({
          code: "custom",
          message: `${which} does not end where it starts; a GeoJSON ring must be closed.`,
        });
      }
      const bad = ring.findIndex((p) => !lon.safeParse(p[0]).success || !lat.safeParse(p[1]).success);
      if (bad >= 0) {
        const [x, y] = ring[bad];
        ctx.addIssue({
          code: "custom",
          message: `${which} has the position ${x}, ${y}, which is not longitude/latitude in degrees. GeoJSON boundaries must be in WGS 84 longitude, latitude (projected metres such as easting/northing are not allowed).`,
        });
      }
    });
  });

/** The boundary the API stores: the shared schema of lib/validation/field.ts. */
export const BoundaryPolygon = BoundarySchema;
export type BoundaryPolygon = z.infer<typeof BoundarySchema>;

/**
 * The field form: the API's FieldInput (its text rules reused as they are) with numbers typed as text,
 * plus the boundary.
 */
export const FieldFormSchema = z.object({
  name: FieldInput.shape.name,
  farm: FieldInput.shape.farm,
  crs: FieldInput.shape.crs,
  timeZone: FieldInput.shape.timeZone,
  rowBearingDeg: numberText(
    "the bearing",
    (n) => n >= 0 && n <= 180,
    "Give the row bearing in degrees from 0 to 180, clockwise from grid north (a row at 200° is the same row as at 20°).",
  ).pipe(FieldInput.shape.rowBearingDeg.unwrap()),
  bedSpacingM: numberText(
    "the bed spacing",
    (n) => n > 0 && n <= 20,
    "Bed spacing is the distance from one bed centre to the next, more than 0 and at most 20 m.",
  ).pipe(FieldInput.shape.bedSpacingM.unwrap()),
  rowsPerBed: numberText(
    "the rows per bed",
    (n) => Number.isInteger(n) && n >= 1 && n <= 24,
    "Rows per bed is a whole number from 1 to 24.",
  ).pipe(FieldInput.shape.rowsPerBed.unwrap()),
  rowSpacingM: numberText(
    "the row spacing",
    (n) => n > 0 && n <= 5,
    "Row spacing is the distance between rows of one bed, more than 0 and at most 5 m.",
  ).pipe(FieldInput.shape.rowSpacingM.unwrap()),
  boundary: BoundaryPolygon.nullable(),
});
export type FieldFormValues = z.input<typeof FieldFormSchema>;
export type FieldFormOutput = z.output<typeof FieldFormSchema>;

/** Names of the form's inputs, for placing API issues next to the right control. */
export const FIELD_FORM_KEYS = [
  "name",
  "farm",
  "crs",
  "timeZone",
  "rowBearingDeg",
  "bedSpacingM",
  "rowsPerBed",
  "rowSpacingM",
  "boundary",
] as const;
export type FieldFormKey = (typeof FIELD_FORM_KEYS)[number];

export function isFieldFormKey(key: unknown): key is FieldFormKey {
  return typeof key === "string" && (FIELD_FORM_KEYS as readonly string[]).includes(key);
}

/** Text for a number input: "" for null. */
export const numberToText = (n: number | null | undefined): string => (n === null || n === undefined ? "" : String(n));

const GeoJsonWrapper = z.union([
  z.looseObject({ type: z.literal("Polygon") }),
  z.looseObject({ type: z.literal("MultiPolygon"), coordinates: z.array(z.unknown()) }),
  z.looseObject({ type: z.literal("Feature"), geometry: z.unknown() }),
  z.looseObject({ type: z.literal("FeatureCollection"), features: z.array(z.unknown()) }),
]);

/**
 * Reads a boundary from the text of a GeoJSON file: a Polygon, a one-polygon MultiPolygon, a Feature
 * holding one, or a FeatureCollection with exactly one polygon feature.
 */
export function readBoundaryText(
  text: string,
): { ok: true; polygon: BoundaryPolygon } | { ok: false; message: string } {
  let doc: unknown;
  try {
    doc = JSON.parse(text.replace(/^\uFEFF/, ""));
  } catch (err) {
    return {
      ok: false,
      message: `The file is not valid JSON (${err instanceof Error ? err.message : "cannot be read"}).`,
    };
  }
  const unwrap = (value: unknown, depth: number): unknown | string => {
    const parsed = GeoJsonWrapper.safeParse(value);
    if (!parsed.success || depth > 2) return "The file is not a GeoJSON Polygon, Feature or FeatureCollection.";
    const g = parsed.data as { type: string; geometry?: unknown; features?: unknown[]; coordinates?: unknown[] };
    if (g.type === "Polygon") return g;
    if (g.type === "MultiPolygon") {
      if (g.coordinates!.length !== 1)
        return `The MultiPolygon has ${g.coordinates!.length} parts; a field boundary is one polygon.`;
      return { type: "Polygon", coordinates: g.coordinates![0] };
    }
    if (g.type === "Feature") return unwrap(g.geometry, depth + 1);
    const polys = g.features!.filter((f) => {
      const t = (f as { geometry?: { type?: unknown } } | null)?.geometry?.type;
      return t === "Polygon" || t === "MultiPolygon";
    });
    if (polys.length !== 1)
      return `The FeatureCollection holds ${polys.length} polygon features; a field boundary file must hold exactly one.`;
    return unwrap(polys[0], depth + 1);
  };
  const geometry = unwrap(doc, 0);
  if (typeof geometry === "string") return { ok: false, message: geometry };
  const checked = PolygonInFile.safeParse(geometry);
  if (!checked.success) return { ok: false, message: checked.error.issues[0]?.message ?? "The polygon is not valid." };
  const flat = {
    type: "Polygon" as const,
    coordinates: checked.data.coordinates.map((r) => r.map((p) => [p[0], p[1]] as [number, number])),
  };
  const stored = BoundarySchema.safeParse(flat);
  if (!stored.success) return { ok: false, message: stored.error.issues[0]?.message ?? "The polygon is not valid." };
  return { ok: true, polygon: stored.data };
}
