/**
 * Least-squares 2D similarity (four-parameter Helmert) transformation from one set of easting/northing
 * coordinates to another, in the form of EPSG method 9621 ("Similarity transformation"). Metres.
 */

const ARCSEC_PER_RADIAN = (180 / Math.PI) * 3600;

/** Parameters of E = tE + M·(X·cosθ + Y·sinθ), N = tN + M·(−X·sinθ + Y·cosθ) (EPSG method 9621). */
export interface SimilarityParameters {
  /** Scale factor M (unitless, 1 = no scale change). */
  scale: number;
  /** Rotation θ in arc-seconds, sign as in the EPSG 9621 formula above. */
  rotationArcsec: number;
  /** Shift of the un-centred formula, easting (X0), metres. */
  tE: number;
  /** Shift of the un-centred formula, northing (Y0), metres. */
  tN: number;
}

/** A fitted similarity transformation and how well it fits. */
export interface SimilarityFit extends SimilarityParameters {
  /** Number of point pairs used. */
  pairs: number;
  /** Radial RMS of the residuals, sqrt(Σ(vE² + vN²)/n), metres. */
  rmse: number;
  /** Largest radial residual, metres. */
  residualMax: number;
}

/**
 * Applies an EPSG 9621 similarity transformation to one point.
 *
 * Source: IOGP Publication 373-7-2, Geomatics Guidance Note 7 part 2, EPSG method 9621.
 *
 * @example applySimilarity({ scale: 1, rotationArcsec: 0, tE: 10, tN: -5 }, 100, 200) // { e: 110, n: 195 }
 */
export function applySimilarity(p: SimilarityParameters, x: number, y: number): { e: number; n: number } {
  const theta = p.rotationArcsec / ARCSEC_PER_RADIAN;
  const c = Math.cos(theta);
  const s = Math.sin(theta);
  return { e: p.tE + p.scale * (x * c + y * s), n: p.tN + p.scale * (-x * s + y * c) };
}

/**
 * Least-squares fit of the similarity transformation taking source points (X, Y) to target points (E, N),
 * e.g. planted → survey. With a = M·cosθ, b = M·sinθ the model E = tE + aX + bY, N = tN − bX + aY is linear;
 * coordinates are centred on their means first (numerical stability with UTM-sized values), then
 * a = Σ(x·e + y·n)/Σ(x² + y²), b = Σ(y·e − x·n)/Σ(x² + y²) on centred values, and the shifts of the
 * un-centred formula are tE = Ē − aX̄ − bȲ, tN = N̄ + bX̄ − aȲ.
 * Returns null with fewer than 2 pairs or when all source points coincide. Inputs are not modified.
 *
 * Source: IOGP Publication 373-7-2 (EPSG method 9621, formula and the worked example of transformation 5166).
 *
 * @example fitSimilarity(Float64Array.of(0, 1), Float64Array.of(0, 0), Float64Array.of(5, 6), Float64Array.of(7, 7))
 *   // { scale: 1, rotationArcsec: 0, tE: 5, tN: 7, ... }
 */
export function fitSimilarity(
  srcX: ArrayLike<number>,
  srcY: ArrayLike<number>,
  dstE: ArrayLike<number>,
  dstN: ArrayLike<number>,
): SimilarityFit | null {
  const n = srcX.length;
  if (srcY.length !== n || dstE.length !== n || dstN.length !== n) {
    throw new Error("fitSimilarity: coordinate arrays differ in length");
  }
  const x = Float64Array.from(srcX);
  const y = Float64Array.from(srcY);
  const dE = new Float64Array(n);
  const dN = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    dE[i] = dstE[i] - x[i];
    dN[i] = dstN[i] - y[i];
  }
  return fitSimilarityToErrors(x, y, null, dE, dN);
}

/**
 * The same least-squares similarity fit as {@link fitSimilarity}, from source coordinates and the errors
 * (target − source) of each pair, without building target arrays: pair i uses source row `rows[i]` (or i when
 * `rows` is null) and errors dE[i], dN[i]. Working with errors keeps M − 1 precise: with centred source x, y and
 * centred errors u, v, a − 1 = Σ(x·u + y·v)/S and b = Σ(y·u − x·v)/S, S = Σ(x² + y²). Metres. Inputs not modified.
 *
 * Source: IOGP Publication 373-7-2 (EPSG method 9621).
 *
 * @example fitSimilarityToErrors(Float64Array.of(0, 1), Float64Array.of(0, 0), null, Float64Array.of(5, 5), Float64Array.of(7, 7))
 *   // { scale: 1, rotationArcsec: 0, tE: 5, tN: 7, ... }
 */
export function fitSimilarityToErrors(
  srcX: Float64Array,
  srcY: Float64Array,
  rows: Int32Array | null,
  dE: Float64Array,
  dN: Float64Array,
): SimilarityFit | null {
  const n = dE.length;
  if (
    dN.length !== n ||
    (rows !== null && rows.length !== n) ||
    (rows === null && (srcX.length !== n || srcY.length !== n))
  ) {
    throw new Error("fitSimilarity: coordinate arrays differ in length");
  }
  if (n < 2) return null;
  // Source centroid taken relative to the first point, so sums of UTM-sized values keep the millimetres.
  const first = rows === null ? 0 : rows[0];
  const x0 = srcX[first];
  const y0 = srcY[first];
  let mx = 0;
  let my = 0;
  let mu = 0;
  let mv = 0;
  for (let i = 0; i < n; i++) {
    const r = rows === null ? i : rows[i];
    mx += srcX[r] - x0;
    my += srcY[r] - y0;
    mu += dE[i];
    mv += dN[i];
  }
  mx /= n;
  my /= n;
  mu /= n;
  mv /= n;
  let sxx = 0;
  let sa = 0;
  let sb = 0;
  for (let i = 0; i < n; i++) {
    const r = rows === null ? i : rows[i];
    const x = srcX[r] - x0 - mx;
    const y = srcY[r] - y0 - my;
    const u = dE[i] - mu;
    const v = dN[i] - mv;
    sxx += x * x + y * y;
    sa += x * u + y * v;
    sb += y * u - x * v;
  }
  if (!(sxx > 0)) return null;
  const am1 = sa / sxx; // a − 1
  const b = sb / sxx;
  let ss = 0;
  let maxR2 = 0;
  for (let i = 0; i < n; i++) {
    const r = rows === null ? i : rows[i];
    const x = srcX[r] - x0 - mx;
    const y = srcY[r] - y0 - my;
    const ve = dE[i] - mu - (am1 * x + b * y);
    const vn = dN[i] - mv - (-b * x + am1 * y);
    const r2 = ve * ve + vn * vn;
    ss += r2;
    if (r2 > maxR2) maxR2 = r2;
  }
  const a = 1 + am1;
  // Shifts of the un-centred formula: tE = Ē − aX̄ − bȲ with Ē = X̄ + ū, i.e. tE = ū − (a − 1)X̄ − bȲ; likewise tN.
  const cx = x0 + mx;
  const cy = y0 + my;
  return {
    scale: Math.hypot(a, b),
    rotationArcsec: Math.atan2(b, a) * ARCSEC_PER_RADIAN,
    tE: mu - am1 * cx - b * cy,
    tN: mv + b * cx - am1 * cy,
    pairs: n,
    rmse: Math.sqrt(ss / n),
    residualMax: Math.sqrt(maxR2),
  };
}
