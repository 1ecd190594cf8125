/**
 * Sources: FGDC-STD-007.3-1998 Appendix 3-A (RMSE_x, RMSE_r); simple-statistics 7.12.1 (mean,
 * sampleStandardDeviation, rootMeanSquare) as independent oracle.
 */
import fc from "fast-check";
import * as ss from "simple-statistics";
import { describe, expect, it } from "vitest";
import { mean, rmse, rmseRadial, sampleSd } from "./rmse";

const errors = fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 2, maxLength: 200 });

describe("rmse", () => {
  it("rmse -- FGDC formula on a hand example", () => {
    // FGDC-STD-007.3-1998 Appendix 3-A: RMSE_x = sqrt(Σ(x_data − x_check)²/n)
    expect(rmse(Float64Array.of(0.03, -0.04))).toBeCloseTo(Math.sqrt((0.0009 + 0.0016) / 2), 15);
    expect(rmse(Float64Array.of(0, 0, 0))).toBe(0);
    expect(rmse(new Float64Array(0))).toBeNaN();
  });

  it("rmseRadial -- RMSE_r = sqrt(RMSE_x² + RMSE_y²)", () => {
    // FGDC-STD-007.3-1998 Appendix 3-A
    expect(rmseRadial(0.03, 0.04)).toBeCloseTo(0.05, 15);
    fc.assert(
      fc.property(errors, errors, (e, n) => {
        const m = Math.min(e.length, n.length);
        const eE = e.slice(0, m);
        const eN = n.slice(0, m);
        // RMSE_r equals the RMS of the radial errors
        const radial = eE.map((v, i) => Math.hypot(v, eN[i]));
        expect(rmseRadial(rmse(eE), rmse(eN))).toBeCloseTo(rmse(radial), 10);
      }),
    );
  });

  it("rmse -- agrees with simple-statistics rootMeanSquare", () => {
    fc.assert(
      fc.property(errors, (v) => {
        expect(rmse(v)).toBeCloseTo(ss.rootMeanSquare(v), 12);
      }),
    );
  });

  it("mean -- agrees with simple-statistics", () => {
    fc.assert(
      fc.property(errors, (v) => {
        expect(mean(v)).toBeCloseTo(ss.mean(v), 12);
      }),
    );
    expect(mean([])).toBeNaN();
  });

  it("sampleSd -- n − 1 divisor, agrees with simple-statistics", () => {
    // hand example: 1,2,3,4 → variance 5/3
    expect(sampleSd(Float64Array.of(1, 2, 3, 4))).toBeCloseTo(Math.sqrt(5 / 3), 15);
    fc.assert(
      fc.property(errors, (v) => {
        expect(sampleSd(v)).toBeCloseTo(ss.sampleStandardDeviation(v), 12);
      }),
    );
    expect(sampleSd(Float64Array.of(0.01))).toBeNaN();
  });

  it("sampleSd -- keeps precision with a large common offset", () => {
    // values 1e6 + {0.001, 0.002, 0.003}: exact SD 0.001
    const v = Float64Array.of(1e6 + 0.001, 1e6 + 0.002, 1e6 + 0.003);
    expect(sampleSd(v)).toBeCloseTo(0.001, 9);
  });
});
