/**
 * Sources: Abramowitz & Stegun, Handbook of Mathematical Functions (1964) 6.1.8, 26.5.x;
 * jstat 1.9.6 (jStat.gammaln, jStat.ibeta, jStat.beta.inv) as independent oracle.
 */
import fc from "fast-check";
import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { invRegIncBeta, logBeta, logGamma, regIncBeta } from "./special";

describe("logGamma", () => {
  it("logGamma -- integers give ln((n-1)!)", () => {
    let factorial = 1;
    for (let n = 1; n <= 30; n++) {
      // Γ(n) = (n − 1)!, definition of the gamma function
      expect(logGamma(n)).toBeCloseTo(Math.log(factorial), 12);
      factorial *= n;
    }
  });

  it("logGamma -- half-integer value", () => {
    // Γ(1/2) = √π, Abramowitz & Stegun 6.1.8
    expect(logGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 14);
    // Γ(3/2) = √π/2
    expect(logGamma(1.5)).toBeCloseTo(Math.log(Math.sqrt(Math.PI) / 2), 14);
  });

  it("logGamma -- agrees with jstat on random arguments", () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 1e6, noNaN: true }), (x) => {
        // jstat.gammaln as independent oracle (its own accuracy is about 1e-10 relative)
        const ours = logGamma(x);
        const oracle = jStat.gammaln(x);
        expect(Math.abs(ours - oracle)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(oracle)));
      }),
    );
  });

  it("logGamma -- rejects non-positive input", () => {
    expect(() => logGamma(0)).toThrow("logGamma: x must be > 0");
  });
});

describe("regIncBeta", () => {
  it("regIncBeta -- closed forms", () => {
    for (const x of [0.01, 0.2, 0.5, 0.77, 0.999]) {
      for (const b of [0.5, 1, 3, 20]) {
        // I_x(1, b) = 1 − (1 − x)^b, from the definition of B(x; a, b)
        expect(regIncBeta(x, 1, b)).toBeCloseTo(1 - (1 - x) ** b, 13);
        // I_x(b, 1) = x^b
        expect(regIncBeta(x, b, 1)).toBeCloseTo(x ** b, 13);
      }
    }
    // symmetry I_x(a, b) = 1 − I_{1−x}(b, a), Abramowitz & Stegun 26.5.2
    expect(regIncBeta(0.5, 7, 7)).toBeCloseTo(0.5, 14);
    expect(regIncBeta(0.3, 2.5, 4) + regIncBeta(0.7, 4, 2.5)).toBeCloseTo(1, 14);
    // I_x(½, ½) = (2/π)·asin(√x), arcsine distribution
    expect(regIncBeta(0.3, 0.5, 0.5)).toBeCloseTo((2 / Math.PI) * Math.asin(Math.sqrt(0.3)), 13);
  });

  it("regIncBeta -- agrees with jstat on random arguments", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        fc.double({ min: 0.1, max: 500, noNaN: true }),
        fc.double({ min: 0.1, max: 500, noNaN: true }),
        (x, a, b) => {
          // jstat.ibeta as independent oracle (continued fraction stopped at 3e-7)
          expect(Math.abs(regIncBeta(x, a, b) - jStat.ibeta(x, a, b))).toBeLessThan(2e-6);
        },
      ),
    );
  });

  it("regIncBeta -- ends of the interval", () => {
    expect(regIncBeta(0, 2, 3)).toBe(0);
    expect(regIncBeta(1, 2, 3)).toBe(1);
    expect(() => regIncBeta(0.5, 0, 1)).toThrow("regIncBeta: a and b must be > 0");
  });

  it("logBeta -- B(a, b) = Γ(a)Γ(b)/Γ(a+b)", () => {
    // B(2, 3) = 1!·2!/4! = 1/12
    expect(logBeta(2, 3)).toBeCloseTo(Math.log(1 / 12), 13);
  });
});

function nextUp(x: number): number {
  if (x >= 1) return 1;
  const f = Float64Array.of(x);
  const i = new BigInt64Array(f.buffer);
  i[0] += 1n; // positive doubles: next representable value
  return f[0];
}
function nextDown(x: number): number {
  if (x <= 0) return 0;
  const f = Float64Array.of(x);
  const i = new BigInt64Array(f.buffer);
  i[0] -= 1n;
  return f[0];
}

describe("invRegIncBeta", () => {
  it("invRegIncBeta -- inverts regIncBeta", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-9, max: 1 - 1e-9, noNaN: true }),
        fc.double({ min: 0.2, max: 2000, noNaN: true }),
        fc.double({ min: 0.2, max: 2000, noNaN: true }),
        (p, a, b) => {
          const x = invRegIncBeta(p, a, b);
          expect(x).toBeGreaterThanOrEqual(0);
          expect(x).toBeLessThanOrEqual(1);
          // Either I_x hits p to what I_x itself resolves (1e-11), or the exact root lies within one ulp of x
          // (where the density is steep, e.g. just below 1 with b < 1, neighbouring doubles differ a lot in I).
          const residual = Math.abs(regIncBeta(x, a, b) - p);
          if (residual > 1e-11) {
            expect(regIncBeta(nextDown(x), a, b) - 1e-11).toBeLessThanOrEqual(p);
            expect(regIncBeta(nextUp(x), a, b) + 1e-11).toBeGreaterThanOrEqual(p);
          }
        },
      ),
      { numRuns: 500 },
    );
  });

  it("invRegIncBeta -- agrees with jstat.beta.inv", () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.001, max: 0.999, noNaN: true }),
        fc.double({ min: 1, max: 300, noNaN: true }),
        fc.double({ min: 1, max: 300, noNaN: true }),
        (p, a, b) => {
          // jstat.beta.inv as independent oracle
          expect(invRegIncBeta(p, a, b)).toBeCloseTo(jStat.beta.inv(p, a, b), 6);
        },
      ),
    );
  });

  it("invRegIncBeta -- closed form for a = 1", () => {
    // I_x(1, n) = 1 − (1 − x)^n ⇒ x = 1 − (1 − p)^(1/n)
    expect(invRegIncBeta(0.975, 1, 20)).toBeCloseTo(1 - 0.025 ** (1 / 20), 14);
  });

  it("invRegIncBeta -- p at the ends and out of range", () => {
    expect(invRegIncBeta(0, 3, 4)).toBe(0);
    expect(invRegIncBeta(1, 3, 4)).toBe(1);
    expect(() => invRegIncBeta(1.5, 3, 4)).toThrow("invRegIncBeta: p must be in [0, 1]");
  });

  it("invRegIncBeta -- large parameters (a million checkpoints)", () => {
    const a = 900_000;
    const b = 100_001;
    const x = invRegIncBeta(0.025, a, b);
    // normal approximation to Beta(a, b) as a sanity check (common practice, no source): mean ± 1.96 sd
    const m = a / (a + b);
    const sd = Math.sqrt((a * b) / ((a + b) ** 2 * (a + b + 1)));
    expect(x).toBeCloseTo(m - 1.959964 * sd, 5);
    expect(Math.abs(regIncBeta(x, a, b) - 0.025)).toBeLessThan(1e-9);
  });
});
