/**
 * Geometry for the map, in local metres (x east, y north, relative to the payload's origin): the outline of the
 * records, the beds and rows drawn from the field's settings, and the row frame.
 *
 * Row frame (same convention as lib/audit/row-frame.ts): the rows run at bearing β clockwise from grid north;
 * u = (sin β, cos β) points along the row, r = (cos β, −sin β) to its right. A point p has along = p·u, cross = p·r,
 * and p = along·u + cross·r.
 */

export type Pt = [number, number];

/** Unit vectors along the row and to its right for a bearing in degrees clockwise from grid north. */
export function rowAxes(bearingDeg: number): { u: Pt; r: Pt } {
  const b = (bearingDeg * Math.PI) / 180;
  return { u: [Math.sin(b), Math.cos(b)], r: [Math.cos(b), -Math.sin(b)] };
}

/** Local x/y of a point given along/cross coordinates. */
export function fromRowFrame(along: number, cross: number, axes: { u: Pt; r: Pt }): Pt {
  return [along * axes.u[0] + cross * axes.r[0], along * axes.u[1] + cross * axes.r[1]];
}

/**
 * Convex hull of interleaved x/y points (NaN skipped), counter-clockwise, first point not repeated.
 * Andrew's monotone chain: A. M. Andrew, "Another efficient algorithm for convex hulls in two dimensions",
 * Information Processing Letters 9(5), 1979, 216–219. Collinear points on the hull's edges are dropped.
 *
 * @example convexHull(Float32Array.of(0, 0, 2, 0, 1, 1, 2, 2, 0, 2)) // [[0, 0], [2, 0], [2, 2], [0, 2]]
 */
export function convexHull(xy: ArrayLike<number>): Pt[] {
  const n = Math.floor(xy.length / 2);
  const idx: number[] = [];
  for (let i = 0; i < n; i++) if (Number.isFinite(xy[2 * i]) && Number.isFinite(xy[2 * i + 1])) idx.push(i);
  idx.sort((a, b) => xy[2 * a] - xy[2 * b] || xy[2 * a + 1] - xy[2 * b + 1]);
  const pts: Pt[] = [];
  for (const i of idx) {
    const p: Pt = [xy[2 * i], xy[2 * i + 1]];
    const last = pts[pts.length - 1];
    if (!last || last[0] !== p[0] || last[1] !== p[1]) pts.push(p);
  }
  if (pts.length < 3) return pts;
  const cross = (o: Pt, a: Pt, b: Pt) => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
  const lower: Pt[] = [];
  for (const p of pts) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], p) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: Pt[] = [];
  for (let i = pts.length - 1; i >= 0; i--) {
    const p = pts[i];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], p) <= 0) upper.pop();
    upper.push(p);
  }
  lower.pop();
  upper.pop();
  return lower.concat(upper);
}

/** Axis-aligned bounds of interleaved x/y arrays (NaN skipped); null when there is no finite point. */
export function boundsOf(
  ...arrays: ArrayLike<number>[]
): { minX: number; minY: number; maxX: number; maxY: number } | null {
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (const a of arrays) {
    for (let i = 0; i + 1 < a.length; i += 2) {
      const x = a[i],
        y = a[i + 1];
      if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
      if (x < minX) minX = x;
      if (x > maxX) maxX = x;
      if (y < minY) minY = y;
      if (y > maxY) maxY = y;
    }
  }
  return minX <= maxX ? { minX, minY, maxX, maxY } : null;
}

/** Positions with their bed/row labels, for anchoring the bed layout. Labels are text; numeric ones are used. */
export interface LabelledPoints {
  /** Interleaved x/y, local metres. */
  xy: ArrayLike<number>;
  /** Bed label of point i, or "" (may be shorter than the points, e.g. absent). */
  bed?: (i: number) => string;
  row?: (i: number) => string;
}

export interface BedShape {
  /** Bed label ("3"), or "" when the beds were placed by position only. */
  label: string;
  /** Cross-row coordinate of the bed's centre line, m. */
  centre: number;
  /** Along-row extent of the bed's records, m. */
  from: number;
  to: number;
  /** Outline of the bed's top (half a row spacing beyond its outer rows), local x/y, 4 corners. */
  outline: Pt[];
  /** Where the bed's name goes: on its centre line, one bed width before its first record. */
  labelAt: Pt;
  rows: { label: string; path: [Pt, Pt] }[];
}

export interface BedLayout {
  beds: BedShape[];
  /** How the layout was placed; shown on the map. */
  note: string;
  anchoredBy: "labels" | "positions" | null;
  bedSpacingM: number | null;
  /** Cross-row half width of a bed's top, m. */
  halfWidth: number | null;
}

/** At most this many points are read to anchor the layout (evenly spaced, deterministic). */
const ANCHOR_SAMPLE = 20_001;

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

const positiveInt = (s: string) => (/^\s*\d+\s*$/.test(s) ? Number(s) : NaN);

/**
 * Beds and rows drawn from the field's settings: rows `rowSpacingM` apart, `rowsPerBed` rows per bed, beds
 * `bedSpacingM` apart (centre to centre), all running at `bearingDeg`. The settings give spacing but no position, so
 * the layout is anchored to the records: with numeric bed and row labels, so that row k of bed b lies at
 * cross = c₀ + (b − 1)·bedSpacing + (k − 1)·rowSpacing with c₀ the median over the records (robust to a few
 * mislabelled plants); without labels, at the circular mean of the records' cross-row positions modulo the bed
 * spacing (the bed centres, when rows sit symmetrically in their bed). Each bed spans the along-row extent of its
 * own records.
 *
 * Circular mean: K. V. Mardia & P. E. Jupp, Directional Statistics (2000), §2.2.1.
 */
export function bedLayout(input: {
  bearingDeg: number | null;
  bedSpacingM: number | null;
  rowsPerBed: number | null;
  rowSpacingM: number | null;
  points: LabelledPoints;
}): BedLayout {
  const { bearingDeg, bedSpacingM: S, rowsPerBed: R, rowSpacingM: w } = input;
  const none = (note: string): BedLayout => ({ beds: [], note, anchoredBy: null, bedSpacingM: null, halfWidth: null });
  if (bearingDeg === null || !Number.isFinite(bearingDeg))
    return none("Beds are not drawn: the audit has no row bearing.");
  if (!S || !R || !w || S <= 0 || R < 1 || w <= 0)
    return none("Beds are not drawn: set the bed spacing, rows per bed and row spacing on the field.");
  const axes = rowAxes(bearingDeg);
  const xy = input.points.xy;
  const n = Math.floor(xy.length / 2);
  if (n === 0) return none("Beds are not drawn: no records to place them by.");
  const along = new Float64Array(n),
    cross = new Float64Array(n);
  let cMin = Infinity,
    cMax = -Infinity;
  for (let i = 0; i < n; i++) {
    const x = xy[2 * i],
      y = xy[2 * i + 1];
    along[i] = x * axes.u[0] + y * axes.u[1];
    cross[i] = x * axes.r[0] + y * axes.r[1];
    if (Number.isFinite(cross[i])) {
      if (cross[i] < cMin) cMin = cross[i];
      if (cross[i] > cMax) cMax = cross[i];
    }
  }
  if (!(cMin <= cMax)) return none("Beds are not drawn: the records have no usable positions.");
  const halfWidth = (R * w) / 2;
  const firstRowOffset = -((R - 1) * w) / 2; // from bed centre to row 1
  const step = Math.max(1, Math.floor(n / ANCHOR_SAMPLE));

  // Anchor by labels: c0 = cross of bed 1 row 1.
  const residuals: number[] = [];
  const { bed, row } = input.points;
  if (bed && row) {
    for (let i = 0; i < n; i += step) {
      const b = positiveInt(bed(i)),
        k = positiveInt(row(i));
      if (b >= 1 && k >= 1 && k <= R && Number.isFinite(cross[i]))
        residuals.push(cross[i] - ((b - 1) * S + (k - 1) * w));
    }
  }
  const beds: BedShape[] = [];
  let anchoredBy: BedLayout["anchoredBy"];
  let centres: { label: string; centre: number }[];
  if (residuals.length >= 3) {
    anchoredBy = "labels";
    const c0 = median(residuals);
    const centreOf = (b: number) => c0 + (b - 1) * S - firstRowOffset;
    let bMin = Infinity,
      bMax = -Infinity;
    for (let i = 0; i < n; i++) {
      const b = bed ? positiveInt(bed(i)) : NaN;
      if (b >= 1) {
        bMin = Math.min(bMin, b);
        bMax = Math.max(bMax, b);
      }
    }
    centres = [];
    for (let b = bMin; b <= bMax; b++) centres.push({ label: String(b), centre: centreOf(b) });
  } else {
    anchoredBy = "positions";
    let sx = 0,
      sy = 0;
    for (let i = 0; i < n; i += step) {
      if (!Number.isFinite(cross[i])) continue;
      const a = (2 * Math.PI * cross[i]) / S;
      sx += Math.cos(a);
      sy += Math.sin(a);
    }
    const phase = ((Math.atan2(sy, sx) / (2 * Math.PI)) * S + S) % S;
    const kMin = Math.floor((cMin - phase) / S + 0.5),
      kMax = Math.floor((cMax - phase) / S + 0.5);
    centres = [];
    for (let k = kMin; k <= kMax; k++) centres.push({ label: "", centre: phase + k * S });
  }
  // Each record belongs to the bed whose band (centre ± S/2) holds it; the bed spans its records' along extent.
  const first = centres[0]?.centre ?? 0;
  const from = new Float64Array(centres.length).fill(Infinity),
    to = new Float64Array(centres.length).fill(-Infinity);
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(cross[i]) || !Number.isFinite(along[i])) continue;
    const j = Math.floor((cross[i] - first) / S + 0.5);
    if (j < 0 || j >= centres.length) continue;
    if (along[i] < from[j]) from[j] = along[i];
    if (along[i] > to[j]) to[j] = along[i];
  }
  centres.forEach((c, j) => {
    if (!(from[j] <= to[j])) return; // a bed with no records is not drawn
    const corner = (a: number, dc: number) => fromRowFrame(a, c.centre + dc, axes);
    const rows = Array.from({ length: R }, (_, k) => {
      const cc = c.centre + firstRowOffset + k * w;
      return {
        label: String(k + 1),
        path: [fromRowFrame(from[j], cc, axes), fromRowFrame(to[j], cc, axes)] as [Pt, Pt],
      };
    });
    beds.push({
      label: c.label,
      centre: c.centre,
      from: from[j],
      to: to[j],
      rows,
      labelAt: fromRowFrame(from[j] - 2 * halfWidth, c.centre, axes),
      outline: [
        corner(from[j], -halfWidth),
        corner(to[j], -halfWidth),
        corner(to[j], halfWidth),
        corner(from[j], halfWidth),
      ],
    });
  });
  const note =
    anchoredBy === "labels"
      ? `Beds and rows from the field's settings (${R} rows ${w} m apart, beds ${S} m apart), placed by the records' bed and row numbers.`
      : `Beds and rows from the field's settings (${R} rows ${w} m apart, beds ${S} m apart), placed by the records' positions (no numeric bed and row labels).`;
  return { beds, note, anchoredBy, bedSpacingM: S, halfWidth };
}
