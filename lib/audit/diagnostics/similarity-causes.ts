/**
 * The similarity (four-parameter Helmert) fit of planted → survey about the local centroid, with standard errors,
 * t-tests and the likely cause of each significant part in plain words.
 */
import { studentTCdf, studentTQuantile } from "../intervals";
import type { DiagnosticPair } from "./types";

const ARCSEC_PER_RADIAN = (180 / Math.PI) * 3600;

/** One parameter of the fit with its test. */
export interface FitParameter {
  value: number;
  /** Standard error. */
  se: number;
  /** Two-sided p-value of value = 0 (t-test, df = 2n − 4). */
  p: number;
  significant: boolean;
  /** The largest displacement this part causes within the checked area, metres. */
  effectM: number;
}

export interface SimilarityDiagnosis {
  pairs: number;
  /** Local centroid of the planted checkpoints, work CRS metres. */
  centroidE: number;
  centroidN: number;
  /** Shift at the centroid, metres. */
  shiftE: FitParameter;
  shiftN: FitParameter;
  /** Rotation, arc-seconds (EPSG 9621 sign: positive turns the records clockwise onto the survey). */
  rotationArcsec: FitParameter;
  /** Scale − 1, in parts per million. */
  scalePpm: FitParameter;
  /** Per-axis SD of the residuals after the fit, metres. */
  sigma: number;
  /** Largest distance of a checkpoint from the centroid, metres. */
  radiusM: number;
  causes: { part: "shift" | "rotation" | "scale"; significant: boolean; sentence: string }[];
}

function mm(m: number): string {
  return `${(m * 1000).toFixed(1)} mm`;
}

/**
 * Least-squares similarity fit of the errors about the checkpoints' centroid. With centred coordinates x, y and
 * errors u = dE, v = dN the model u = tE + c·x + s·y, v = tN − s·x + c·y (c = M·cosθ − 1, s = M·sinθ) has a diagonal
 * normal matrix: var(tE) = var(tN) = σ²/n, var(c) = var(s) = σ²/S, S = Σ(x² + y²), σ² = Σ residual²/(2n − 4).
 * Each part is tested with Student's t (df = 2n − 4) and named with its usual cause: a shift points at the
 * base-station coordinates or the reference frame, a rotation at the heading or row-bearing calibration, a scale at
 * units or the projection. Null with fewer than 3 pairs or when all checkpoints coincide. Input not modified.
 *
 * Source: IOGP Publication 373-7-2 (EPSG method 9621, the similarity transformation); Ghilani & Wolf, Adjustment
 * Computations, 4th ed. (2006), ch. 18 (two-dimensional conformal coordinate transformation by least squares).
 *
 * @example similarityDiagnosis(pairs)!.shiftE.value // 0.0004
 */
export function similarityDiagnosis(pairs: readonly DiagnosticPair[], confidence = 0.95): SimilarityDiagnosis | null {
  const n = pairs.length;
  if (n < 3) return null;
  const e0 = pairs[0].plantedE;
  const n0 = pairs[0].plantedN;
  let mx = 0;
  let my = 0;
  let mu = 0;
  let mv = 0;
  for (const p of pairs) {
    mx += p.plantedE - e0;
    my += p.plantedN - n0;
    mu += p.dE;
    mv += p.dN;
  }
  mx /= n;
  my /= n;
  mu /= n;
  mv /= n;
  let S = 0;
  let sc = 0;
  let ss = 0;
  let radius = 0;
  for (const p of pairs) {
    const x = p.plantedE - e0 - mx;
    const y = p.plantedN - n0 - my;
    const u = p.dE - mu;
    const v = p.dN - mv;
    S += x * x + y * y;
    sc += x * u + y * v;
    ss += y * u - x * v;
    radius = Math.max(radius, Math.hypot(x, y));
  }
  if (!(S > 0)) return null;
  const c = sc / S;
  const s = ss / S;
  let rss = 0;
  for (const p of pairs) {
    const x = p.plantedE - e0 - mx;
    const y = p.plantedN - n0 - my;
    const ru = p.dE - mu - (c * x + s * y);
    const rv = p.dN - mv - (-s * x + c * y);
    rss += ru * ru + rv * rv;
  }
  const df = 2 * n - 4;
  const sigma = Math.sqrt(rss / df);
  const tCrit = studentTQuantile((1 + confidence) / 2, df);
  const param = (value: number, se: number, effectM: number): FitParameter => {
    const t = se > 0 ? value / se : value === 0 ? 0 : Infinity;
    const p = 2 * studentTCdf(-Math.abs(t), df);
    return { value, se, p, significant: Math.abs(t) > tCrit, effectM };
  };
  const a = 1 + c;
  const theta = Math.atan2(s, a);
  const seC = sigma / Math.sqrt(S);
  const seShift = sigma / Math.sqrt(n);
  const shiftE = param(mu, seShift, Math.abs(mu));
  const shiftN = param(mv, seShift, Math.abs(mv));
  const rotation = param(theta * ARCSEC_PER_RADIAN, (seC / a) * ARCSEC_PER_RADIAN, Math.abs(theta) * radius);
  const scaleM1 = Math.hypot(a, s) - 1;
  const scale = param(scaleM1 * 1e6, seC * 1e6, Math.abs(scaleM1) * radius);
  const shiftSig = shiftE.significant || shiftN.significant;
  const causes: SimilarityDiagnosis["causes"] = [
    {
      part: "shift",
      significant: shiftSig,
      sentence: shiftSig
        ? `The records sit ${mm(Math.hypot(mu, mv))} off as a whole (${mm(mu)} east, ${mm(mv)} north): check the base-station coordinates and that both files use the same reference frame.`
        : "No significant shift of the records as a whole.",
    },
    {
      part: "rotation",
      significant: rotation.significant,
      sentence: rotation.significant
        ? `The records are turned by ${rotation.value.toFixed(1)}″ about the centre (up to ${mm(rotation.effectM)} at the edge of the checked area): check the heading or row-bearing calibration.`
        : "No significant rotation.",
    },
    {
      part: "scale",
      significant: scale.significant,
      sentence: scale.significant
        ? `Distances in the records differ by ${scale.value.toFixed(0)} ppm (up to ${mm(scale.effectM)} at the edge of the checked area): check units and the projection of both files.`
        : "No significant scale difference.",
    },
  ];
  return {
    pairs: n,
    centroidE: e0 + mx,
    centroidN: n0 + my,
    shiftE,
    shiftN,
    rotationArcsec: rotation,
    scalePpm: scale,
    sigma,
    radiusM: radius,
    causes,
  };
}
