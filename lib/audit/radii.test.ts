/**
 * Sources: the Rayleigh distribution CDF, values from scipy.stats.rayleigh (computed): P(r ≤ kσ) = 1 − exp(−k²/2) with
 * k = 1.177410 (CEP), 2.145966 (CE90), 2.447747 (R95), 3.034854 (R99); simple-statistics 7.12.1 quantile as oracle.
 */
import * as ss from "simple-statistics";
import { describe, expect, it } from "vitest";
import {
  CEP_FACTOR,
  R95_FACTOR,
  circularProbability,
  circularRadiusFactor,
  circularSigma,
  empiricalRadii,
  modelRadii,
} from "./radii";
import { gaussian, mulberry32 } from "./test-helpers";

describe("radii", () => {
  it("circularRadiusFactor -- published k values", () => {
    // scipy.stats.rayleigh.ppf (computed): k for P = 0.5, 0.9, 0.95, 0.99
    expect(circularRadiusFactor(0.5)).toBeCloseTo(1.17741, 6);
    expect(circularRadiusFactor(0.9)).toBeCloseTo(2.145966, 6);
    expect(circularRadiusFactor(0.95)).toBeCloseTo(2.447747, 6);
    expect(circularRadiusFactor(0.99)).toBeCloseTo(3.034854, 6);
    // CEP = sqrt(2 ln 2) exactly
    expect(CEP_FACTOR).toBeCloseTo(Math.sqrt(2 * Math.LN2), 15);
    expect(R95_FACTOR).toBeCloseTo(2.447747, 6);
  });

  it("circularProbability -- published P values", () => {
    // scipy.stats.rayleigh.cdf (computed): 1σ circle 0.393469, DRMS 0.632121, 2DRMS 0.981684
    expect(circularProbability(1)).toBeCloseTo(0.393469, 6);
    // biome-ignore lint/suspicious/noApproximativeNumericConstant: the table value as printed, not √2.
    expect(circularProbability(1.414214)).toBeCloseTo(0.632121, 6);
    expect(circularProbability(2.828427)).toBeCloseTo(0.981684, 6);
    expect(circularProbability(circularRadiusFactor(0.95))).toBeCloseTo(0.95, 14);
  });

  it("modelRadii -- k times σ_c = RMSE_r/√2", () => {
    expect(circularSigma(0.03, 0.04)).toBeCloseTo(0.05 / Math.SQRT2, 15);
    const r = modelRadii(0.01, 0.01);
    expect(r.cep50).toBeCloseTo(0.0117741, 7);
    expect(r.r95).toBeCloseTo(0.02447747, 8);
  });

  it("modelRadii -- matches empirical radii for simulated circular normal errors", () => {
    // Rayleigh law: for unbiased circular errors the model and the sample percentiles must agree
    const z = gaussian(mulberry32(20250512));
    const n = 40_000;
    const sigma = 0.012;
    const e = new Float64Array(n);
    const nn = new Float64Array(n);
    const radial = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      e[i] = sigma * z();
      nn[i] = sigma * z();
      radial[i] = Math.hypot(e[i], nn[i]);
    }
    const rmsE = Math.sqrt(e.reduce((s, v) => s + v * v, 0) / n);
    const rmsN = Math.sqrt(nn.reduce((s, v) => s + v * v, 0) / n);
    const model = modelRadii(rmsE, rmsN);
    const emp = empiricalRadii(radial);
    expect(emp.cep50 / model.cep50).toBeGreaterThan(0.98);
    expect(emp.cep50 / model.cep50).toBeLessThan(1.02);
    expect(emp.r95 / model.r95).toBeGreaterThan(0.98);
    expect(emp.r95 / model.r95).toBeLessThan(1.02);
  });

  it("empiricalRadii -- type-7 percentiles, agrees with simple-statistics", () => {
    const radial = Float64Array.of(0.004, 0.011, 0.002, 0.031, 0.008, 0.015, 0.009);
    const r = empiricalRadii(radial);
    // simple-statistics quantile (type 7) as independent oracle
    expect(r.cep50).toBeCloseTo(ss.quantile(Array.from(radial), 0.5), 15);
    expect(r.r95).toBeCloseTo(ss.quantile(Array.from(radial), 0.95), 15);
    // input not mutated
    expect(Array.from(radial)).toEqual([0.004, 0.011, 0.002, 0.031, 0.008, 0.015, 0.009]);
  });

  it("circularRadiusFactor -- rejects p outside [0, 1)", () => {
    expect(() => circularRadiusFactor(1)).toThrow("circularRadiusFactor: p must be in [0, 1)");
  });
});
