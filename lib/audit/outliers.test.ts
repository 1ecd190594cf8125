/**
 * Sources: 1.4826 = 1/Φ⁻¹(0.75) with jstat.normal.inv as independent oracle; Rayleigh tail
 * P(r > kσ) = exp(−k²/2) for the false-flag rate (Rayleigh CDF, as scipy.stats.rayleigh.sf gives it); k = 3.5 after
 * Iglewicz & Hoaglin (1993) (from memory). Fields simulated with our seeded PRNG (mulberry32 + Box–Muller).
 */
import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { DEFAULT_OUTLIER_RULE, MAD_TO_SD, flagOutliers } from "./outliers";
import { gaussian, mulberry32 } from "./test-helpers";

function cloud(n: number, seed: number, sigma: number, biasE = 0, biasN = 0) {
  const z = gaussian(mulberry32(seed));
  const dE = new Float64Array(n);
  const dN = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    dE[i] = biasE + sigma * z();
    dN[i] = biasN + sigma * z();
  }
  return { dE, dN };
}

describe("flagOutliers", () => {
  it("flagOutliers -- MAD scale constant", () => {
    // jstat.normal.inv as independent oracle: 1/Φ⁻¹(0.75) = 1.482602
    expect(MAD_TO_SD).toBeCloseTo(1 / jStat.normal.inv(0.75, 0, 1), 9);
    expect(DEFAULT_OUTLIER_RULE).toEqual({ k: 3.5, minThreshold: 0.001 });
  });

  it("flagOutliers -- one gross error among tight errors", () => {
    const dE = Float64Array.of(0.004, -0.003, 0.002, 0.001, -0.002, 0.42, 0.003, -0.001);
    const dN = Float64Array.of(0.001, 0.002, -0.003, 0.002, 0.0, -0.05, -0.002, 0.001);
    const r = flagOutliers(dE, dN);
    expect(r.count).toBe(1);
    expect(Array.from(r.flags)).toEqual([0, 0, 0, 0, 0, 1, 0, 0]);
    expect(r.centreDE).toBeCloseTo(0.0015, 12); // median of dE
    expect(r.threshold).toBeGreaterThan(0.001);
    expect(r.threshold).toBeLessThan(0.42);
  });

  it("flagOutliers -- false-flag rate on clean circular errors follows the Rayleigh tail", () => {
    // T ≈ 3.5σ for k = 3.5, and P(r > 3.5σ) = exp(−3.5²/2) = 0.22 % (Rayleigh tail)
    const { dE, dN } = cloud(200_000, 11, 0.01, 0.02, -0.01);
    const r = flagOutliers(dE, dN);
    expect(r.threshold / 0.01).toBeGreaterThan(3.3);
    expect(r.threshold / 0.01).toBeLessThan(3.7);
    expect(r.count / 200_000).toBeGreaterThan(0.001);
    expect(r.count / 200_000).toBeLessThan(0.0035);
  });

  it("flagOutliers -- finds injected gross errors", () => {
    const n = 5000;
    const { dE, dN } = cloud(n, 12, 0.01);
    const injected: number[] = [];
    for (let i = 0; i < n; i += 50) {
      dE[i] += 0.3; // 30 cm gross error, 30σ
      injected.push(i);
    }
    const r = flagOutliers(dE, dN);
    for (const i of injected) expect(r.flags[i]).toBe(1);
    expect(r.count - injected.length).toBeLessThan(0.006 * n); // few clean pairs flagged
  });

  it("flagOutliers -- a common bias flags nothing extra", () => {
    const a = cloud(2000, 13, 0.01);
    const shifted = { dE: a.dE.map((v) => v + 0.5), dN: a.dN.map((v) => v - 0.2) };
    const r1 = flagOutliers(a.dE, a.dN);
    const r2 = flagOutliers(shifted.dE, shifted.dN);
    expect(Array.from(r2.flags)).toEqual(Array.from(r1.flags));
  });

  it("flagOutliers -- identical errors: none flagged, floor applies", () => {
    const r = flagOutliers(new Float64Array(50).fill(0.012), new Float64Array(50).fill(-0.004));
    expect(r.count).toBe(0);
    expect(r.threshold).toBe(0.001);
    // 0.5 mm of noise stays under the 1 mm floor
    const dE = new Float64Array(50).fill(0.012);
    dE[7] += 0.0005;
    expect(flagOutliers(dE, new Float64Array(50)).count).toBe(0);
  });

  it("flagOutliers -- empty input and bad rule", () => {
    const r = flagOutliers(new Float64Array(0), new Float64Array(0));
    expect(r.count).toBe(0);
    expect(r.threshold).toBeNaN();
    expect(() => flagOutliers(new Float64Array(1), new Float64Array(1), { k: 0, minThreshold: 0 })).toThrow(
      "flagOutliers: need k > 0",
    );
  });

  it("flagOutliers -- inputs not mutated", () => {
    const { dE, dN } = cloud(100, 14, 0.01);
    const e0 = dE.slice();
    const n0 = dN.slice();
    flagOutliers(dE, dN);
    expect(dE).toEqual(e0);
    expect(dN).toEqual(n0);
  });
});
