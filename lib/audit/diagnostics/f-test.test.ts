import { describe, expect, it } from "vitest";
import jStat from "jstat";
import { fCdf, varianceRatioTest } from "./f-test";

// Sources: scipy 1.17.1 stats.f (computed on this machine) and jstat 1.9.6 as independent oracles; NIST/SEMATECH
// e-Handbook §1.3.6.7.3 F distribution table.

describe("fCdf", () => {
  it("fCdf -- agrees with scipy and jstat (independent oracles)", () => {
    // scipy 1.17.1 stats.f.cdf(2, 20, 20) = 0.9352338272090371; stats.f.cdf(0.5, 5, 12) = 0.22923615040316783;
    // stats.f.sf(3.1, 7, 15) = 0.031241339523978135
    expect(fCdf(2, 20, 20)).toBeCloseTo(0.9352338272090371, 10);
    expect(fCdf(0.5, 5, 12)).toBeCloseTo(0.22923615040316783, 10);
    expect(1 - fCdf(3.1, 7, 15)).toBeCloseTo(0.031241339523978135, 10);
    // jstat.centralF.cdf as a second oracle
    for (const [x, a, b] of [
      [0.7, 3, 9],
      [1.4, 30, 40],
      [5, 2, 2],
    ])
      expect(fCdf(x, a, b)).toBeCloseTo(jStat.centralF.cdf(x, a, b), 7);
    // NIST/SEMATECH e-Handbook §1.3.6.7.3: upper 5 % critical value F(0.95; 10, 10) = 2.978
    expect(fCdf(2.978, 10, 10)).toBeCloseTo(0.95, 3);
  });
  it("varianceRatioTest -- two-sided p-value", () => {
    // two-sided p = 2·(1 − F(ratio)); scipy 1.17.1 stats.f.cdf(2, 20, 20) = 0.9352338272090371
    const r = varianceRatioTest(1, 20, 2, 20)!;
    expect(r.ratio).toBe(2); // NIST/SEMATECH e-Handbook §1.3.5.9: F = s2² / s1² = 2 / 1
    expect(r.p).toBeCloseTo(2 * (1 - 0.9352338272090371), 10); // scipy 1.17.1 as above
    // NIST/SEMATECH e-Handbook §1.3.5.9: the ratio is undefined when a variance is zero, so no test
    expect(varianceRatioTest(0, 20, 2, 20)).toBeNull();
  });
});
