/**
 * A uniform grid of square cells over points, for "which points lie within r of (x, y)" when r is known
 * before the grid is built (pairing: the largest pairing distance). Cells are at least r wide, so a query
 * reads the cells its 2r × 2r box touches; points are kept in cell order (counting sort), so a query
 * reads a few short runs of consecutive memory. Building is O(n), a k-d tree's O(n log n).
 */

/** Cells per point, at most: bounds the grid's memory when points are sparse. */
const CELLS_PER_POINT = 4;
/** Points per occupied cell, at most, on average: beyond this a query reads too many points and a k-d tree is faster. */
const MAX_OCCUPANCY = 24;

export interface CellGrid {
  /** Writes into `out` the indices (0 … n − 1, in build order) of the points within `r` of (qx, qy); returns how many. `r` must not exceed the radius the grid was built for. */
  withinInto(qx: number, qy: number, r: number, out: number[]): number;
}

/**
 * Grid over the points `x[at[j]], y[at[j]]` (finite), answering queries of radius up to `radius`. Returns null
 * when occupied cells would hold more than MAX_OCCUPANCY points on average (points spread over a vast area,
 * e.g. a stray fix kilometres from a dense field, so the cells must be wide): a k-d tree is better there.
 *
 * @example
 * const g = buildCellGrid(px, py, Int32Array.of(0, 1, 2), 0.1);
 * g?.withinInto(500000.02, 5800000.0, 0.1, out); // indices into [0, 1, 2]
 */
export function buildCellGrid(x: Float64Array, y: Float64Array, at: Int32Array, radius: number): CellGrid | null {
  const n = at.length;
  if (n === 0 || !(radius > 0)) return null;
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (let j = 0; j < n; j++) {
    const px = x[at[j]],
      py = y[at[j]];
    if (px < minX) minX = px;
    if (px > maxX) maxX = px;
    if (py < minY) minY = py;
    if (py > maxY) maxY = py;
  }
  const w = maxX - minX,
    h = maxY - minY;
  const maxCells = Math.max(1024, CELLS_PER_POINT * n);
  let cell = Math.max(radius, Math.sqrt((w * h) / maxCells));
  // the area bound misses long thin strips (a single row): widen until the count holds
  while ((Math.floor(w / cell) + 1) * (Math.floor(h / cell) + 1) > maxCells) cell *= 1.25;
  const nx = Math.floor(w / cell) + 1,
    ny = Math.floor(h / cell) + 1;
  const inv = 1 / cell;
  const cellOf = new Int32Array(n);
  const first = new Int32Array(nx * ny + 1);
  for (let j = 0; j < n; j++) {
    const c = Math.floor((y[at[j]] - minY) * inv) * nx + Math.floor((x[at[j]] - minX) * inv);
    cellOf[j] = c;
    first[c + 1]++;
  }
  let occupied = 0;
  for (let c = 1; c < first.length; c++) if (first[c] > 0) occupied++;
  if (n > MAX_OCCUPANCY * occupied) return null;
  for (let c = 1; c < first.length; c++) first[c] += first[c - 1];
  const order = new Int32Array(n);
  const next = first.slice(0, nx * ny);
  for (let j = 0; j < n; j++) order[next[cellOf[j]]++] = j;
  const gx = new Float64Array(n),
    gy = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    gx[k] = x[at[order[k]]];
    gy[k] = y[at[order[k]]];
  }

  return {
    withinInto(qx, qy, r, out) {
      if (r > radius) throw new Error(`cell grid built for radius ${radius}, queried with ${r}`);
      const r2 = r * r;
      const x0 = Math.max(0, Math.floor((qx - r - minX) * inv)),
        x1 = Math.min(nx - 1, Math.floor((qx + r - minX) * inv));
      const y0 = Math.max(0, Math.floor((qy - r - minY) * inv)),
        y1 = Math.min(ny - 1, Math.floor((qy + r - minY) * inv));
      let count = 0;
      for (let cy = y0; cy <= y1; cy++) {
        // cells x0 … x1 of one grid row are consecutive in memory
        const from = first[cy * nx + x0],
          to = first[cy * nx + x1 + 1];
        for (let k = from; k < to; k++) {
          const dx = gx[k] - qx,
            dy = gy[k] - qy;
          if (dx * dx + dy * dy <= r2) out[count++] = order[k];
        }
      }
      return count;
    },
  };
}
