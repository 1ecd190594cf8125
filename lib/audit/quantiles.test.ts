/**
 * Sources: Hyndman & Fan, The American Statistician 50 (1996) 361-365, definition 7;
 * simple-statistics 7.12.1 (quantile, quantileSorted, medianAbsoluteDeviation: type 7) and
 * jstat 1.9.6 (jStat.quantiles with alphap = betap = 1, which is type 7) as independent oracles.
 * (jStat.percentile is not used: it does not interpolate within the last interval.)
 */
import fc from "fast-check";
import jStat from "jstat";
import * as ss from "simple-statistics";
import { describe, expect, it } from "vitest";
import { median, medianAbsoluteDeviation, quantileSorted, quantiles, quantilesInPlace } from "./quantiles";

const sample = fc.array(fc.double({ min: -1e3, max: 1e3, noNaN: true, noDefaultInfinity: true }), {
  minLength: 1,
  maxLength: 300,
});
const tiedSample = fc.array(fc.integer({ min: -3, max: 3 }), { minLength: 1, maxLength: 300 });
const probability = fc.double({ min: 0, max: 1, noNaN: true });

describe("quantiles", () => {
  it("quantileSorted -- hand example of definition 7", () => {
    // Hyndman & Fan (1996) definition 7: h = (n − 1)p; for 1..4 at p = 0.5, h = 1.5 → 2.5; at p = 0.95, h = 2.85 → 3.85
    expect(quantileSorted(Float64Array.of(1, 2, 3, 4), 0.5)).toBe(2.5);
    expect(quantileSorted(Float64Array.of(1, 2, 3, 4), 0.95)).toBeCloseTo(3.85, 14);
    expect(quantileSorted(Float64Array.of(7), 0.3)).toBe(7);
    expect(quantileSorted(new Float64Array(0), 0.5)).toBeNaN();
  });

  it("quantiles -- agree with simple-statistics and jstat (type 7)", () => {
    fc.assert(
      fc.property(fc.oneof(sample, tiedSample), probability, (values, p) => {
        const ours = quantiles(values, [p])[0];
        // simple-statistics quantile (linear interpolation, type 7) as independent oracle
        expect(ours).toBeCloseTo(ss.quantile(values, p), 9);
        // jstat.quantiles with alphap = betap = 1 (type 7) as a second oracle; it needs n ≥ 2
        if (values.length >= 2) expect(ours).toBeCloseTo(jStat.quantiles(values, [p], 1, 1)[0], 9);
      }),
      { numRuns: 500 },
    );
  });

  it("quantilesInPlace -- several quantiles at once match sorting", () => {
    fc.assert(
      fc.property(fc.oneof(sample, tiedSample), fc.array(probability, { minLength: 1, maxLength: 6 }), (values, ps) => {
        const sorted = Float64Array.from(values).sort();
        const got = quantilesInPlace(Float64Array.from(values), ps);
        ps.forEach((p, i) => expect(got[i]).toBe(quantileSorted(sorted, p)));
      }),
      { numRuns: 500 },
    );
  });

  it("quantilesInPlace -- adversarial orders and many ties", () => {
    const n = 100_001;
    const orders: Record<string, Float64Array> = {
      ascending: Float64Array.from({ length: n }, (_, i) => i),
      descending: Float64Array.from({ length: n }, (_, i) => n - i),
      organPipe: Float64Array.from({ length: n }, (_, i) => Math.min(i, n - i)),
      constant: new Float64Array(n).fill(0.012),
      twoValues: Float64Array.from({ length: n }, (_, i) => (i % 2 ? 0.01 : 0.02)),
    };
    for (const values of Object.values(orders)) {
      const sorted = Float64Array.from(values).sort();
      const got = quantilesInPlace(Float64Array.from(values), [0.5, 0.95, 0.999]);
      expect(got).toEqual([0.5, 0.95, 0.999].map((p) => quantileSorted(sorted, p)));
    }
  });

  it("quantiles -- input not mutated, empty gives NaN, bad p throws", () => {
    const values = Float64Array.of(3, 1, 2);
    quantiles(values, [0.5]);
    expect(Array.from(values)).toEqual([3, 1, 2]);
    expect(quantiles([], [0.5, 0.95])).toEqual([Number.NaN, Number.NaN]);
    expect(() => quantiles(values, [1.2])).toThrow("quantile: p must be in [0, 1]");
  });

  it("median -- usual median", () => {
    expect(median(Float64Array.of(3, 1, 2, 10))).toBe(2.5);
    expect(median(Float64Array.of(3, 1, 2))).toBe(2);
  });

  it("medianAbsoluteDeviation -- agrees with simple-statistics", () => {
    // hand example: median 3, |deviations| 2,1,0,1,97 → 1
    expect(medianAbsoluteDeviation(Float64Array.of(1, 2, 3, 4, 100))).toBe(1);
    fc.assert(
      fc.property(sample, (values) => {
        // simple-statistics medianAbsoluteDeviation as independent oracle
        expect(medianAbsoluteDeviation(values)).toBeCloseTo(ss.medianAbsoluteDeviation(values), 9);
      }),
    );
  });
});
