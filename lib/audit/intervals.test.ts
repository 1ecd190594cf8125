/**
 * Sources: Newcombe, Stat Med 17:857-872 (1998), Table I (Clopper–Pearson intervals); closed form of the
 * Clopper–Pearson bound for k = n; Clopper & Pearson, Biometrika 26 (1934) (coverage ≥ nominal);
 * jstat 1.9.6 (jStat.beta.inv, jStat.studentt.inv, jStat.normal.inv) as independent oracle;
 * closed forms of the t quantile for df = 1 (Cauchy) and df = 2 (from memory).
 */
import fc from "fast-check";
import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { clopperPearson, meanConfidenceInterval, studentTCdf, studentTQuantile } from "./intervals";
import { logGamma } from "./special";

describe("clopperPearson", () => {
  it("clopperPearson -- published examples", () => {
    // Newcombe, Stat Med 17:857-872 (1998), Table I: 81/263 → 0.2527–0.3676
    const a = clopperPearson(81, 263, 0.95)!;
    expect(a.lower).toBeCloseTo(0.2527, 4);
    expect(a.upper).toBeCloseTo(0.3676, 4);
    // Newcombe 1998, Table I: 15/148 → 0.0578–0.1617
    const b = clopperPearson(15, 148, 0.95)!;
    expect(b.lower).toBeCloseTo(0.0578, 4);
    expect(b.upper).toBeCloseTo(0.1617, 4);
    // Newcombe 1998, Table I: 0/20 → 0–0.1684
    const c = clopperPearson(0, 20, 0.95)!;
    expect(c.lower).toBe(0);
    expect(c.upper).toBeCloseTo(0.1684, 4);
  });

  it("clopperPearson -- all within tolerance, closed form", () => {
    // closed form for k = n: lower = (α/2)^(1/n) = 0.025^(1/20) = 0.8316
    const d = clopperPearson(20, 20, 0.95)!;
    expect(d.lower).toBeCloseTo(0.025 ** (1 / 20), 12);
    expect(d.lower).toBeCloseTo(0.8316, 4);
    expect(d.upper).toBe(1);
    // and for k = 0 the upper bound is 1 − (α/2)^(1/n)
    expect(clopperPearson(0, 37, 0.9)!.upper).toBeCloseTo(1 - 0.05 ** (1 / 37), 12);
  });

  it("clopperPearson -- agrees with jstat.beta.inv on random k/n", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 2, max: 2000 }).chain((n) => fc.tuple(fc.constant(n), fc.integer({ min: 1, max: n - 1 }))),
        fc.constantFrom(0.8, 0.9, 0.95, 0.99),
        ([n, k], conf) => {
          const alpha = 1 - conf;
          const ci = clopperPearson(k, n, conf)!;
          // jstat.beta.inv as independent oracle
          expect(ci.lower).toBeCloseTo(jStat.beta.inv(alpha / 2, k, n - k + 1), 6);
          expect(ci.upper).toBeCloseTo(jStat.beta.inv(1 - alpha / 2, k + 1, n - k), 6);
        },
      ),
      { numRuns: 300 },
    );
  });

  it("clopperPearson -- exact coverage is at least the confidence", () => {
    // Clopper & Pearson 1934: the interval is conservative. Exact coverage by summing binomial probabilities.
    const logChoose = (n: number, k: number) => logGamma(n + 1) - logGamma(k + 1) - logGamma(n - k + 1);
    for (const n of [10, 20, 57]) {
      const cis = Array.from({ length: n + 1 }, (_, k) => clopperPearson(k, n, 0.95)!);
      for (const p of [0.03, 0.2, 0.5, 0.81, 0.97]) {
        let coverage = 0;
        for (let k = 0; k <= n; k++) {
          if (cis[k].lower <= p && p <= cis[k].upper) {
            coverage += Math.exp(logChoose(n, k) + k * Math.log(p) + (n - k) * Math.log1p(-p));
          }
        }
        expect(coverage).toBeGreaterThanOrEqual(0.95 - 1e-12);
      }
    }
  });

  it("clopperPearson -- no trials and bad counts", () => {
    expect(clopperPearson(0, 0, 0.95)).toBeNull();
    expect(() => clopperPearson(3, 2, 0.95)).toThrow("clopperPearson: need integers 0 ≤ k ≤ n");
    expect(() => clopperPearson(1.5, 2, 0.95)).toThrow("clopperPearson: need integers");
    expect(() => clopperPearson(1, 2, 1)).toThrow("clopperPearson: probability must be in (0, 1)");
  });
});

describe("studentTQuantile", () => {
  it("studentTQuantile -- agrees with jstat.studentt.inv", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 500 }), fc.double({ min: 0.0005, max: 0.9995, noNaN: true }), (df, p) => {
        // jstat.studentt.inv as independent oracle (its own precision is about 1e-7 relative)
        const oracle = jStat.studentt.inv(p, df);
        expect(Math.abs(studentTQuantile(p, df) - oracle)).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(oracle)));
      }),
      { numRuns: 500 },
    );
  });

  it("studentTQuantile -- closed forms for df = 1 and df = 2", () => {
    for (const p of [0.001, 0.1, 0.4, 0.5000001, 0.6, 0.975, 0.9995]) {
      // df = 1 is the Cauchy distribution: t = tan(π(p − ½)) (from memory)
      expect(studentTQuantile(p, 1)).toBeCloseTo(Math.tan(Math.PI * (p - 0.5)), 9);
      // df = 2: t = (2p − 1)/sqrt(2p(1 − p)) (from memory)
      expect(studentTQuantile(p, 2)).toBeCloseTo((2 * p - 1) / Math.sqrt(2 * p * (1 - p)), 11);
    }
  });

  it("studentTQuantile -- tends to the normal quantile", () => {
    // jstat.normal.inv as oracle for z_0.975 = 1.959964; first-order correction z + (z³ + z)/(4 df) (Cornish–Fisher, from memory)
    const z = jStat.normal.inv(0.975, 0, 1);
    const df = 1e6;
    expect(studentTQuantile(0.975, df)).toBeCloseTo(z + (z ** 3 + z) / (4 * df), 9);
  });

  it("studentTQuantile -- symmetric and inverts the CDF", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 1e4, noNaN: true }),
        fc.double({ min: 1e-6, max: 1 - 1e-6, noNaN: true }),
        (df, p) => {
          const t = studentTQuantile(p, df);
          // relative comparison: t reaches 1e11 for df = 0.5 and p = 1e-6 (1 − p itself is rounded)
          expect(Math.abs(studentTQuantile(1 - p, df) + t)).toBeLessThanOrEqual(1e-8 * Math.max(1, Math.abs(t)));
          expect(studentTCdf(t, df)).toBeCloseTo(p, 9);
        },
      ),
    );
  });

  it("studentTCdf -- agrees with jstat.studentt.cdf", () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 300 }), fc.double({ min: -50, max: 50, noNaN: true }), (df, t) => {
        // jstat.studentt.cdf as independent oracle
        expect(studentTCdf(t, df)).toBeCloseTo(jStat.studentt.cdf(t, df), 6);
      }),
    );
  });
});

describe("meanConfidenceInterval", () => {
  it("meanConfidenceInterval -- mean ± t·sd/√n", () => {
    // jstat.studentt.inv as independent oracle for t_{0.975, 24}
    const ci = meanConfidenceInterval(0.01, 0.02, 25, 0.95)!;
    const half = (jStat.studentt.inv(0.975, 24) * 0.02) / 5;
    expect(ci.lower).toBeCloseTo(0.01 - half, 8);
    expect(ci.upper).toBeCloseTo(0.01 + half, 8);
  });

  it("meanConfidenceInterval -- undefined below two pairs", () => {
    expect(meanConfidenceInterval(0.01, Number.NaN, 1, 0.95)).toBeNull();
    expect(meanConfidenceInterval(0.01, 0.002, 0, 0.95)).toBeNull();
  });
});
