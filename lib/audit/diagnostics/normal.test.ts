import { describe, expect, it } from "vitest";
import jStat from "jstat";
import { erfc, normalCdf } from "./normal";

// Sources: Abramowitz & Stegun (1964) Table 26.1; scipy 1.17.1 stats.norm (computed on this machine) and jstat 1.9.6
// erfc as independent oracles.

describe("normalCdf", () => {
  it("normalCdf -- handbook values", () => {
    // Abramowitz & Stegun (1964) Table 26.1: Φ(1.96) = 0.9750021, Φ(1) = 0.8413447
    expect(normalCdf(1.96)).toBeCloseTo(0.9750021, 6);
    expect(normalCdf(1)).toBeCloseTo(0.8413447, 6);
    expect(normalCdf(0)).toBeCloseTo(0.5, 7); // Abramowitz & Stegun (1964) Table 26.1: Φ(0) = 0.5
  });
  it("normalCdf -- tails keep relative precision (scipy 1.17.1 stats.norm.cdf as independent oracle)", () => {
    // scipy.stats.norm.cdf(-5) = 2.866515718791933e-07, norm.cdf(-2.5) = 0.006209665325776132
    expect(Math.abs(normalCdf(-5) / 2.866515718791933e-7 - 1)).toBeLessThan(2e-7);
    expect(Math.abs(normalCdf(-2.5) / 0.006209665325776132 - 1)).toBeLessThan(2e-7);
  });
  it("erfc -- agrees with jstat over a grid (jstat as independent oracle)", () => {
    // jstat 1.9.6 jStat.erfc (a general-purpose reference library) at every quarter from −4 to 4
    for (let x = -4; x <= 4; x += 0.25)
      expect(Math.abs(erfc(x) - jStat.erfc(x))).toBeLessThan(2e-7 * Math.max(erfc(x), 1e-3));
  });
});
