import proj4 from "proj4";
import { geographicOf, resolveCrs, sameDefinition, utmFor, type CrsEntry } from "../crs/registry";
import type { PointTable, ProjectedTable } from "../types";
import { isTransverseMercator, transverseMercatorForward } from "./transverse-mercator";

/** A CRS given as an entry or as text ("EPSG:n", proj string). */
export type CrsLike = CrsEntry | string;

function entry(c: CrsLike): CrsEntry {
  return typeof c === "string" ? resolveCrs(c) : c;
}

/** proj4 converters are costly to build: cache them per (from, to) pair. */
const converters = new Map<string, proj4.Converter>();

function converter(from: string, to: string): proj4.Converter {
  const key = `${from}\u0000${to}`;
  let c = converters.get(key);
  if (!c) {
    c = proj4(from, to);
    converters.set(key, c);
  }
  return c;
}

/** The part of a proj4 projection object the fast path uses. */
interface ProjObject {
  projName?: string;
  to_meter?: number;
  from_greenwich?: number;
  axis?: string;
  forward(p: { x: number; y: number }): { x: number; y: number } | undefined;
}

const projObjects = new Map<string, ProjObject>();

function projObject(def: string): ProjObject {
  let o = projObjects.get(def);
  if (!o) {
    o = new proj4.Proj(def) as unknown as ProjObject;
    projObjects.set(def, o);
  }
  return o;
}

const D2R = Math.PI / 180;

/**
 * Converts coordinate arrays from one CRS to another with proj4 (one converter, one reused point,
 * a plain loop). Geographic coordinates are [longitude, latitude] in degrees, projected ones
 * [easting, northing] in metres. NaN in gives NaN out; a point proj4 cannot convert gives NaN.
 * Returns the input arrays themselves when both definitions are identical (no copy, nothing changes).
 *
 * Fast path: from a geographic CRS into a projected one in metres, the projection's own `forward`
 * is called on radians directly, skipping proj4's per-point wrapping (about 1.5× faster). It is used
 * only when it reproduces proj4's full conversion exactly on up to 16 points of the data (so a datum
 * shift, which the fast path would skip, always takes the full path).
 *
 * Source of the projection formulas: proj4js (Poder/Engsager transverse Mercator, EPSG oblique
 * stereographic, Snyder's equal-area azimuthal), checked in index.test.ts against IOGP 373-7-2
 * worked examples, LINZ NZTM data and proj4js test points.
 *
 * @example
 * const [e, n] = convertArrays(new Float64Array([-177]), new Float64Array([60]), "EPSG:4326", "EPSG:32601");
 * // e[0] ≈ 500000, n[0] ≈ 6651411.19
 */
export function convertArrays(
  x: Float64Array,
  y: Float64Array,
  from: CrsLike,
  to: CrsLike,
): [Float64Array, Float64Array] {
  const fe = entry(from),
    te = entry(to);
  const f = fe.proj4,
    t = te.proj4;
  if (sameDefinition(f, t)) return [x, y];
  const c = converter(f, t);
  const n = x.length;
  const ox = new Float64Array(n),
    oy = new Float64Array(n);
  const slow = (i: number, p: number[]) => {
    const xi = x[i],
      yi = y[i];
    if (xi !== xi || yi !== yi) {
      ox[i] = NaN;
      oy[i] = NaN;
      return;
    }
    p[0] = xi;
    p[1] = yi;
    let r: number[];
    try {
      r = c.forward(p);
    } catch {
      ox[i] = NaN;
      oy[i] = NaN;
      return;
    }
    ox[i] = Number.isFinite(r[0]) ? r[0] : NaN;
    oy[i] = Number.isFinite(r[1]) ? r[1] : NaN;
  };
  const p = [0, 0];
  if (fe.kind === "geographic" && te.kind === "projected" && n >= 64 && fastPathAgrees(x, y, f, t, c)) {
    const dest = projObject(t);
    if (isTransverseMercator(dest)) {
      // Whole arrays at once (UTM and other transverse Mercator targets: nearly every field); bit-for-bit proj4.
      transverseMercatorForward(dest, x, y, D2R, ox, oy);
      for (let i = 0; i < n; i++) {
        const xi = x[i],
          yi = y[i];
        if (xi !== xi || yi !== yi || yi > 90 || yi < -90 || !(ox[i] - ox[i] === 0) || !(oy[i] - oy[i] === 0))
          slow(i, p);
      }
      return [ox, oy];
    }
    const pt = { x: 0, y: 0 };
    for (let i = 0; i < n; i++) {
      const xi = x[i],
        yi = y[i];
      if (xi !== xi || yi !== yi || yi > 90 || yi < -90) {
        slow(i, p);
        continue;
      }
      pt.x = xi * D2R;
      pt.y = yi * D2R;
      const r = dest.forward(pt);
      if (!r || !(r.x - r.x === 0) || !(r.y - r.y === 0)) {
        slow(i, p);
        continue;
      }
      ox[i] = r.x;
      oy[i] = r.y;
    }
    return [ox, oy];
  }
  for (let i = 0; i < n; i++) slow(i, p);
  return [ox, oy];
}

/** True when calling the target projection's `forward` on radians equals proj4's full conversion on sample points. */
function fastPathAgrees(x: Float64Array, y: Float64Array, f: string, t: string, c: proj4.Converter): boolean {
  const src = projObject(f),
    dest = projObject(t);
  if (src.projName !== "longlat" || src.from_greenwich || dest.from_greenwich) return false;
  if ((dest.to_meter !== undefined && dest.to_meter !== 1) || (dest.axis !== undefined && dest.axis !== "enu"))
    return false;
  const n = x.length;
  let checked = 0;
  for (let k = 0; k < 16; k++) {
    const i = Math.floor(((k + 0.5) * n) / 16);
    if (!Number.isFinite(x[i]) || !Number.isFinite(y[i]) || Math.abs(y[i]) > 90) continue;
    let full: number[];
    try {
      full = c.forward([x[i], y[i]]);
    } catch {
      return false;
    }
    const r = dest.forward({ x: x[i] * D2R, y: y[i] * D2R });
    if (!r || r.x !== full[0] || r.y !== full[1]) return false;
    checked++;
  }
  return checked > 0;
}

/**
 * Converts one point. @example convertPoint(6, 53, "+proj=longlat +ellps=bessel +towgs84=565.4171,50.3319,465.5524,1.9342,-1.6677,9.1019,4.0725", "EPSG:28992") // ≈ [196105.283, 557057.739]
 */
export function convertPoint(x: number, y: number, from: CrsLike, to: CrsLike): [number, number] {
  const [ox, oy] = convertArrays(new Float64Array([x]), new Float64Array([y]), from, to);
  return [ox[0], oy[0]];
}

/**
 * Longitude/latitude (degrees, on the CRS's own datum) of a point given in a CRS; no datum shift.
 * @example toLonLat(500000, 6651411.19, "EPSG:32601") // ≈ [-177, 60]
 */
export function toLonLat(x: number, y: number, crs: CrsLike): [number, number] {
  const e = entry(crs);
  if (e.kind === "geographic") return [x, y];
  return convertPoint(x, y, e, { ...e, kind: "geographic", proj4: geographicOf(e.proj4) });
}

/**
 * Projects a table from its CRS into the work CRS (metres). Also projects raw GNSS positions.
 * The input table is not changed; when no conversion is needed the coordinate arrays are shared.
 * Points that cannot be converted become NaN (validation reports them).
 *
 * @example
 * const p = projectTable(table, "EPSG:4326", "EPSG:32632"); // p.crs === "EPSG:32632"
 */
export function projectTable(table: PointTable, from: CrsLike, to: CrsLike): ProjectedTable {
  const f = entry(from),
    t = entry(to);
  if (t.kind !== "projected") throw new Error(`work CRS "${t.code}" is geographic; expected a projected CRS in metres`);
  const [x, y] = convertArrays(table.x, table.y, f, t);
  let rawX = table.rawX,
    rawY = table.rawY;
  if (rawX && rawY) [rawX, rawY] = convertArrays(rawX, rawY, f, t);
  return { ...table, x, y, rawX, rawY, crs: t.code === "custom" ? t.proj4 : t.code };
}

/**
 * Median of a coordinate array over finite values, estimated from at most 20 001 evenly spaced
 * samples (deterministic). Robust to a few stray points such as 0,0 fixes.
 * @example medianOf(new Float64Array([1, 2, 100])) // 2
 */
export function medianOf(a: Float64Array): number {
  const n = a.length;
  const step = Math.max(1, Math.floor(n / 20001));
  // A typed array sorts numerically without a comparator: ten times faster than an array of numbers.
  const all = new Float64Array(Math.ceil(n / step));
  let k = 0;
  for (let i = 0; i < n; i += step) if (Number.isFinite(a[i])) all[k++] = a[i];
  if (k === 0) return NaN;
  const s = all.subarray(0, k).sort();
  const m = k >> 1;
  return k % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/**
 * Median position of a table converted to longitude/latitude on the table's own datum.
 * @example centreLonLat(table, "EPSG:25832") // [9.2, 52.1]
 */
export function centreLonLat(table: PointTable, crs: CrsLike): [number, number] {
  return toLonLat(medianOf(table.x), medianOf(table.y), crs);
}

/**
 * The work CRS: the given one, or for "auto" the WGS 84 UTM zone (north or south) that contains
 * the median position of the tables (averaged over the tables given).
 * Throws `cannot choose a work CRS: no finite positions` when there is nothing to go by.
 *
 * @example resolveWorkCrs("auto", [{ table, crs: "EPSG:4326" }]).code // "EPSG:32632" for a field near 9.2°E, 52.1°N
 */
export function resolveWorkCrs(spec: string, tables: readonly { table: PointTable; crs: CrsLike }[]): CrsEntry {
  if (spec.trim().toLowerCase() !== "auto") {
    const e = resolveCrs(spec);
    if (e.kind !== "projected")
      throw new Error(`work CRS "${spec}" is geographic; expected a projected CRS in metres, or auto`);
    return e;
  }
  let lon = 0,
    lat = 0,
    k = 0;
  for (const { table, crs } of tables) {
    const [l, b] = centreLonLat(table, crs);
    if (Number.isFinite(l) && Number.isFinite(b)) {
      lon += l;
      lat += b;
      k++;
    }
  }
  if (k === 0) throw new Error("cannot choose a work CRS: no finite positions");
  return utmFor(lon / k, lat / k);
}
