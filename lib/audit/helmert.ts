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
  if (n < 2) return null;
  let mx = 0;
  let my = 0;
  let me = 0;
  let mn = 0;
  for (let i = 0; i < n; i++) {
    mx += srcX[i];
    my += srcY[i];
    me += dstE[i];
    mn += dstN[i];
  }
  mx /= n;
  my /= n;
  me /= n;
  mn /= n;
  let sxx = 0;
  let sa = 0;
  let sb = 0;
  for (let i = 0; i < n; i++) {
    const x = srcX[i] - mx;
    const y = srcY[i] - my;
    const e = dstE[i] - me;
    const nn = dstN[i] - mn;
    sxx += x * x + y * y;
    sa += x * e + y * nn;
    sb += y * e - x * nn;
  }
  if (!(sxx > 0)) return null;
  const a = sa / sxx;
  const b = sb / sxx;
  let ss = 0;
  let maxR2 = 0;
  for (let i = 0; i < n; i++) {
    const x = srcX[i] - mx;
    const y = srcY[i] - my;
    const ve = dstE[i] - me - (a * x + b * y);
    const vn = dstN[i] - mn - (-b * x + a * y);
    const r2 = ve * ve + vn * vn;
    ss += r2;
    if (r2 > maxR2) maxR2 = r2;
  }
  return {
    scale: Math.hypot(a, b),
    rotationArcsec: Math.atan2(b, a) * ARCSEC_PER_RADIAN,
    tE: me - a * mx - b * my,
    tN: mn + b * mx - a * my,
    pairs: n,
    rmse: Math.sqrt(ss / n),
    residualMax: Math.sqrt(maxR2),
  };
}
