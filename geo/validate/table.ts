import { containsLonLat, type CrsEntry } from "../crs/registry";
import { medianOf, toLonLat } from "../project";
import type { ColumnGuess } from "../read/columns";
import type { InputIssue, PointTable } from "../types";
import { findDuplicateIds } from "../ids";
import { IssueCollector } from "./issues";

/** Options of `validateTable`. */
export interface TableCheckOptions {
  /** Column guess from the reader, to name columns in messages and to know the coordinate kind. */
  columns?: ColumnGuess;
  /** Fewer points than this in a survey file gives a warning (default 20: the NSSDA minimum of checkpoints, FGDC-STD-007.3-1998 §3.2.2). */
  minCheckpoints?: number;
  issueCap?: number;
}

/** A median stated precision above this (metres) is implausible for positions an audit can use (common practice, no source). */
export const MAX_PLAUSIBLE_PRECISION_M = 0.5;

/** Median of finite values (NaN for none). */
function median(values: number[]): number {
  if (values.length === 0) return NaN;
  const s = values.sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/** How many lines to list in one duplicate-id message. */
const LINES_PER_DUPLICATE = 10;

/**
 * Checks one table against its CRS before projection. Returns issues; any error means no result.
 *
 * - The coordinate kind of the columns (lat/lon vs easting/northing) must match the CRS kind.
 * - Geographic: latitude within ±90°, longitude within ±180°; a file whose "latitudes" exceed 90°
 *   while its "longitudes" all fit in ±90° is reported once as swapped; values of metres in a
 *   geographic CRS are reported once as such.
 * - Projected: values that all fit in ±180/±90 look like degrees; the median position must fall in
 *   the CRS's area of use (3° of slack), else the axes swapped or the values divided by 1000
 *   (millimetres) are tried and named when they fit.
 * - Plant ids must be unique (an error listing the lines of each repeated id).
 * - Survey point names must be unique too (an error naming each repeated name's lines).
 * - Warnings: mixed fix qualities; fewer survey points than `minCheckpoints`; a stated precision whose median
 *   exceeds `MAX_PLAUSIBLE_PRECISION_M` (0.5 m), which suggests millimetres in a metres column.
 *
 * @example validateTable(table, resolveCrs("EPSG:4326")) // [] for a clean file
 */
export function validateTable(table: PointTable, crs: CrsEntry, options: TableCheckOptions = {}): InputIssue[] {
  const issues = new IssueCollector(options.issueCap);
  const file = table.source;
  const cols = options.columns?.columns ?? {};
  const kind = options.columns?.coordinates ?? null;
  const xName = cols.x ?? (crs.kind === "geographic" ? "lon" : "easting");
  const yName = cols.y ?? (crs.kind === "geographic" ? "lat" : "northing");
  const n = table.length;
  const { x, y, line } = table;

  if (kind !== null && kind !== crs.kind) {
    issues.add({
      severity: "error",
      code: "crs-kind-mismatch",
      file,
      message:
        kind === "geographic"
          ? `the file has latitude/longitude columns ("${yName}", "${xName}") but ${crs.code} (${crs.name}) is a projected CRS; choose a geographic CRS such as EPSG:4326`
          : `the file has easting/northing columns ("${xName}", "${yName}") but ${crs.code} (${crs.name}) is geographic; choose the projected CRS the easting/northing are in`,
    });
    return issues.finish();
  }

  let maxAbsX = 0,
    maxAbsY = 0,
    yOver90 = 0;
  for (let i = 0; i < n; i++) {
    const ax = Math.abs(x[i]),
      ay = Math.abs(y[i]);
    if (ax > maxAbsX) maxAbsX = ax;
    if (ay > maxAbsY) maxAbsY = ay;
    if (ay > 90) yOver90++;
  }

  if (crs.kind === "geographic") {
    if (maxAbsX > 360 && maxAbsY > 360) {
      issues.add({
        severity: "error",
        code: "coordinates-look-projected",
        file,
        message: `values up to ${fmt(maxAbsX)} ("${xName}") and ${fmt(maxAbsY)} ("${yName}") are not degrees; they look like easting/northing in metres. Choose the projected CRS they are in`,
      });
    } else if (yOver90 > 0 && maxAbsX <= 90 && maxAbsY <= 180) {
      issues.add({
        severity: "error",
        code: "lat-lon-swapped",
        file,
        column: yName,
        message: `${yOver90} value(s) in "${yName}" exceed 90°, while all of "${xName}" fit within ±90°: latitude and longitude look swapped. Swap the columns (or map them explicitly)`,
      });
    } else {
      for (let i = 0; i < n; i++) {
        if (Math.abs(y[i]) > 90) {
          issues.add({
            severity: "error",
            code: "latitude-out-of-range",
            file,
            line: line[i],
            column: yName,
            value: String(y[i]),
            message: "expected a latitude between -90 and 90 degrees",
          });
        }
        if (Math.abs(x[i]) > 180) {
          issues.add({
            severity: "error",
            code: "longitude-out-of-range",
            file,
            line: line[i],
            column: xName,
            value: String(x[i]),
            message: "expected a longitude between -180 and 180 degrees",
          });
        }
      }
      if (!issues.hasErrors() && n > 0) {
        const lon = medianOf(x),
          lat = medianOf(y);
        if (!containsLonLat(crs.area, lon, lat, 1)) {
          issues.add({
            severity: "warning",
            code: "outside-crs-area",
            file,
            message: `the points lie around ${fmt(lat)}°, ${fmt(lon)}° (lat, lon), outside the area of use of ${crs.code} (${crs.name})`,
          });
        }
      }
    }
  } else if (n > 0) {
    if (maxAbsX <= 180 && maxAbsY <= 90) {
      issues.add({
        severity: "error",
        code: "coordinates-look-like-degrees",
        file,
        message: `all values of "${xName}" and "${yName}" fit within ±180/±90: they look like longitude/latitude in degrees, not metres of ${crs.code} (${crs.name}). Choose a geographic CRS such as EPSG:4326`,
      });
    } else {
      const mx = medianOf(x),
        my = medianOf(y);
      const inArea = (px: number, py: number) => {
        const [lon, lat] = toLonLat(px, py, crs);
        return (
          Number.isFinite(lon) && Number.isFinite(lat) && Math.abs(lat) <= 90 && containsLonLat(crs.area, lon, lat, 3)
        );
      };
      if (!inArea(mx, my)) {
        if (inArea(my, mx)) {
          issues.add({
            severity: "error",
            code: "easting-northing-swapped",
            file,
            column: xName,
            message: `with "${xName}" as easting and "${yName}" as northing the points fall outside ${crs.code} (${crs.name}); swapped they fit. Swap the columns (or map them explicitly)`,
          });
        } else if (inArea(mx / 1000, my / 1000)) {
          issues.add({
            severity: "error",
            code: "coordinates-look-like-millimetres",
            file,
            message: `values around ${fmt(mx)}, ${fmt(my)} are about 1000 times too large for ${crs.code} (${crs.name}); they look like millimetres. Export them in metres`,
          });
        } else {
          const [lon, lat] = toLonLat(mx, my, crs);
          const where =
            Number.isFinite(lon) && Math.abs(lat) <= 90
              ? `around ${fmt(lat)}°, ${fmt(lon)}° (lat, lon)`
              : "nowhere on Earth";
          issues.add({
            severity: Number.isFinite(lon) && Math.abs(lat) <= 90 ? "warning" : "error",
            code: "outside-crs-area",
            file,
            message: `in ${crs.code} (${crs.name}) the points lie ${where}, outside that CRS's area of use; check the CRS chosen for this file`,
          });
        }
      }
    }
  }

  // Duplicate ids.
  if (table.id) {
    const duplicates = findDuplicateIds(table.id);
    if (duplicates) {
      for (const [id, rows] of duplicates) {
        const lines = rows.map((r) => line[r]);
        issues.add({
          severity: "error",
          code: "id-duplicate",
          file,
          line: lines[1],
          column: cols.id ?? "id",
          value: id,
          message: `${table.role === "survey" ? "survey point name" : "plant id"} "${id}" appears ${lines.length} times, on lines ${lines.slice(0, LINES_PER_DUPLICATE).join(", ")}${lines.length > LINES_PER_DUPLICATE ? ", …" : ""}; ${table.role === "survey" ? "each checkpoint needs its own name (a point measured twice would count twice)" : "ids must be unique"}`,
        });
      }
    }
  }

  // Stated precision in metres: RTK and total-station checkpoints state millimetres to centimetres.
  const precision = table.precision;
  if (precision) {
    const finite = Array.from(precision).filter(Number.isFinite);
    const stated = median(finite);
    if (finite.length > 0 && stated > MAX_PLAUSIBLE_PRECISION_M) {
      const lines: number[] = [];
      for (let i = 0; i < n && lines.length < 5; i++) if (precision[i] > MAX_PLAUSIBLE_PRECISION_M) lines.push(line[i]);
      issues.add({
        severity: "warning",
        code: "precision-implausible",
        file,
        line: lines[0],
        column: cols.precision ?? "precision",
        value: String(stated),
        message: `the stated precision has a median of ${fmt(stated)}, implausible in metres for surveyed or RTK positions (lines ${lines.join(", ")}, …); the column looks like millimetres. Export it in metres (e.g. 0.004 for 4 mm)`,
      });
    }
  }

  const fix = table.attrs.fix;
  if (fix && fix.values.length > 1) {
    const counts = new Array(fix.values.length).fill(0);
    for (let i = 0; i < fix.codes.length; i++) if (fix.codes[i] >= 0) counts[fix.codes[i]]++;
    const parts = fix.values.map((v, k) => `${v}: ${counts[k]}`).join(", ");
    issues.add({
      severity: "warning",
      code: "fix-mixed",
      file,
      column: cols.fix ?? "fix",
      message: `fix qualities are mixed (${parts}); consider grouping by fix or keeping only RTK-fixed points`,
    });
  }

  const minCheck = options.minCheckpoints ?? 20;
  if (table.role === "survey" && n < minCheck) {
    issues.add({
      severity: "warning",
      code: "few-points",
      file,
      message: `only ${n} survey point(s); at least ${minCheck} checkpoints are needed for an NSSDA accuracy statement`,
    });
  }
  return issues.finish();
}

function fmt(v: number): string {
  return Math.abs(v) >= 1000 ? v.toFixed(0) : v.toFixed(5).replace(/0+$/, "").replace(/\.$/, "");
}
