/**
 * The header of an audit's map payload from what the server has read: local origin, outline (the field boundary
 * projected into the work CRS, else the convex hull of the records), grid convergence, row bearing and profile.
 * Pure (projection through geo/).
 */
import { convertArrays, toLonLat } from "@/geo";
import type { AuditDto } from "@/lib/api-types";
import { chooseOrigin } from "./build";
import { mapProfile } from "./field-summary";
import { convexHull } from "./geometry";
import { gridConvergenceDeg } from "./view";
import type { DictName, MapArrays, MapMeta } from "./types";

export interface Box {
  minE: number;
  maxE: number;
  minN: number;
  maxN: number;
}

/**
 * Outer ring of a WGS 84 GeoJSON polygon projected into `workCrs`, flat [E0, N0, E1, N1, …] without the closing
 * point; null when there is no polygon or a vertex cannot be projected.
 * @example projectBoundary({ type: "Polygon", coordinates: [[[5.39, 52.51], [5.40, 52.51], [5.40, 52.52], [5.39, 52.51]]] }, "EPSG:25831")
 */
export function projectBoundary(polygon: GeoJSON.Polygon | null, workCrs: string): number[] | null {
  const ring = polygon?.type === "Polygon" ? polygon.coordinates[0] : null;
  if (!ring || ring.length < 3) return null;
  const closed = ring.length > 3 && ring[0][0] === ring[ring.length - 1][0] && ring[0][1] === ring[ring.length - 1][1];
  const pts = closed ? ring.slice(0, -1) : ring;
  const [e, n] = convertArrays(
    Float64Array.from(pts, (p) => p[0]),
    Float64Array.from(pts, (p) => p[1]),
    "EPSG:4326",
    workCrs,
  );
  const out: number[] = [];
  for (let i = 0; i < e.length; i++) {
    if (!Number.isFinite(e[i]) || !Number.isFinite(n[i])) return null;
    out.push(e[i], n[i]);
  }
  return out;
}

/** Bounding box of the records' extent and a flat E/N ring together. */
export function unionBox(extent: Box | null, ring: number[] | null): Box | null {
  let box = extent ? { ...extent } : null;
  for (let i = 0; ring && i + 1 < ring.length; i += 2) {
    const e = ring[i],
      n = ring[i + 1];
    box = box
      ? {
          minE: Math.min(box.minE, e),
          maxE: Math.max(box.maxE, e),
          minN: Math.min(box.minN, n),
          maxN: Math.max(box.maxN, n),
        }
      : { minE: e, maxE: e, minN: n, maxN: n };
  }
  return box;
}

/** Local origin for the records' extent and the boundary. */
export function originFor(extent: Box | null, boundaryEN: number[] | null): [number, number] {
  return chooseOrigin(unionBox(extent, boundaryEN));
}

/**
 * Angle from true north to grid north at a point of a projected CRS (degrees, + when grid north is east of true
 * north), from the point and one 100 m grid north of it; null when the CRS cannot be inverted there.
 */
export function convergenceAt(e: number, n: number, crs: string): number | null {
  try {
    const a = toLonLat(e, n, crs),
      b = toLonLat(e, n + 100, crs);
    if (![...a, ...b].every(Number.isFinite)) return null;
    return gridConvergenceDeg(a, b);
  } catch {
    return null;
  }
}

/** Everything of the header that is not the array table. */
export function mapMeta(input: {
  audit: AuditDto;
  field: {
    bedSpacingM: number | null;
    rowsPerBed: number | null;
    rowSpacingM: number | null;
    fieldRowBearingDeg: number | null;
  };
  origin: [number, number];
  boundaryEN: number[] | null;
  arrays: MapArrays;
  dict: Record<DictName, string[]>;
}): MapMeta {
  const { audit, origin, boundaryEN, arrays } = input;
  const crs = audit.settings?.workCrs ?? audit.summary?.crs ?? audit.field.crs;
  let boundary: MapMeta["boundary"];
  if (boundaryEN) {
    boundary = { source: "field", ring: boundaryEN.map((v, i) => v - origin[i % 2]) };
  } else {
    // Hull of every record drawn: paired plants and planted records without a checkpoint.
    const planted: number[] = [];
    for (let i = 0; i < arrays.unpairedKind.length; i++)
      if (arrays.unpairedKind[i] === 0) planted.push(arrays.unpairedXY[2 * i], arrays.unpairedXY[2 * i + 1]);
    const all = new Float32Array(arrays.pairXY.length + planted.length);
    all.set(arrays.pairXY, 0);
    all.set(planted, arrays.pairXY.length);
    const hull = convexHull(all);
    boundary = hull.length >= 3 ? { source: "records", ring: hull.flat() } : { source: "none", ring: [] };
  }
  return {
    audit: {
      id: audit.id,
      title: audit.title,
      state: audit.state,
      fieldId: audit.field.id,
      fieldName: audit.field.name,
      computedAt: audit.computedAt,
    },
    crs,
    origin,
    gridConvergenceDeg: convergenceAt(origin[0], origin[1], crs),
    rowBearingDeg:
      audit.settings?.rowBearingDeg ?? audit.summary?.rowBearingDeg ?? input.field.fieldRowBearingDeg ?? null,
    field: {
      bedSpacingM: input.field.bedSpacingM,
      rowsPerBed: input.field.rowsPerBed,
      rowSpacingM: input.field.rowSpacingM,
    },
    boundary,
    profile: mapProfile(audit.profile),
    pairs: arrays.pairFlags.length,
    unpaired: arrays.unpairedKind.length,
    dict: input.dict,
  };
}
