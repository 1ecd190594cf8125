/**
 * Bundled coordinate reference systems (proj4 definitions) and look-up.
 *
 * Definitions follow the EPSG dataset as commonly written for proj4 (the strings epsg.io publishes).
 * Areas of use are EPSG's bounding boxes, rounded outward to 0.01°; they serve plausibility checks
 * and the searchable list, not geodesy.
 * `+towgs84` parameters are 7-parameter approximations: converting between two different datums
 * through them is good to about a metre, not to centimetres, so an audit should keep both files on
 * one datum (see `datumShiftBetween`).
 */

/** Area of use as [west, south, east, north] in degrees. */
export type LonLatBox = readonly [number, number, number, number];

/** One coordinate reference system. */
export interface CrsEntry {
  /** "EPSG:32632", or "custom" for a user's proj string. */
  code: string;
  name: string;
  kind: "geographic" | "projected";
  proj4: string;
  /** Area of use (lon/lat degrees). */
  area: LonLatBox;
}

const WGS84_GEO = "+proj=longlat +datum=WGS84 +no_defs";
const ETRS89_GEO = "+proj=longlat +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +no_defs";

function utmEntries(): CrsEntry[] {
  const out: CrsEntry[] = [];
  for (let z = 1; z <= 60; z++) {
    const west = -180 + (z - 1) * 6;
    out.push({
      code: `EPSG:${32600 + z}`,
      name: `WGS 84 / UTM zone ${z}N`,
      kind: "projected",
      proj4: `+proj=utm +zone=${z} +datum=WGS84 +units=m +no_defs`,
      area: [west, 0, west + 6, 84],
    });
    out.push({
      code: `EPSG:${32700 + z}`,
      name: `WGS 84 / UTM zone ${z}S`,
      kind: "projected",
      proj4: `+proj=utm +zone=${z} +south +datum=WGS84 +units=m +no_defs`,
      area: [west, -80, west + 6, 0],
    });
  }
  for (let z = 28; z <= 38; z++) {
    const west = -180 + (z - 1) * 6;
    out.push({
      code: `EPSG:${25800 + z}`,
      name: `ETRS89 / UTM zone ${z}N`,
      kind: "projected",
      proj4: `+proj=utm +zone=${z} +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs`,
      // Europe within the zone's 6° band (EPSG gives per-zone polygons; this box is their envelope).
      area: [west, 34, west + 6, 84],
    });
  }
  return out;
}

const NATIONAL: CrsEntry[] = [
  {
    code: "EPSG:27700",
    name: "OSGB 1936 / British National Grid",
    kind: "projected",
    proj4:
      "+proj=tmerc +lat_0=49 +lon_0=-2 +k=0.9996012717 +x_0=400000 +y_0=-100000 +ellps=airy +towgs84=446.448,-125.157,542.06,0.15,0.247,0.842,-20.489 +units=m +no_defs",
    area: [-9.01, 49.75, 2.01, 61.01],
  },
  {
    code: "EPSG:28992",
    name: "Amersfoort / RD New",
    kind: "projected",
    proj4:
      "+proj=sterea +lat_0=52.1561605555556 +lon_0=5.38763888888889 +k=0.9999079 +x_0=155000 +y_0=463000 +ellps=bessel +towgs84=565.4171,50.3319,465.5524,1.9342,-1.6677,9.1019,4.0725 +units=m +no_defs",
    area: [3.2, 50.75, 7.22, 53.7],
  },
  {
    code: "EPSG:2193",
    name: "NZGD2000 / New Zealand Transverse Mercator 2000",
    kind: "projected",
    proj4:
      "+proj=tmerc +lat_0=0 +lon_0=173 +k=0.9996 +x_0=1600000 +y_0=10000000 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs",
    area: [166.37, -47.33, 178.63, -34.1],
  },
  {
    code: "EPSG:3035",
    name: "ETRS89-extended / LAEA Europe",
    kind: "projected",
    proj4:
      "+proj=laea +lat_0=52 +lon_0=10 +x_0=4321000 +y_0=3210000 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs",
    area: [-35.58, 24.6, 44.83, 84.73],
  },
  {
    code: "EPSG:2056",
    name: "CH1903+ / LV95",
    kind: "projected",
    proj4:
      "+proj=somerc +lat_0=46.9524055555556 +lon_0=7.43958333333333 +k_0=1 +x_0=2600000 +y_0=1200000 +ellps=bessel +towgs84=674.374,15.056,405.346,0,0,0,0 +units=m +no_defs",
    area: [5.96, 45.82, 10.49, 47.81],
  },
  {
    code: "EPSG:31467",
    name: "DHDN / 3-degree Gauss-Kruger zone 3",
    kind: "projected",
    proj4:
      "+proj=tmerc +lat_0=0 +lon_0=9 +k=1 +x_0=3500000 +y_0=0 +ellps=bessel +towgs84=598.1,73.7,418.2,0.202,0.045,-2.455,6.7 +units=m +no_defs",
    area: [7.5, 47.27, 10.51, 55.09],
  },
  {
    code: "EPSG:3006",
    name: "SWEREF99 TM",
    kind: "projected",
    proj4: "+proj=utm +zone=33 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs",
    area: [10.03, 54.96, 24.17, 69.07],
  },
  {
    code: "EPSG:2154",
    name: "RGF93 v1 / Lambert-93",
    kind: "projected",
    proj4:
      "+proj=lcc +lat_0=46.5 +lon_0=3 +lat_1=49 +lat_2=44 +x_0=700000 +y_0=6600000 +ellps=GRS80 +towgs84=0,0,0,0,0,0,0 +units=m +no_defs",
    area: [-9.86, 41.15, 10.38, 51.56],
  },
];

const ENTRIES: readonly CrsEntry[] = [
  { code: "EPSG:4326", name: "WGS 84", kind: "geographic", proj4: WGS84_GEO, area: [-180, -90, 180, 90] },
  { code: "EPSG:4258", name: "ETRS89", kind: "geographic", proj4: ETRS89_GEO, area: [-16.1, 32.88, 40.18, 84.73] },
  ...NATIONAL,
  ...utmEntries(),
];

const BY_CODE = new Map(ENTRIES.map((e) => [e.code, e]));

/**
 * All bundled CRSs (WGS 84, ETRS89, WGS 84 UTM 1N–60N and 1S–60S, ETRS89 UTM 28N–38N, national grids).
 * @example listCrs().length // 2 + 8 + 120 + 11 = 141
 */
export function listCrs(): readonly CrsEntry[] {
  return ENTRIES;
}

/**
 * Searches the bundled CRSs by code or words of the name (case-insensitive; every word must match).
 * Entries whose area contains `near` (lon, lat) come first.
 * @example findCrs("utm 32")[0].code // "EPSG:32632"
 * @example findCrs("27700")[0].name // "OSGB 1936 / British National Grid"
 */
export function findCrs(query: string, near?: { lon: number; lat: number }): CrsEntry[] {
  const words = query
    .toLowerCase()
    .replace(/epsg:?/g, "")
    .split(/[\s,/]+/)
    .filter(Boolean);
  const hits = ENTRIES.filter((e) => {
    const hay = `${e.code.toLowerCase()} ${e.name.toLowerCase()}`;
    return words.every((w) =>
      /^\d+$/.test(w) ? new RegExp(`(^|\\D)${w}(\\D|$)`).test(hay) || e.code.endsWith(`:${w}`) : hay.includes(w),
    );
  });
  // Exact code matches first, then those covering `near`.
  const exact = (e: CrsEntry) => words.length === 1 && e.code.endsWith(`:${words[0]}`);
  return hits
    .map((e, i) => ({ e, i, rank: (exact(e) ? 0 : 2) + (near && containsLonLat(e.area, near.lon, near.lat) ? 0 : 1) }))
    .sort((a, b) => a.rank - b.rank || a.i - b.i)
    .map((h) => h.e);
}

/** True when (lon, lat) lies in the box, with `margin` degrees of slack. */
export function containsLonLat(area: LonLatBox, lon: number, lat: number, margin = 0): boolean {
  return lon >= area[0] - margin && lon <= area[2] + margin && lat >= area[1] - margin && lat <= area[3] + margin;
}

/**
 * Resolves a CRS given as "EPSG:n", a bare number, "auto"-free names such as "WGS84", or a custom
 * proj string ("+proj=..."). Throws `unknown CRS "<text>"` for anything else.
 * A custom string becomes an entry with code "custom", kind from `+proj=longlat`, and the whole world as area.
 *
 * @example resolveCrs("EPSG:25832").name // "ETRS89 / UTM zone 32N"
 * @example resolveCrs("+proj=utm +zone=33 +datum=WGS84").kind // "projected"
 */
export function resolveCrs(spec: string): CrsEntry {
  const s = spec.trim();
  if (s.startsWith("+")) {
    if (!/\+proj=\w+/.test(s)) throw new Error(`unknown CRS "${spec}": a proj string needs +proj=...`);
    const geographic = /\+proj=(longlat|latlong|lonlat|latlon)\b/.test(s);
    return {
      code: "custom",
      name: `Custom: ${s}`,
      kind: geographic ? "geographic" : "projected",
      proj4: s,
      area: [-180, -90, 180, 90],
    };
  }
  const alias: Record<string, string> = {
    wgs84: "EPSG:4326",
    "wgs 84": "EPSG:4326",
    etrs89: "EPSG:4258",
    crs84: "EPSG:4326",
  };
  const key = alias[s.toLowerCase()] ?? (/^\d+$/.test(s) ? `EPSG:${s}` : s.toUpperCase().replace(/^EPSG::?/, "EPSG:"));
  const hit = BY_CODE.get(key);
  if (!hit)
    throw new Error(
      `unknown CRS "${spec}": expected one of the bundled EPSG codes (e.g. EPSG:4326, EPSG:32632, EPSG:25832, EPSG:27700) or a proj string starting with +proj=`,
    );
  return hit;
}

/**
 * WGS 84 UTM zone for a longitude/latitude (standard 6° zones, no Norway/Svalbard exceptions;
 * EPSG 326zz north of the equator, 327zz south).
 * Zone = floor((lon + 180) / 6) + 1, clamped to 1..60 (UTM definition; common practice, no source).
 * @example utmFor(9.2, 52.1).code // "EPSG:32632"
 * @example utmFor(172.7, -34.4).code // "EPSG:32759"
 */
export function utmFor(lon: number, lat: number): CrsEntry {
  const l = ((((lon + 180) % 360) + 360) % 360) - 180;
  const zone = Math.min(60, Math.max(1, Math.floor((l + 180) / 6) + 1));
  return BY_CODE.get(`EPSG:${(lat < 0 ? 32700 : 32600) + zone}`)!;
}

/**
 * The geographic (lon/lat) CRS on the same datum as a CRS: its `+ellps`/`+datum`/`+towgs84`/`+a`/`+b`
 * parameters with `+proj=longlat`. Converting between the two involves no datum shift.
 * @example geographicOf(resolveCrs("EPSG:27700").proj4) // "+proj=longlat +ellps=airy +towgs84=446.448,... +no_defs"
 */
export function geographicOf(proj4: string): string {
  const keep = proj4.split(/\s+/).filter((t) => /^\+(ellps|datum|towgs84|a|b|rf|f|R|pm|nadgrids)=/.test(t));
  return ["+proj=longlat", ...keep, "+no_defs"].join(" ");
}

/** Datum description of a proj string: ellipsoid/datum name and towgs84 parameters. */
function datumKey(proj4: string): string {
  const get = (k: string) => new RegExp(`\\+${k}=(\\S+)`).exec(proj4)?.[1];
  const datum = get("datum");
  if (datum === "WGS84") return "WGS84";
  const towgs = get("towgs84");
  const ellps = get("ellps") ?? (get("a") ? `a${get("a")}` : undefined);
  if (towgs !== undefined && /^0(,0)*$/.test(towgs.replace(/\.0+/g, "")) && (ellps === "GRS80" || ellps === "WGS84"))
    return "WGS84";
  return `${datum ?? ""}|${ellps ?? ""}|${towgs ?? ""}`;
}

/**
 * True when converting between the two CRSs shifts the datum with 7-parameter approximations
 * (e.g. OSGB 1936 ↔ WGS 84, about a metre of uncertainty), so relative accuracy at the centimetre
 * level is not preserved. ETRS89 and WGS 84 are treated as one datum, as proj4 does (they differ by
 * well under a metre but by more than a centimetre today; common practice, no source).
 * @example datumShiftBetween(resolveCrs("EPSG:27700").proj4, resolveCrs("EPSG:4326").proj4) // true
 */
export function datumShiftBetween(a: string, b: string): boolean {
  return datumKey(a) !== datumKey(b);
}

/** True when two proj strings describe the same conversion (same tokens, any order). */
export function sameDefinition(a: string, b: string): boolean {
  const norm = (s: string) =>
    s
      .trim()
      .split(/\s+/)
      .filter((t) => t !== "+no_defs" && t !== "+type=crs")
      .sort()
      .join(" ");
  return norm(a) === norm(b);
}
