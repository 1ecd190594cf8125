import { describe, expect, it } from "vitest";
import { similarityDiagnosis } from "./similarity-causes";
import { simulatePairs } from "../test-helpers";
import type { DiagnosticPair } from "./types";

/** EPSG transformation 5166 (ED50 → ETRS89 / UTM 31N) source and target points, IOGP Publication 373-7-2. */
const SRC = [
  [300000, 4500000],
  [315000, 4740000],
  [520000, 4680000],
  [420000, 4600000],
];
const DST = [
  [299905.06, 4499796.515],
  [314906.904, 4739796.774],
  [519906.767, 4679795.125],
  [419906.005, 4599795.76],
];

function pairsOf(src: number[][], dst: number[][]): DiagnosticPair[] {
  const base = simulatePairs({ rows: 1, checkpointsPerRow: src.length });
  return src.map((s, i) => {
    const dE = dst[i][0] - s[0];
    const dN = dst[i][1] - s[1];
    return { ...base[i], plantedE: s[0], plantedN: s[1], dE, dN, radial: Math.hypot(dE, dN) };
  });
}

/** Ordinary least squares by the normal equations with a generic 4×4 solve (an independent implementation). */
function olsCovariance(pairs: DiagnosticPair[]) {
  const cx = pairs.reduce((s, p) => s + p.plantedE, 0) / pairs.length;
  const cy = pairs.reduce((s, p) => s + p.plantedN, 0) / pairs.length;
  const rows: number[][] = [];
  const obs: number[] = [];
  for (const p of pairs) {
    const x = p.plantedE - cx;
    const y = p.plantedN - cy;
    rows.push([1, 0, x, y]);
    obs.push(p.dE);
    rows.push([0, 1, y, -x]);
    obs.push(p.dN);
  }
  const N = [0, 1, 2, 3].map((i) => [0, 1, 2, 3].map((j) => rows.reduce((s, r) => s + r[i] * r[j], 0)));
  const b = [0, 1, 2, 3].map((i) => rows.reduce((s, r, k) => s + r[i] * obs[k], 0));
  // Gauss–Jordan inverse
  const A = N.map((r, i) => [...r, ...[0, 1, 2, 3].map((j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < 4; c++) {
    const piv = A[c][c];
    for (let j = 0; j < 8; j++) A[c][j] /= piv;
    for (let r = 0; r < 4; r++)
      if (r !== c) {
        const f = A[r][c];
        for (let j = 0; j < 8; j++) A[r][j] -= f * A[c][j];
      }
  }
  const inv = A.map((r) => r.slice(4));
  const x = inv.map((r) => r.reduce((s, v, j) => s + v * b[j], 0));
  const rss = rows.reduce((s, r, k) => s + (obs[k] - r.reduce((t, v, j) => t + v * x[j], 0)) ** 2, 0);
  const sigma2 = rss / (rows.length - 4);
  return { x, se: inv.map((r, i) => Math.sqrt(sigma2 * r[i])) };
}

describe("similarityDiagnosis", () => {
  it("similarityDiagnosis -- EPSG transformation 5166 worked example", () => {
    const d = similarityDiagnosis(pairsOf(SRC, DST))!;
    // IOGP 373-7-2: θ = 1.56504″, M = 1.0000015504; a least-squares fit to the four rounded points gives
    // θ = 1.56500″, M = 1.0000015523 (computed; expect scale only to ~1e-8 as the points are rounded to 1 mm)
    expect(d.rotationArcsec.value).toBeCloseTo(1.565, 3);
    expect(d.scalePpm.value).toBeCloseTo(1.5523, 1);
  });
  it("similarityDiagnosis -- standard errors equal those of a generic least-squares solve", () => {
    const pairs = simulatePairs({ rows: 8, seed: 5 });
    const d = similarityDiagnosis(pairs)!;
    const o = olsCovariance(pairs);
    expect(d.shiftE.value).toBeCloseTo(o.x[0], 12);
    expect(d.shiftN.value).toBeCloseTo(o.x[1], 12);
    expect(d.shiftE.se).toBeCloseTo(o.se[0], 12);
    expect(d.scalePpm.se / 1e6).toBeCloseTo(o.se[2], 12);
    expect(d.scalePpm.value / 1e6).toBeCloseTo(o.x[2], 9);
  });
  it("similarityDiagnosis -- a planted shift is significant and named; no rotation or scale", () => {
    const pairs = simulatePairs({ rows: 8, seed: 9 }).map((p) => ({ ...p, dE: p.dE + 0.004, dN: p.dN - 0.002 }));
    const d = similarityDiagnosis(pairs)!;
    expect(d.shiftE.value).toBeCloseTo(0.004, 3);
    expect(d.causes[0]).toMatchObject({ part: "shift", significant: true });
    expect(d.causes[0].sentence).toMatch(/base-station coordinates/);
    expect(d.causes[1].significant).toBe(false);
  });
  it("similarityDiagnosis -- a planted rotation is found", () => {
    const theta = 20 / 206264.806; // 20″
    const pairs = simulatePairs({ rows: 8, seed: 9 }).map((p) => {
      const x = p.plantedE - 500_000;
      const y = p.plantedN - 5_800_000;
      return { ...p, dE: p.dE + theta * y, dN: p.dN - theta * x };
    });
    const d = similarityDiagnosis(pairs)!;
    expect(Math.abs(d.rotationArcsec.value - 20)).toBeLessThan(3 * d.rotationArcsec.se);
    expect(d.causes[1]).toMatchObject({ part: "rotation", significant: true });
    expect(d.causes[1].sentence).toMatch(/heading or row-bearing calibration/);
  });
  it("similarityDiagnosis -- too few pairs", () => {
    expect(similarityDiagnosis(simulatePairs({ rows: 1, checkpointsPerRow: 2 }))).toBeNull();
  });
});
