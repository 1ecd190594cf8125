import { describe, expect, it } from "vitest";
import { clearanceShare } from "./clearance";
import { simulatePairs } from "../test-helpers";
import type { DiagnosticPair } from "./types";

const X = [0.0012, -0.0031, 0.0044, 0.0007, -0.0009, 0.0026, 0.0051, -0.0018, 0.0003, 0.0022];
const pairs: DiagnosticPair[] = simulatePairs({ rows: 1, checkpointsPerRow: X.length }).map((p, i) => ({
  ...p,
  cross: X[i],
}));

describe("clearanceShare", () => {
  it("clearanceShare -- normal model of a row component (scipy 1.17.1 stats.norm as independent oracle)", () => {
    // scipy: norm.cdf((−c − m)/s) + norm.sf((c − m)/s) with the sample mean and SD of X
    expect(clearanceShare(pairs, 0.002, "cross").model!).toBeCloseTo(0.48022379055726616, 6);
    expect(clearanceShare(pairs, 0.005, "cross").model!).toBeCloseTo(0.07585935476356717, 6);
  });
  it("clearanceShare -- empirical share with its exact interval", () => {
    const r = clearanceShare(pairs, 0.002, "cross");
    expect(r.empirical!.touched).toBe(5);
    expect(r.empirical!.share).toBe(0.5);
    const one = clearanceShare(pairs, 0.005, "cross");
    expect(one.empirical!.touched).toBe(1);
    // Clopper–Pearson 1/10: Beta⁻¹(0.975; 2, 9) = 0.44502 (scipy 1.17.1 stats.beta.ppf as independent oracle)
    expect(one.empirical!.upper).toBeCloseTo(0.445016, 5);
  });
  it("clearanceShare -- radial model at the circular-normal R95 radius touches 5 %", () => {
    const p = simulatePairs({ rows: 4, seed: 3 });
    let ss = 0;
    for (const q of p) ss += q.radial * q.radial;
    const sigmaC = Math.sqrt(ss / p.length / 2);
    // Rayleigh: P(r ≤ 2.447747σ) = 0.95 (Lord Rayleigh 1880; any probability text)
    expect(clearanceShare(p, 2.447747 * sigmaC, "radial").model!).toBeCloseTo(0.05, 6);
  });
  it("clearanceShare -- refuses a negative clearance", () => {
    expect(() => clearanceShare(pairs, -0.001, "cross")).toThrow(
      "clearanceShare: clearance must be a finite number ≥ 0 metres, got -0.001",
    );
  });
});
