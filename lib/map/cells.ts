/**
 * The growers' aggregated layer: checkpoints gathered into cells that follow the beds — one cell per bed across the
 * row and `lengthM` along it — with the mean error and the share out of tolerance of each cell. Cells aligned with
 * the beds answer "which stretch of which bed" directly, which a grid aligned with grid north would not when the rows
 * run at an angle. Without bed settings the cells are squares of `lengthM` in the row frame.
 */
import { PAIR_FLAG } from "./types";
import { fromRowFrame, rowAxes, type Pt } from "./geometry";

export interface Cell {
  /** Cross-row bin (bed index from the first bed, or square column) and along-row bin. */
  across: number;
  along: number;
  /** Bed label when the cell is a stretch of a known bed, else "". */
  bed: string;
  /** Along-row range of the cell, metres in the row frame. */
  from: number;
  to: number;
  polygon: Pt[];
  /** Checkpoints in the cell. */
  n: number;
  /** Mean of the finite values, metres; NaN when none. */
  mean: number;
  /** Checkpoints with a tolerance verdict, and of them out of tolerance. */
  known: number;
  out: number;
  /** out / known; null when no verdict is known. */
  shareOut: number | null;
}

export interface CellBeds {
  /** Bed centres across the row (as in BedLayout), in order, on a grid `spacingM` apart (beds may be missing). */
  centres: { label: string; centre: number }[];
  spacingM: number;
  /** Half the width of a bed's top, metres. */
  halfWidth: number;
}

const OFFSET = 1 << 15;

/**
 * Aggregates pairs into cells. `values` are per pair (e.g. radial error, metres), `flags` the payload's pair flags;
 * `indices` selects pairs (all when omitted). `bearingDeg` null means rows are taken to run grid north.
 *
 * @example aggregateCells({ xy: Float32Array.of(0.5, 0.5, 0.6, 1.5), values: Float32Array.of(0.002, 0.004), flags: Uint8Array.of(3, 1),
 *   bearingDeg: 0, lengthM: 1, beds: null }) // two cells along x ∈ [0, 1): y ∈ [0, 1) mean 2 mm, y ∈ [1, 2) share out 1
 */
export function aggregateCells(input: {
  xy: ArrayLike<number>;
  values: ArrayLike<number>;
  flags: ArrayLike<number>;
  indices?: ArrayLike<number>;
  bearingDeg: number | null;
  lengthM: number;
  beds: CellBeds | null;
}): Cell[] {
  const { xy, values, flags, indices, lengthM: L, beds } = input;
  if (!(L > 0)) throw new Error(`aggregateCells: cell length must be positive, got ${L}`);
  const axes = rowAxes(input.bearingDeg ?? 0);
  const first = beds?.centres[0]?.centre ?? 0;
  const S = beds?.spacingM ?? L;
  const count = indices ? indices.length : values.length;
  const acc = new Map<
    number,
    { across: number; along: number; n: number; sum: number; finite: number; known: number; out: number }
  >();
  for (let k = 0; k < count; k++) {
    const i = indices ? indices[k] : k;
    const x = xy[2 * i],
      y = xy[2 * i + 1];
    if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
    const a = x * axes.u[0] + y * axes.u[1];
    const c = x * axes.r[0] + y * axes.r[1];
    const across = beds ? Math.floor((c - first) / S + 0.5) : Math.floor(c / S);
    const along = Math.floor(a / L);
    if (Math.abs(across) >= OFFSET || Math.abs(along) >= OFFSET) continue;
    const key = (across + OFFSET) * 2 * OFFSET + (along + OFFSET);
    let cell = acc.get(key);
    if (!cell) acc.set(key, (cell = { across, along, n: 0, sum: 0, finite: 0, known: 0, out: 0 }));
    cell.n++;
    const v = values[i];
    if (Number.isFinite(v)) {
      cell.sum += v;
      cell.finite++;
    }
    const f = flags[i];
    if (f & PAIR_FLAG.WITHIN_KNOWN) {
      cell.known++;
      if (!(f & PAIR_FLAG.WITHIN)) cell.out++;
    }
  }
  // Beds without records are left out of the list, so a bed's bin comes from its centre, not its place in the list.
  const labels = new Map(beds?.centres.map((b) => [Math.round((b.centre - first) / S), b.label]) ?? []);
  return [...acc.entries()]
    .sort((p, q) => p[0] - q[0])
    .map(([, c]) => {
      const from = c.along * L,
        to = (c.along + 1) * L;
      const lo = beds ? first + c.across * S - beds.halfWidth : c.across * S;
      const hi = beds ? first + c.across * S + beds.halfWidth : (c.across + 1) * S;
      return {
        across: c.across,
        along: c.along,
        bed: labels.get(c.across) ?? "",
        from,
        to,
        polygon: [
          fromRowFrame(from, lo, axes),
          fromRowFrame(to, lo, axes),
          fromRowFrame(to, hi, axes),
          fromRowFrame(from, hi, axes),
        ],
        n: c.n,
        mean: c.finite ? c.sum / c.finite : NaN,
        known: c.known,
        out: c.out,
        shareOut: c.known ? c.out / c.known : null,
      };
    });
}
