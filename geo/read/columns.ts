import type { FileRole } from "../types";

/**
 * Header-name guessing for as-planted records and survey files.
 * Names are compared after normalisation: lower case, units in brackets dropped, and spaces,
 * underscores, hyphens and dots removed ("Plant ID", "plant_id" and "PLANT-ID" all become "plantid").
 */

/** A column the reader knows how to use. `x`/`y` are longitude/latitude or easting/northing. */
export const COLUMN_ROLES = [
  "id",
  "x",
  "y",
  "crop",
  "bed",
  "row",
  "cell",
  "arm",
  "fix",
  "method",
  "hdop",
  "time",
  "precision",
  "rawX",
  "rawY",
  "status",
] as const;
export type ColumnRole = (typeof COLUMN_ROLES)[number];

/** Whether x/y are geographic degrees (lon/lat) or projected metres (easting/northing). */
export type CoordinateKind = "geographic" | "projected";

/**
 * An explicit column mapping chosen by a user; it overrides guessing role by role.
 * A value is a header name as it appears in the file, or `null` for "not in this file" (no column is read
 * for that role, even one the guess would pick); an absent role is guessed.
 * `x` = longitude or easting, `y` = latitude or northing; these two cannot be `null`.
 */
export type ColumnMapping = { [R in ColumnRole]?: string | null } & {
  coordinates?: CoordinateKind;
};

/** What the reader decided about the columns, for a UI to show and let the user correct. */
export interface ColumnGuess {
  /** Header names as read (BOM and surrounding spaces removed). */
  header: string[];
  /** Role → header name. */
  columns: Partial<Record<ColumnRole, string>>;
  /** Kind of the main coordinates, or null when no coordinate columns were found. */
  coordinates: CoordinateKind | null;
  /** Kind of the raw GNSS coordinates, or null when there are none. */
  rawCoordinates: CoordinateKind | null;
  /** Header names not used for any role. */
  unused: string[];
  /** CSV only: the delimiter found, and whether a decimal comma is accepted. */
  delimiter?: string;
  decimalComma?: boolean;
}

/**
 * Normalises a header name for comparison.
 * @example normaliseHeader(" Easting (m) ") // "easting"
 * @example normaliseHeader("Plant_ID") // "plantid"
 */
export function normaliseHeader(name: string): string {
  return name
    .replace(/^\uFEFF/, "")
    .toLowerCase()
    .replace(/\(.*?\)|\[.*?\]/g, "")
    .replace(/[\s_\-.]+/g, "");
}

/** Accepted names (already normalised) per role and coordinate kind. Own list; common spellings in exports. */
const NAMES = {
  id: [
    "plantid",
    "id",
    "plant",
    "plantno",
    "plantnumber",
    "pointid",
    "point",
    "pointname",
    "pointno",
    "name",
    "station",
    "checkpoint",
  ],
  lat: ["lat", "latitude"],
  lon: ["lon", "lng", "long", "longitude"],
  easting: ["easting", "x", "e", "east"],
  northing: ["northing", "y", "n", "north"],
  crop: ["crop", "croptype", "cropname"],
  bed: ["bed", "bedid", "bedno", "bednumber"],
  row: ["row", "rowid", "rowno", "rownumber"],
  cell: ["cell", "cellid"],
  arm: ["toolarm", "arm", "tool", "armid", "toolid"],
  fix: ["fix", "fixquality", "quality", "rtk", "fixtype", "gnssfix", "rtkstatus"],
  method: ["surveymethod", "method", "instrument"],
  hdop: ["hdop"],
  time: ["time", "timestamp", "plantedat", "datetime", "surveyedat", "observedat"],
  precision: ["precision", "precisionm", "sigma", "std", "stddev", "accuracy", "hprecision", "hsigma"],
  rawLat: ["rawlat", "rawlatitude", "gnsslat", "gnsslatitude"],
  rawLon: ["rawlon", "rawlng", "rawlong", "rawlongitude", "gnsslon", "gnsslng", "gnsslongitude"],
  rawEasting: ["raweasting", "rawx", "rawe", "gnsseasting", "gnssx"],
  rawNorthing: ["rawnorthing", "rawy", "rawn", "gnssnorthing", "gnssy"],
  status: ["status", "pointstatus", "surveystatus", "plantstatus"],
} as const;

/** Result of matching a header against the accepted names and an optional mapping. */
export interface ColumnPlan {
  /** Role → column index in the header, or -1 when absent. */
  index: Record<ColumnRole, number>;
  guess: ColumnGuess;
  /** Problems found with the header itself (missing coordinate columns, unknown mapped names, positions mapped to null). */
  problems: { code: string; severity: "error" | "warning"; message: string; column?: string }[];
}

/**
 * Decides which column plays which role.
 * Guessing picks the first header whose normalised name is in the accepted list (list order wins,
 * then column order). A mapping entry replaces the guess for its role; a mapped name that is not in
 * the header is an error. A `null` entry drops the guess, so that column is unused (`rawX` or `rawY`
 * null drops both raw GNSS columns); `x` or `y` null is an error, as every point needs a position.
 * Latitude/longitude win over easting/northing when both are present, unless `mapping.coordinates`
 * says otherwise.
 *
 * @example planColumns(["Plant ID", "Lat", "Lon"]).guess.columns // { id: "Plant ID", y: "Lat", x: "Lon" }
 * The status column (geo/read/status.ts) belongs to survey files: with `options.role` "planted" it is never read.
 *
 * @example planColumns(["Plant ID", "Lat", "Lon"]).guess.columns // { id: "Plant ID", y: "Lat", x: "Lon" }
 * @example planColumns(["id", "fix", "lat", "lon"], { fix: null }).guess.unused // ["fix"]
 */
export function planColumns(
  header: readonly string[],
  mapping: ColumnMapping = {},
  options: { role?: FileRole } = {},
): ColumnPlan {
  const clean = header.map((h) => h.replace(/^\uFEFF/, "").trim());
  const norm = clean.map(normaliseHeader);
  const problems: ColumnPlan["problems"] = [];
  const find = (names: readonly string[]): number => {
    for (const n of names) {
      const i = norm.indexOf(n);
      if (i >= 0) return i;
    }
    return -1;
  };
  const byName = (name: string, role: string): number => {
    let i = clean.indexOf(name.trim());
    if (i < 0) i = norm.indexOf(normaliseHeader(name));
    if (i < 0) {
      problems.push({
        code: "mapping-column-not-found",
        severity: "error",
        column: name,
        message: `the column mapping names "${name}" for ${role}, but the header has only: ${clean.join(", ")}`,
      });
    }
    return i;
  };

  const lat = find(NAMES.lat),
    lon = find(NAMES.lon);
  const east = find(NAMES.easting),
    north = find(NAMES.northing);
  const hasGeo = lat >= 0 && lon >= 0;
  const hasProj = east >= 0 && north >= 0;

  let kind: CoordinateKind | null = mapping.coordinates ?? null;
  if (kind === null) kind = hasGeo ? "geographic" : hasProj ? "projected" : null;

  const index = Object.fromEntries(COLUMN_ROLES.map((r) => [r, -1])) as Record<ColumnRole, number>;
  if (kind === "geographic") {
    index.x = lon;
    index.y = lat;
  } else if (kind === "projected") {
    index.x = east;
    index.y = north;
  }
  if (mapping.x === undefined && mapping.y === undefined && hasGeo && hasProj && mapping.coordinates === undefined) {
    problems.push({
      code: "coordinates-both-kinds",
      severity: "warning",
      message: `the file has both latitude/longitude ("${clean[lat]}", "${clean[lon]}") and easting/northing ("${clean[east]}", "${clean[north]}"); latitude/longitude are used`,
    });
  }

  index.id = find(NAMES.id);
  index.crop = find(NAMES.crop);
  index.bed = find(NAMES.bed);
  index.row = find(NAMES.row);
  index.cell = find(NAMES.cell);
  index.arm = find(NAMES.arm);
  index.fix = find(NAMES.fix);
  index.method = find(NAMES.method);
  index.hdop = find(NAMES.hdop);
  index.time = find(NAMES.time);
  index.precision = find(NAMES.precision);
  index.status = find(NAMES.status);

  const rawLat = find(NAMES.rawLat),
    rawLon = find(NAMES.rawLon);
  const rawE = find(NAMES.rawEasting),
    rawN = find(NAMES.rawNorthing);
  let rawKind: CoordinateKind | null = null;
  if (rawLat >= 0 && rawLon >= 0 && (kind === "geographic" || !(rawE >= 0 && rawN >= 0))) {
    rawKind = "geographic";
    index.rawX = rawLon;
    index.rawY = rawLat;
  } else if (rawE >= 0 && rawN >= 0) {
    rawKind = "projected";
    index.rawX = rawE;
    index.rawY = rawN;
  }

  const named = (role: ColumnRole): boolean => typeof mapping[role] === "string" && mapping[role] !== "";
  for (const role of COLUMN_ROLES) {
    const name = mapping[role];
    if (name === null) index[role] = -1;
    else if (name !== undefined && name !== "") index[role] = byName(name, role);
  }
  for (const role of ["x", "y"] as const) {
    if (mapping[role] !== null) continue;
    const what =
      role === "x"
        ? kind === "projected"
          ? "easting"
          : kind === "geographic"
            ? "longitude"
            : "longitude or easting"
        : kind === "projected"
          ? "northing"
          : kind === "geographic"
            ? "latitude"
            : "latitude or northing";
    problems.push({
      code: "mapping-coordinate-not-in-file",
      severity: "error",
      message: `the column mapping says the ${what} (${role}) is not in this file, but every point needs a position; name the column that holds it, or leave ${role} out to have it guessed`,
    });
  }
  // Raw GNSS positions need both columns: "not in this file" for one drops the pair.
  if (mapping.rawX === null || mapping.rawY === null) {
    index.rawX = -1;
    index.rawY = -1;
    rawKind = null;
  }
  if ((named("rawX") || named("rawY")) && rawKind === null) rawKind = kind;

  if ((index.x < 0 && mapping.x !== null) || (index.y < 0 && mapping.y !== null)) {
    const what =
      kind === "projected"
        ? "easting and northing"
        : kind === "geographic"
          ? "latitude and longitude"
          : "latitude/longitude or easting/northing";
    problems.push({
      code: "coordinate-columns-missing",
      severity: "error",
      message: `no ${what} columns found; the header is: ${clean.join(", ")}. Name them e.g. lat/lon or easting/northing, or give a column mapping`,
    });
  }
  if (rawKind !== null && kind !== null && rawKind !== kind && !named("rawX")) {
    problems.push({
      code: "raw-gnss-kind-differs",
      severity: "warning",
      message: `raw GNSS positions are ${rawKind} but the main positions are ${kind}; raw GNSS positions are ignored (give a column mapping to use them)`,
    });
    index.rawX = -1;
    index.rawY = -1;
    rawKind = null;
  }
  if (index.rawX >= 0 !== index.rawY >= 0) {
    index.rawX = -1;
    index.rawY = -1;
    rawKind = null;
  }
  if (options.role === "planted") index.status = -1;

  const columns: Partial<Record<ColumnRole, string>> = {};
  const used = new Set<number>();
  for (const role of COLUMN_ROLES) {
    if (index[role] >= 0) {
      columns[role] = clean[index[role]];
      used.add(index[role]);
    }
  }
  return {
    index,
    problems,
    guess: {
      header: clean,
      columns,
      coordinates: index.x >= 0 && index.y >= 0 ? kind : null,
      rawCoordinates: index.rawX >= 0 ? rawKind : null,
      unused: clean.filter((_, i) => !used.has(i)),
    },
  };
}
