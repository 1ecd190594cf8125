import type { LonLatBox } from "../crs/registry";
import type { CrsLike } from "../project";
import { convertArrays, convertPoint } from "../project";
import type { ColumnGuess } from "../read/columns";
import type { FileRole, InputIssue, PointTable } from "../types";

/** Metres per degree of latitude and of longitude at the equator on WGS 84, rounded (common practice, no source). */
const M_PER_DEG_LAT = 110_574;
const M_PER_DEG_LON = 111_320;

/** How many lines a message lists. */
const LINES_LISTED = 10;

/** What a new file is compared with: the field's boundary, or the extent of the field's other files. */
export type FieldReference =
  | { kind: "boundary" /** Outer ring, WGS 84 [longitude, latitude] pairs. */; ring: readonly (readonly number[])[] }
  | {
      kind: "files" /** Extent of each other file in WGS 84 [west, south, east, north], with its name. */;
      files: readonly { name: string; box: LonLatBox }[];
    };

/** Options of `checkAgainstField`. */
export interface FieldFitOptions {
  /** Points farther than this (metres) beyond the reference get a warning. Default 250. */
  nearM?: number;
  /** A file whose median point lies farther than this (metres) from the reference is an error. Default 5000. */
  farM?: number;
}

/**
 * Extent of a table in WGS 84 longitude/latitude [west, south, east, north]: the table's own min/max
 * converted corner by corner (good to the curvature of the grid over a field, metres).
 * @example lonLatBox(table, "EPSG:4326") // [9.2, 52.1, 9.21, 52.11]
 */
export function lonLatBox(table: PointTable, crs: CrsLike): LonLatBox | null {
  let x0 = Infinity,
    y0 = Infinity,
    x1 = -Infinity,
    y1 = -Infinity;
  for (let i = 0; i < table.length; i++) {
    const x = table.x[i],
      y = table.y[i];
    if (x < x0) x0 = x;
    if (x > x1) x1 = x;
    if (y < y0) y0 = y;
    if (y > y1) y1 = y;
  }
  if (!(x0 <= x1 && y0 <= y1)) return null;
  const corners = [
    convertPoint(x0, y0, crs, "EPSG:4326"),
    convertPoint(x1, y0, crs, "EPSG:4326"),
    convertPoint(x0, y1, crs, "EPSG:4326"),
    convertPoint(x1, y1, crs, "EPSG:4326"),
  ];
  const lons = corners.map((c) => c[0]),
    lats = corners.map((c) => c[1]);
  if (![...lons, ...lats].every(Number.isFinite)) return null;
  return [Math.min(...lons), Math.min(...lats), Math.max(...lons), Math.max(...lats)];
}

function referenceBox(ref: FieldReference): LonLatBox | null {
  let w = Infinity,
    s = Infinity,
    e = -Infinity,
    n = -Infinity;
  const add = (lon: number, lat: number) => {
    if (!Number.isFinite(lon) || !Number.isFinite(lat)) return;
    w = Math.min(w, lon);
    e = Math.max(e, lon);
    s = Math.min(s, lat);
    n = Math.max(n, lat);
  };
  if (ref.kind === "boundary") for (const p of ref.ring) add(p[0], p[1]);
  else
    for (const f of ref.files) {
      add(f.box[0], f.box[1]);
      add(f.box[2], f.box[3]);
    }
  return w <= e && s <= n ? [w, s, e, n] : null;
}

function km(m: number): string {
  return m >= 10_000
    ? `${Math.round(m / 1000).toLocaleString("en")} km`
    : m >= 1000
      ? `${(m / 1000).toFixed(1)} km`
      : `${Math.round(m)} m`;
}

/**
 * Checks a new file's points against its field: the field's boundary when it has one, else the extent
 * of the field's other files. Distances are measured to the reference's bounding box (longitude/latitude
 * box, metres by the equirectangular approximation at the box's mid latitude: Snyder 1987, "Map
 * Projections — A Working Manual", USGS PP 1395, p. 90), so a point inside the box but outside a
 * concave boundary is not reported.
 *
 * - The file's median distance beyond `farM` (default 5 km): an error naming the distance and the first lines
 *   (e.g. a latitude whose sign was dropped puts the file thousands of kilometres away).
 * - Some points beyond `nearM` (default 250 m): a warning naming how many, the farthest distance and the lines.
 *
 * @example checkAgainstField(table, "EPSG:4326", { kind: "boundary", ring }, "planted.csv") // [] when inside
 */
export function checkAgainstField(
  table: PointTable,
  crs: CrsLike,
  reference: FieldReference,
  options: FieldFitOptions = {},
): InputIssue[] {
  const box = referenceBox(reference);
  const n = table.length;
  if (!box || n === 0) return [];
  const nearM = options.nearM ?? 250;
  const farM = options.farM ?? 5000;
  const [lon, lat] = convertArrays(table.x, table.y, crs, "EPSG:4326");
  const cos = Math.cos((((box[1] + box[3]) / 2) * Math.PI) / 180);
  const dist = new Float64Array(n);
  let beyond = 0,
    farthest = 0,
    firstFar = -1;
  const lines: number[] = [];
  for (let i = 0; i < n; i++) {
    const lo = lon[i],
      la = lat[i];
    let d: number;
    if (!Number.isFinite(lo) || !Number.isFinite(la)) d = Infinity;
    else {
      const dx = (lo < box[0] ? box[0] - lo : lo > box[2] ? lo - box[2] : 0) * M_PER_DEG_LON * cos;
      const dy = (la < box[1] ? box[1] - la : la > box[3] ? la - box[3] : 0) * M_PER_DEG_LAT;
      d = Math.hypot(dx, dy);
    }
    dist[i] = d;
    if (d > nearM) {
      beyond++;
      if (d > farthest) farthest = d;
      if (lines.length < LINES_LISTED) lines.push(table.line[i]);
      if (firstFar < 0) firstFar = i;
    }
  }
  if (beyond === 0) return [];
  const sorted = Float64Array.from(dist).sort();
  const median = sorted[n >> 1];
  const what =
    reference.kind === "boundary"
      ? "the field's boundary"
      : `the field's other files (${reference.files
          .map((f) => f.name)
          .slice(0, 3)
          .join(", ")})`;
  const listed = `${lines.join(", ")}${beyond > lines.length ? ", …" : ""}`;
  if (median > farM) {
    return [
      {
        severity: "error",
        code: "file-far-from-field",
        file: table.source,
        line: lines[0],
        value: `${table.x[firstFar]}, ${table.y[firstFar]}`,
        message: `the points lie about ${km(median)} from ${what} (${beyond} of ${n} beyond ${km(nearM)}; lines ${listed}); expected this field. Check the signs of the coordinates and the CRS chosen`,
      },
    ];
  }
  return [
    {
      severity: "warning",
      code: "points-outside-field",
      file: table.source,
      line: lines[0],
      message: `${beyond} point(s) lie more than ${km(nearM)} outside ${what}, up to ${Number.isFinite(farthest) ? km(farthest) : "an unknown distance"} (lines ${listed})`,
    },
  ];
}

/** Columns only as-planted records have, and columns only survey files have. */
const PLANTED_ROLES = ["crop", "bed", "row", "arm", "time"] as const;
const SURVEY_ROLES = ["precision", "method"] as const;

/** Row counts of the field's files already saved, by kind. */
export interface FieldFileCounts {
  planted: readonly number[];
  survey: readonly number[];
}

function median(a: readonly number[]): number {
  const s = [...a].sort((p, q) => p - q);
  return s[s.length >> 1];
}

/**
 * Warns when a file looks like the other kind: an "as-planted" file with none of the record columns
 * (crop, bed, row, tool arm, time) but a precision or survey-method column, or with under a tenth of the rows
 * of the field's as-planted files; a "survey" file with record columns (two or more) and no precision or method
 * column, or with at least half the rows of the field's as-planted files. Common practice, no source: survey
 * files hold tens to hundreds of checkpoints, as-planted records one row per plant.
 *
 * @example checkFileKind("planted", guess, 25, { planted: [4800], survey: [] })[0].code // "file-kind-doubtful"
 */
export function checkFileKind(
  kind: FileRole,
  columns: ColumnGuess,
  rows: number,
  field: FieldFileCounts,
  file: string,
): InputIssue[] {
  const has = (r: string) => (columns.columns as Record<string, string | undefined>)[r] !== undefined;
  const planted = PLANTED_ROLES.filter(has);
  const survey = SURVEY_ROLES.filter(has);
  const reasons: string[] = [];
  const plantedMedian = field.planted.length ? median(field.planted) : 0;
  if (kind === "planted") {
    if (planted.length === 0 && survey.length > 0)
      reasons.push(
        `it has ${survey.map((r) => `a ${r === "method" ? "survey method" : r} column ("${(columns.columns as Record<string, string>)[r]}")`).join(" and ")} but no crop, bed, row, tool arm or time column`,
      );
    if (plantedMedian > 0 && rows * 10 < plantedMedian)
      reasons.push(`it has ${rows} row(s), while the field's as-planted files have about ${plantedMedian}`);
  } else {
    if (planted.length >= 2 && survey.length === 0)
      reasons.push(
        `it has record columns (${planted.map((r) => `"${(columns.columns as Record<string, string>)[r]}"`).join(", ")}) and no precision or survey method column`,
      );
    if (plantedMedian > 0 && rows * 2 >= plantedMedian)
      reasons.push(`it has ${rows} rows, as many as the field's as-planted files (about ${plantedMedian})`);
  }
  if (reasons.length === 0) return [];
  const other = kind === "planted" ? "a survey file of checkpoints" : "as-planted records";
  return [
    {
      severity: "warning",
      code: "file-kind-doubtful",
      file,
      message: `this looks like ${other}, not ${kind === "planted" ? "as-planted records" : "a survey file"}: ${reasons.join("; ")}. Check that it was uploaded in the right place`,
    },
  ];
}
