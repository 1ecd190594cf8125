/**
 * What the plan's map draws besides the plan itself: every as-planted record of the plan's dataset, faint, as
 * positions in the field's CRS relative to one origin (whole metres), in centimetres — small integers in JSON, and
 * float32-safe on the GPU. Pure; our own format (README API table, `GET /api/plans/:id/records`).
 */

export interface PlanRecordsPayload {
  /** The field's CRS code the positions are in. */
  crs: string;
  /** Whole-metre easting/northing subtracted from every position. */
  origin: [number, number];
  /** Records with a position. */
  count: number;
  /** Records left out for want of a finite position. */
  unplaced: number;
  /** Interleaved easting, northing of each record relative to `origin`, in centimetres (rounded). */
  xy: number[];
}

/**
 * The records payload from easting/northing arrays (metres, field CRS). The origin is the lower-left corner of the
 * records and the plan's points, floored to whole metres, so every offset is non-negative.
 *
 * @example planRecordsPayload("EPSG:25831", [320600.123], [5814900.5], [{ e: 320601, n: 5814901 }]).xy // [12, 50]
 */
export function planRecordsPayload(
  crs: string,
  e: ArrayLike<number>,
  n: ArrayLike<number>,
  planPoints: readonly { e: number; n: number }[],
): PlanRecordsPayload {
  let minE = Number.POSITIVE_INFINITY;
  let minN = Number.POSITIVE_INFINITY;
  let unplaced = 0;
  for (let i = 0; i < e.length; i++) {
    if (!Number.isFinite(e[i]) || !Number.isFinite(n[i])) continue;
    if (e[i] < minE) minE = e[i];
    if (n[i] < minN) minN = n[i];
  }
  for (const p of planPoints) {
    if (p.e < minE) minE = p.e;
    if (p.n < minN) minN = p.n;
  }
  const origin: [number, number] = Number.isFinite(minE) ? [Math.floor(minE), Math.floor(minN)] : [0, 0];
  const xy: number[] = [];
  for (let i = 0; i < e.length; i++) {
    if (!Number.isFinite(e[i]) || !Number.isFinite(n[i])) {
      unplaced++;
      continue;
    }
    xy.push(Math.round((e[i] - origin[0]) * 100), Math.round((n[i] - origin[1]) * 100));
  }
  return { crs, origin, count: xy.length / 2, unplaced, xy };
}
