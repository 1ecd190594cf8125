/**
 * Stakeout files of a plan: a plain CSV in the field's CRS and a GeoJSON FeatureCollection. Pure; columns are ours.
 */
import type { PlanPointDto } from "./dto";

/** Columns of the stakeout CSV, in order. */
export const STAKEOUT_COLUMNS = [
  "point",
  "easting",
  "northing",
  "plant_id",
  "crop",
  "bed",
  "row",
  "arm",
  "kind",
] as const;

/** A CSV cell: quoted when it holds a comma, quote or line break (RFC 4180 §2). */
function cell(v: string | number | null): string {
  const s = v === null ? "" : String(v);
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/**
 * The stakeout CSV: one line per point, easting/northing in the field's CRS to the millimetre, CRLF line ends
 * (RFC 4180). `kind` is "checkpoint" or "spare".
 *
 * @example stakeoutCsv([{ seq: 1, name: "C0001-B1", e: 662410.1234, n: 5821330.5, plantId: "LA-1-1-0006", … }])
 */
export function stakeoutCsv(points: readonly PlanPointDto[]): string {
  const lines = [STAKEOUT_COLUMNS.join(",")];
  for (const p of points)
    lines.push(
      [p.name, p.e.toFixed(3), p.n.toFixed(3), p.plantId, p.crop, p.bed, p.row, p.arm, p.spare ? "spare" : "checkpoint"]
        .map(cell)
        .join(","),
    );
  return `${lines.join("\r\n")}\r\n`;
}

/**
 * The stakeout GeoJSON: Points in WGS 84 longitude/latitude (RFC 7946 §4 requires it), each with its name, plant,
 * kind and the easting/northing in the field's CRS as properties. `lonLat[i]` belongs to `points[i]`.
 */
export function stakeoutGeoJson(
  points: readonly PlanPointDto[],
  lonLat: readonly [number, number][],
  meta: { plan: string; crs: string },
): object {
  if (lonLat.length !== points.length) throw new Error("stakeout: one longitude/latitude per point is needed");
  return {
    type: "FeatureCollection",
    properties: { plan: meta.plan, crs: meta.crs },
    features: points.map((p, i) => ({
      type: "Feature",
      geometry: { type: "Point", coordinates: [Number(lonLat[i][0].toFixed(9)), Number(lonLat[i][1].toFixed(9))] },
      properties: {
        point: p.name,
        plant_id: p.plantId,
        kind: p.spare ? "spare" : "checkpoint",
        stratum: p.stratum,
        easting: Number(p.e.toFixed(3)),
        northing: Number(p.n.toFixed(3)),
        crop: p.crop,
        bed: p.bed,
        row: p.row,
        arm: p.arm,
      },
    })),
  };
}
