/**
 * Sources: IOGP Publication 373-7-2 (Geomatics Guidance Note 7 part 2), EPSG method 9621 "Similarity
 * transformation", worked example of EPSG transformation 5166 (ED50 / UTM 31N → ETRS89 / UTM 31N):
 * X0 = −129.549 m, Y0 = −208.185 m, M = 1.0000015504, θ = 1.56504″; point pairs from that example and the
 * Catalan cartographic institute (ICGC); least-squares fit of those pairs computed with numpy.linalg.lstsq (not published):
 * M = 1.0000015523, θ = 1.56500″, shifts (−129.549, −208.194) m, residuals ≤ 0.3 mm.
 */
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { applySimilarity, fitSimilarity, fitSimilarityToErrors } from "./helmert";

// IOGP 373-7-2 / ICGC: source (ED50 / UTM 31N) and published target (ETRS89 / UTM 31N), metres
const SOURCE_E = Float64Array.of(300000, 315000, 520000, 420000);
const SOURCE_N = Float64Array.of(4500000, 4740000, 4680000, 4600000);
const TARGET_E = Float64Array.of(299905.06, 314906.904, 519906.767, 419906.005);
const TARGET_N = Float64Array.of(4499796.515, 4739796.774, 4679795.125, 4599795.76);
const EPSG_5166 = { tE: -129.549, tN: -208.185, scale: 1.0000015504, rotationArcsec: 1.56504 };

describe("helmert", () => {
  it("applySimilarity -- EPSG 9621 formula reproduces the published example", () => {
    // IOGP 373-7-2, EPSG method 9621, transformation 5166: 300000, 4500000 → 299905.060, 4499796.515
    const p = applySimilarity(EPSG_5166, 300000, 4500000);
    expect(Math.abs(p.e - 299905.06)).toBeLessThan(0.001);
    expect(Math.abs(p.n - 4499796.515)).toBeLessThan(0.001);
    // the published parameters fit all four pairs to about a centimetre (the pairs are rounded to 1 mm)
    for (let i = 0; i < 4; i++) {
      const q = applySimilarity(EPSG_5166, SOURCE_E[i], SOURCE_N[i]);
      expect(Math.hypot(q.e - TARGET_E[i], q.n - TARGET_N[i])).toBeLessThan(0.01);
    }
  });

  it("fitSimilarity -- recovers EPSG transformation 5166 from the four published pairs", () => {
    const fit = fitSimilarity(SOURCE_E, SOURCE_N, TARGET_E, TARGET_N)!;
    // IOGP 373-7-2, EPSG method 9621, transformation 5166: scale to ~1e-8, rotation ~0.01″
    expect(Math.abs(fit.scale - EPSG_5166.scale)).toBeLessThan(1e-8);
    expect(Math.abs(fit.rotationArcsec - EPSG_5166.rotationArcsec)).toBeLessThan(0.01);
    expect(Math.abs(fit.tE - EPSG_5166.tE)).toBeLessThan(0.001);
    expect(Math.abs(fit.tN - EPSG_5166.tN)).toBeLessThan(0.01);
    // numpy.linalg.lstsq fit to the four IOGP 373-7-2 / ICGC pairs (computed): shifts to the mm, residuals ≤ 0.3 mm
    expect(Math.abs(fit.scale - 1.0000015523)).toBeLessThan(1e-9);
    expect(Math.abs(fit.rotationArcsec - 1.565)).toBeLessThan(0.0005);
    expect(Math.abs(fit.tE - -129.549)).toBeLessThan(0.001);
    expect(Math.abs(fit.tN - -208.194)).toBeLessThan(0.001);
    expect(fit.residualMax).toBeLessThan(0.0003);
    expect(fit.rmse).toBeLessThanOrEqual(fit.residualMax);
    expect(fit.pairs).toBe(4);
  });

  it("fitSimilarity -- exact recovery of known parameters without noise", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.999, max: 1.001, noNaN: true }),
        fc.double({ min: -3600, max: 3600, noNaN: true }),
        fc.double({ min: -500, max: 500, noNaN: true }),
        fc.double({ min: -500, max: 500, noNaN: true }),
        (scale, rotationArcsec, tE, tN) => {
          const params = { scale, rotationArcsec, tE, tN };
          const x = Float64Array.of(612000, 612100, 612050, 612300, 612010);
          const y = Float64Array.of(5812000, 5812010, 5812200, 5812080, 5812333);
          const e = new Float64Array(5);
          const n = new Float64Array(5);
          x.forEach((_, i) => {
            const p = applySimilarity(params, x[i], y[i]);
            e[i] = p.e;
            n[i] = p.n;
          });
          const fit = fitSimilarity(x, y, e, n)!;
          expect(fit.scale).toBeCloseTo(scale, 11);
          expect(fit.rotationArcsec).toBeCloseTo(rotationArcsec, 5);
          expect(fit.tE).toBeCloseTo(tE, 4);
          expect(fit.tN).toBeCloseTo(tN, 4);
          expect(fit.residualMax).toBeLessThan(1e-6);
        },
      ),
    );
  });

  it("fitSimilarity -- scale and rotation do not depend on the origin", () => {
    const a = fitSimilarity(SOURCE_E, SOURCE_N, TARGET_E, TARGET_N)!;
    const shift = (v: Float64Array, d: number) => v.map((x) => x - d);
    const b = fitSimilarity(
      shift(SOURCE_E, 250000),
      shift(SOURCE_N, 4e6),
      shift(TARGET_E, 250000),
      shift(TARGET_N, 4e6),
    )!;
    expect(b.scale).toBeCloseTo(a.scale, 12);
    expect(b.rotationArcsec).toBeCloseTo(a.rotationArcsec, 6);
    expect(b.rmse).toBeCloseTo(a.rmse, 9);
  });

  it("fitSimilarity -- undefined for fewer than two distinct points", () => {
    expect(fitSimilarity(Float64Array.of(1), Float64Array.of(2), Float64Array.of(1), Float64Array.of(2))).toBeNull();
    expect(
      fitSimilarity(Float64Array.of(1, 1), Float64Array.of(2, 2), Float64Array.of(1, 3), Float64Array.of(2, 2)),
    ).toBeNull();
    expect(() =>
      fitSimilarity(Float64Array.of(1, 2), Float64Array.of(1), Float64Array.of(1, 2), Float64Array.of(1, 2)),
    ).toThrow("fitSimilarity: coordinate arrays differ in length");
  });

  it("fitSimilarityToErrors -- same fit from errors and row indices", () => {
    // pairs listed in a different order, source rows reached through an index
    const order = Int32Array.of(2, 0, 3, 1);
    const dE = Float64Array.from(order, (r) => TARGET_E[r] - SOURCE_E[r]);
    const dN = Float64Array.from(order, (r) => TARGET_N[r] - SOURCE_N[r]);
    const a = fitSimilarity(SOURCE_E, SOURCE_N, TARGET_E, TARGET_N)!;
    const b = fitSimilarityToErrors(SOURCE_E, SOURCE_N, order, dE, dN)!;
    expect(b.scale).toBeCloseTo(a.scale, 13);
    expect(b.rotationArcsec).toBeCloseTo(a.rotationArcsec, 8);
    expect(b.tE).toBeCloseTo(a.tE, 6);
    expect(b.tN).toBeCloseTo(a.tN, 6);
    expect(b.residualMax).toBeCloseTo(a.residualMax, 9);
    expect(() => fitSimilarityToErrors(SOURCE_E, SOURCE_N, Int32Array.of(0), dE, dN)).toThrow(
      "fitSimilarity: coordinate arrays differ in length",
    );
  });

  it("fitSimilarity -- inputs not mutated", () => {
    const copies = [SOURCE_E, SOURCE_N, TARGET_E, TARGET_N].map((a) => a.slice());
    fitSimilarity(SOURCE_E, SOURCE_N, TARGET_E, TARGET_N);
    expect([SOURCE_E, SOURCE_N, TARGET_E, TARGET_N]).toEqual(copies);
  });
});
