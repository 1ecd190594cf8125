import { describe, expect, it } from "vitest";
import jStat from "jstat";
import { meanInterval } from "./mean-interval";

// Sources: NIST/SEMATECH e-Handbook §1.3.6.7.2 (Student's t table); scipy 1.17.1 stats.ttest_1samp (computed on this
// machine) and jstat 1.9.6 as independent oracles.

describe("meanInterval", () => {
  it("meanInterval -- t critical values of the handbook table", () => {
    // NIST/SEMATECH e-Handbook §1.3.6.7.2, upper critical values of Student's t: t(0.975, 1) = 12.706, t(0.975, 10) = 2.228
    const two = meanInterval([1, 3], 0.95); // mean 2, sd √2, se 1
    expect(two.halfWidth!).toBeCloseTo(12.706, 3);
    const eleven = meanInterval(
      Array.from({ length: 11 }, (_, i) => i),
      0.95,
    );
    expect(eleven.halfWidth! / eleven.se!).toBeCloseTo(2.228, 3);
    // jstat as independent oracle for the same quantile
    expect(eleven.halfWidth! / eleven.se!).toBeCloseTo(jStat.studentt.inv(0.975, 10), 6);
  });
  it("meanInterval -- one-sample t-test (scipy 1.17.1 stats.ttest_1samp as independent oracle)", () => {
    const x = [0.001, 0.003, -0.0005, 0.0022, 0.0011, 0.0017];
    const r = meanInterval(x);
    // scipy: t = 2.902190423841428, p = 0.033704624973327546; half width t(0.975,5)·s/√n = 0.0012547962292786326
    expect(r.mean! / r.se!).toBeCloseTo(2.902190423841428, 9);
    expect(r.p!).toBeCloseTo(0.033704624973327546, 9);
    expect(r.halfWidth!).toBeCloseTo(0.0012547962292786326, 12);
    expect(r.significant).toBe(true);
  });
  it("meanInterval -- too few values", () => {
    // common practice, no source: no interval from fewer than two values
    expect(meanInterval([]).mean).toBeNull();
    expect(meanInterval([0.002]).halfWidth).toBeNull();
    expect(meanInterval([0.002]).significant).toBe(false);
  });
  it("meanInterval -- does not modify its input", () => {
    // common practice, no source: the core never mutates its inputs
    const x = Float64Array.of(3, 1, 2);
    meanInterval(x);
    expect([...x]).toEqual([3, 1, 2]);
  });
});
