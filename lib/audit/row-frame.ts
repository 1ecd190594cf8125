/**
 * Errors resolved along and across the crop row.
 *
 * Sign convention: the row direction is a grid bearing β in degrees clockwise from grid north (the direction the
 * rows are taken to run, e.g. the planting direction). `along` is positive in that direction; `cross` is positive
 * to the RIGHT of it (as seen when facing along β). With the unit vectors u = (sin β, cos β) and
 * r = (cos β, −sin β) in (east, north): along = dE·sin β + dN·cos β, cross = dE·cos β − dN·sin β.
 * Example: rows running north (β = 0) → along = dN, cross = dE; rows running east (β = 90) → along = dE, cross = −dN.
 */

/** Along/cross components of error arrays, metres. */
export interface RowFrameErrors {
  along: Float64Array;
  cross: Float64Array;
}

function unitVectors(bearingDeg: number): { s: number; c: number } {
  if (!Number.isFinite(bearingDeg))
    throw new Error(`rowFrame: row bearing must be a finite number of degrees, got ${bearingDeg}`);
  const rad = ((((bearingDeg % 360) + 360) % 360) * Math.PI) / 180;
  return { s: Math.sin(rad), c: Math.cos(rad) };
}

/**
 * Resolves one error vector (dE, dN), metres, into along-row and cross-row components for a row bearing in degrees
 * clockwise from grid north. Cross is positive to the right of the row direction.
 *
 * Source: plane rotation of axes (common practice, no source for the sign convention: ours, documented above).
 *
 * @example toRowFrame(0.01, 0, 0) // { along: 0, cross: 0.01 }  (rows run north; east is to the right)
 * @example toRowFrame(0, 0.01, 90) // { along: 0, cross: -0.01 } (rows run east; north is to the left)
 */
export function toRowFrame(dE: number, dN: number, bearingDeg: number): { along: number; cross: number } {
  const { s, c } = unitVectors(bearingDeg);
  return { along: dE * s + dN * c, cross: dE * c - dN * s };
}

/**
 * Column form of {@link toRowFrame}: along/cross arrays for error arrays dE, dN (metres), not modified.
 *
 * @example rowFrame(Float64Array.of(0.01), Float64Array.of(0), 0) // { along: [0], cross: [0.01] }
 */
export function rowFrame(dE: Float64Array, dN: Float64Array, bearingDeg: number): RowFrameErrors {
  if (dE.length !== dN.length) throw new Error("rowFrame: dE and dN differ in length");
  const { s, c } = unitVectors(bearingDeg);
  const n = dE.length;
  const along = new Float64Array(n);
  const cross = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    along[i] = dE[i] * s + dN[i] * c;
    cross[i] = dE[i] * c - dN[i] * s;
  }
  return { along, cross };
}
