import { z } from "zod";
import {
  COLUMN_ROLES,
  normaliseHeader,
  planColumns,
  type ColumnMapping,
  type ColumnRole,
  type CoordinateKind,
} from "@/geo";
import { FieldInput } from "@/lib/validation/field";
import type { PresetDto } from "@/lib/api-types";

export type FileKind = "planted" | "survey";
export type FileFormat = "csv" | "geojson";

/** Roles in the order the form shows them, per kind of file (the most telling first). */
export const ROLE_ORDER: Record<FileKind, readonly ColumnRole[]> = {
  planted: [
    "id",
    "x",
    "y",
    "crop",
    "bed",
    "row",
    "cell",
    "arm",
    "fix",
    "hdop",
    "time",
    "rawX",
    "rawY",
    "method",
    "precision",
  ],
  survey: [
    "id",
    "x",
    "y",
    "method",
    "precision",
    "time",
    "crop",
    "bed",
    "row",
    "cell",
    "fix",
    "hdop",
    "arm",
    "rawX",
    "rawY",
    "status",
  ],
};

/** Plain-words name of a role. */
export function roleLabel(role: ColumnRole, coords: CoordinateKind, kind: FileKind): string {
  switch (role) {
    case "id":
      return "Plant id";
    case "x":
      return coords === "projected" ? "Easting" : "Longitude";
    case "y":
      return coords === "projected" ? "Northing" : "Latitude";
    case "crop":
      return "Crop";
    case "bed":
      return "Bed";
    case "row":
      return "Row";
    case "cell":
      return "Cell";
    case "arm":
      return "Tool arm";
    case "fix":
      return "GNSS fix";
    case "method":
      return "Survey method";
    case "hdop":
      return "HDOP";
    case "time":
      return kind === "survey" ? "Survey time" : "Planting time";
    case "precision":
      return "Stated precision (m)";
    case "rawX":
      return "Raw GNSS longitude or easting";
    case "rawY":
      return "Raw GNSS latitude or northing";
    case "status":
      return "Status (dead / not found)";
  }
}

/** Per role: a header name, "" = use Plotproof's guess, null = not in this file (nothing is read for it). */
export type ColumnChoice = string | null;

export interface MappingValues {
  columns: Record<ColumnRole, ColumnChoice>;
  coordinates: CoordinateKind;
  crs: string;
  savePreset: boolean;
  presetName: string;
}

export const emptyColumns = (): Record<ColumnRole, ColumnChoice> =>
  Object.fromEntries(COLUMN_ROLES.map((r) => [r, ""])) as Record<ColumnRole, ColumnChoice>;

/** The select value standing for "not in this file": a string that is none of this header's names. */
export function notInFileValue(header: readonly string[]): string {
  let value = "(not in this file)";
  while (header.includes(value)) value = `(${value})`;
  return value;
}

/** The header name `name` refers to, compared the way the server's reader compares (exact, then normalised). */
export function findHeader(header: readonly string[], name: string): string | null {
  const exact = header.find((h) => h === name.trim());
  if (exact !== undefined) return exact;
  const n = normaliseHeader(name);
  return header.find((h) => normaliseHeader(h) === n) ?? null;
}

/** Pseudo header used for GeoJSON, whose x/y come from each feature's geometry (as the server's reader does). */
const GEOMETRY_X = "@x",
  GEOMETRY_Y = "@y";

/** What the server's column planner makes of the header with this mapping (problems and the resulting columns). */
export function planFor(header: readonly string[], format: FileFormat, mapping: ColumnMapping) {
  if (format === "csv") return planColumns(header, mapping);
  return planColumns([...header, GEOMETRY_X, GEOMETRY_Y], { ...mapping, x: GEOMETRY_X, y: GEOMETRY_Y });
}

/** The engine's guess as form values. */
export function guessColumns(
  header: readonly string[],
  format: FileFormat,
  coordinates?: CoordinateKind,
): { columns: Record<ColumnRole, ColumnChoice>; coordinates: CoordinateKind | null } {
  const plan = planFor(header, format, coordinates ? { coordinates } : {});
  const columns = emptyColumns();
  for (const role of COLUMN_ROLES) {
    const name = plan.guess.columns[role];
    if (name && name !== GEOMETRY_X && name !== GEOMETRY_Y) columns[role] = name;
  }
  if (format === "geojson") {
    columns.x = "";
    columns.y = "";
  }
  return { columns, coordinates: plan.guess.coordinates };
}

/**
 * The mapping sent with the upload: a header name per chosen role, null per role not in this file, and
 * nothing for roles left to the guess (GeoJSON positions come from the geometry).
 */
export function toColumnMapping(
  values: Pick<MappingValues, "columns" | "coordinates">,
  format: FileFormat,
): ColumnMapping {
  const mapping: ColumnMapping = { coordinates: values.coordinates };
  for (const role of COLUMN_ROLES) {
    if (format === "geojson" && (role === "x" || role === "y")) continue;
    const choice = values.columns[role];
    if (choice === null || choice) mapping[role] = choice;
  }
  return mapping;
}

/** A preset fits a file when every column it names is in the header. */
export function presetFits(preset: PresetDto, header: readonly string[], format: FileFormat): boolean {
  const named = COLUMN_ROLES.filter((r) => !(format === "geojson" && (r === "x" || r === "y")))
    .map((r) => preset.mapping[r])
    .filter((n): n is string => !!n);
  return named.length > 0 && named.every((n) => findHeader(header, n) !== null);
}

/** Form columns from a preset, names matched to this header's spelling; roles the preset says are not in the file stay so. */
export function presetColumns(
  preset: PresetDto,
  header: readonly string[],
  format: FileFormat,
): Record<ColumnRole, ColumnChoice> {
  const columns = emptyColumns();
  for (const role of COLUMN_ROLES) {
    if (format === "geojson" && (role === "x" || role === "y")) continue;
    const name = preset.mapping[role];
    if (name) columns[role] = findHeader(header, name) ?? name;
    else if (name === null) columns[role] = null;
  }
  return columns;
}

/** The best-fitting preset: every named column present, most columns named; null when none fits. */
export function bestPreset(
  presets: readonly PresetDto[],
  header: readonly string[],
  format: FileFormat,
): PresetDto | null {
  let best: PresetDto | null = null,
    bestCount = -1;
  for (const p of presets) {
    if (!presetFits(p, header, format)) continue;
    const count = COLUMN_ROLES.filter((r) => p.mapping[r]).length;
    if (count > bestCount) {
      best = p;
      bestCount = count;
    }
  }
  return best;
}

/** Form schema for one file's header. */
export function mappingSchema(header: readonly string[], format: FileFormat, kind: FileKind) {
  const columns = z.object(
    Object.fromEntries(COLUMN_ROLES.map((r) => [r, z.string().nullable()])) as Record<
      ColumnRole,
      z.ZodNullable<z.ZodString>
    >,
  );
  return z
    .object({
      columns,
      coordinates: z.enum(["geographic", "projected"]),
      crs: z
        .string()
        .trim()
        .min(1, "Choose the coordinate system the file's positions are written in.")
        .pipe(FieldInput.shape.crs),
      savePreset: z.boolean(),
      presetName: z.string().trim().max(80, "Keep the preset name to 80 characters."),
    })
    .superRefine((v, ctx) => {
      const label = (r: ColumnRole) => roleLabel(r, v.coordinates, kind);
      if (format === "csv") {
        for (const r of ["x", "y"] as const) {
          if (!v.columns[r])
            ctx.addIssue({
              code: "custom",
              path: ["columns", r],
              message: `Choose the column that holds the ${label(r).toLowerCase()}.`,
            });
        }
      }
      const rolesOf = new Map<string, ColumnRole[]>();
      for (const r of COLUMN_ROLES) {
        const name = v.columns[r];
        if (!name) continue;
        if (!header.includes(name)) {
          ctx.addIssue({
            code: "custom",
            path: ["columns", r],
            message: `“${name}” is not a column of this file; choose one of its columns.`,
          });
          continue;
        }
        rolesOf.set(name, [...(rolesOf.get(name) ?? []), r]);
      }
      // A column chosen twice: both choices say so, whichever was changed last.
      for (const [name, rs] of rolesOf) {
        if (rs.length < 2) continue;
        for (const r of rs) {
          const others = rs
            .filter((o) => o !== r)
            .map(label)
            .join(" and ");
          ctx.addIssue({
            code: "custom",
            path: ["columns", r],
            message: `“${name}” is also chosen as ${others}; one column can play only one part.`,
          });
        }
      }
      if (!!v.columns.rawX !== !!v.columns.rawY) {
        const missing = v.columns.rawX ? "rawY" : "rawX";
        ctx.addIssue({
          code: "custom",
          path: ["columns", missing],
          message: "Raw GNSS positions need both columns, or neither.",
        });
      }
      if (v.savePreset && !v.presetName)
        ctx.addIssue({
          code: "custom",
          path: ["presetName"],
          message: "Name the preset, e.g. after the machine or its export.",
        });
    });
}
