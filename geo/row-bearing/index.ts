import KDBush from "kdbush";
import type { PointTable } from "../types";

/** Result of `deriveRowBearing`. */
export interface RowBearing {
  /** Row direction, degrees clockwise from grid north, in [0, 180). NaN when it cannot be derived. */
  bearingDeg: number;
  /** How it was derived: "bed-row" / "row" / "bed" groups, or "neighbours" (no row attributes). */
  method: "bed-row" | "row" | "bed" | "neighbours" | "none";
  /** Number of groups (or neighbour vectors) used. */
  used: number;
  /** (λ1 − λ2)/(λ1 + λ2) of the pooled scatter (1 = all points on parallel lines; below ~0.5 the direction is weak). */
  linearity: number;
}

/**
 * Derives the row direction of a field from the as-planted positions (metres, projected CRS).
 *
 * With row attributes, points are grouped by (bed, row) — or by row, or by bed, whichever exists —
 * and the principal axis of the **pooled within-group scatter matrix** is taken: S = Σ_groups Σ_i
 * (p_i − mean_g)(p_i − mean_g)ᵀ; the bearing is the direction of S's largest eigenvector,
 * θ = ½·atan2(2·S_en, S_nn − S_ee) measured from north (principal-axis formula of a 2 × 2 symmetric
 * matrix; any linear-algebra text). Pooling weights each group by its spread, so long rows dominate
 * short ones; groups of fewer than 3 points are skipped.
 *
 * Without row attributes, each point's vector to its nearest neighbour (up to 20 000 evenly spaced
 * points) is used instead and the axial mean of the doubled angles is taken. This assumes plants
 * stand closer within a row than across rows; it fails on square grids (reported by a low `linearity`).
 *
 * Group sums are taken relative to each group's first point, so large UTM coordinates lose no precision.
 *
 * @example deriveRowBearing(planted).bearingDeg // 30.0 for rows running north-north-east
 */
export function deriveRowBearing(table: Pick<PointTable, "length" | "x" | "y" | "attrs">): RowBearing {
  const bed = table.attrs.bed,
    row = table.attrs.row;
  if (row || bed) {
    const method = bed && row ? "bed-row" : row ? "row" : "bed";
    const r = pooledGroups(
      table,
      bed?.codes ?? null,
      bed?.values.length ?? 0,
      row?.codes ?? null,
      row?.values.length ?? 0,
    );
    if (r.used > 0) return { ...r, method };
  }
  return neighbourBearing(table);
}

function pooledGroups(
  t: Pick<PointTable, "length" | "x" | "y">,
  a: Int32Array | null,
  na: number,
  b: Int32Array | null,
  nb: number,
): Omit<RowBearing, "method"> {
  const n = t.length;
  const groups = (a ? na : 1) * (b ? nb : 1);
  if (groups > 4_000_000) return { bearingDeg: NaN, used: 0, linearity: 0 };
  const ox = new Float64Array(groups).fill(NaN),
    oy = new Float64Array(groups);
  const cnt = new Float64Array(groups),
    se = new Float64Array(groups),
    sn = new Float64Array(groups);
  const see = new Float64Array(groups),
    snn = new Float64Array(groups),
    sen = new Float64Array(groups);
  for (let i = 0; i < n; i++) {
    const ca = a ? a[i] : 0,
      cb = b ? b[i] : 0;
    if (ca < 0 || cb < 0) continue;
    const x = t.x[i],
      y = t.y[i];
    if (x !== x || y !== y) continue;
    const g = ca * (b ? nb : 1) + cb;
    if (ox[g] !== ox[g]) {
      ox[g] = x;
      oy[g] = y;
    }
    const e = x - ox[g],
      nn = y - oy[g];
    cnt[g]++;
    se[g] += e;
    sn[g] += nn;
    see[g] += e * e;
    snn[g] += nn * nn;
    sen[g] += e * nn;
  }
  let Sxx = 0,
    Syy = 0,
    Sxy = 0,
    used = 0;
  for (let g = 0; g < groups; g++) {
    const c = cnt[g];
    if (c < 3) continue;
    Sxx += see[g] - (se[g] * se[g]) / c;
    Syy += snn[g] - (sn[g] * sn[g]) / c;
    Sxy += sen[g] - (se[g] * sn[g]) / c;
    used++;
  }
  return fromScatter(Sxx, Syy, Sxy, used);
}

/** Bearing (deg from north, [0,180)) of the major axis of [[Sxx, Sxy], [Sxy, Syy]] (x = east, y = north). */
function fromScatter(Sxx: number, Syy: number, Sxy: number, used: number): Omit<RowBearing, "method"> {
  const tr = Sxx + Syy;
  if (used === 0 || !(tr > 0)) return { bearingDeg: NaN, used, linearity: 0 };
  const diff = Math.hypot(Sxx - Syy, 2 * Sxy);
  // Direction (sin β, cos β) with β from north: tan 2β = 2 Sxy / (Syy − Sxx).
  let deg = (0.5 * Math.atan2(2 * Sxy, Syy - Sxx) * 180) / Math.PI;
  deg = ((deg % 180) + 180) % 180;
  return { bearingDeg: deg, used, linearity: diff / tr };
}

function neighbourBearing(t: Pick<PointTable, "length" | "x" | "y">): RowBearing {
  const n = t.length;
  const ids: number[] = [];
  for (let i = 0; i < n; i++) if (Number.isFinite(t.x[i]) && Number.isFinite(t.y[i])) ids.push(i);
  if (ids.length < 3) return { bearingDeg: NaN, method: "none", used: 0, linearity: 0 };
  const tree = new KDBush(ids.length, 64, Float64Array);
  let minX = Infinity,
    maxX = -Infinity,
    minY = Infinity,
    maxY = -Infinity;
  for (const i of ids) {
    tree.add(t.x[i], t.y[i]);
    minX = Math.min(minX, t.x[i]);
    maxX = Math.max(maxX, t.x[i]);
    minY = Math.min(minY, t.y[i]);
    maxY = Math.max(maxY, t.y[i]);
  }
  tree.finish();
  const area = Math.max((maxX - minX) * (maxY - minY), 1e-6);
  const r0 = Math.max(Math.sqrt(area / ids.length), 1e-4);
  const step = Math.max(1, Math.floor(ids.length / 20000));
  let c2 = 0,
    s2 = 0,
    used = 0;
  const out: number[] = [];
  for (let k = 0; k < ids.length; k += step) {
    const i = ids[k];
    const qx = t.x[i],
      qy = t.y[i];
    let best = -1,
      bestD = Infinity;
    for (let r = r0; r < r0 * 1e4 && best < 0; r *= 2) {
      const m = tree.withinInto(qx, qy, r, out);
      for (let j = 0; j < m; j++) {
        const o = ids[out[j]];
        if (o === i) continue;
        const d = Math.hypot(t.x[o] - qx, t.y[o] - qy);
        if (d > 0 && (d < bestD || (d === bestD && o < best))) {
          bestD = d;
          best = o;
        }
      }
    }
    if (best < 0) continue;
    const dx = t.x[best] - qx,
      dy = t.y[best] - qy;
    const a = Math.atan2(dx, dy); // bearing of the vector, from north
    c2 += Math.cos(2 * a);
    s2 += Math.sin(2 * a);
    used++;
  }
  if (used === 0) return { bearingDeg: NaN, method: "none", used: 0, linearity: 0 };
  let deg = (0.5 * Math.atan2(s2, c2) * 180) / Math.PI;
  deg = ((deg % 180) + 180) % 180;
  return { bearingDeg: deg, method: "neighbours", used, linearity: Math.hypot(c2, s2) / used };
}
