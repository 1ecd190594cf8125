/**
 * Sources: Clopper & Pearson, Biometrika 26 (1934) 404–413 (exact bounds); Turpin, Patin, Jens & Turpin, "A modified
 * rule of three for the one-sided binomial confidence interval" (exact one-sided lower bound α^(1/n) when all n
 * trials succeed); Collins, ARL-TR-5214 (2010) (one-sided Clopper–Pearson bound and zero-failure sample sizes);
 * jstat 1.9.6 jStat.beta.inv as independent oracle.
 */
import fc from "fast-check";
import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { clopperPearson } from "./intervals";
import { groupTrust, moreCheckpointsNeeded, oneSidedLowerBound, shareTrust } from "./trust";

const P95C95 = { requiredShare: 0.95, confidence: 0.95 };

describe("oneSidedLowerBound", () => {
  it("oneSidedLowerBound -- zero failures: α^(1/n), so 59 checkpoints show 95 % at 95 % and 58 do not", () => {
    // Turpin et al., one-sided exact lower bound L = α^(1/n) when all n succeed
    expect(oneSidedLowerBound(59, 59, 0.95)).toBeCloseTo(0.05 ** (1 / 59), 14);
    // success-run: 0.95^59 = 0.0485 ≤ 0.05, 0.95^58 = 0.0510 > 0.05 (Collins, ARL-TR-5214)
    expect(0.95 ** 59).toBeLessThanOrEqual(0.05);
    expect(0.95 ** 58).toBeGreaterThan(0.05);
    expect(oneSidedLowerBound(59, 59, 0.95)!).toBeGreaterThanOrEqual(0.95);
    expect(oneSidedLowerBound(58, 58, 0.95)!).toBeLessThan(0.95);
    // the two-sided lower end is the α/2 bound (0.025^(1/59) ≈ 0.9394): it would wrongly refuse 59 (Clopper & Pearson 1934)
    expect(clopperPearson(59, 59, 0.95)!.lower).toBeLessThan(0.95);
  });

  it("oneSidedLowerBound -- equals the lower end of the two-sided interval at 1 − 2α", () => {
    // Clopper & Pearson (1934): each end of the two-sided interval is a one-sided bound at α/2
    for (const [k, n] of [
      [81, 263],
      [15, 148],
      [374, 375],
      [3, 4],
    ])
      expect(oneSidedLowerBound(k, n, 0.95)).toBeCloseTo(clopperPearson(k, n, 0.9)!.lower, 12);
  });

  it("oneSidedLowerBound -- agrees with jstat.beta.inv(α, k, n − k + 1) on random k/n", () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 2000 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.constantFrom(0.8, 0.9, 0.95, 0.99),
        (n, f, c) => {
          const k = Math.max(1, Math.min(n, Math.round(f * n)));
          const oracle = k === n ? (1 - c) ** (1 / n) : jStat.beta.inv(1 - c, k, n - k + 1); // jstat as independent oracle
          expect(oneSidedLowerBound(k, n, c)!).toBeCloseTo(oracle, 7);
        },
      ),
      { numRuns: 200 },
    );
  });

  it("oneSidedLowerBound -- none within gives 0, no checkpoints gives null, bad counts throw", () => {
    expect(oneSidedLowerBound(0, 12, 0.95)).toBe(0); // Clopper & Pearson (1934): k = 0 has lower bound 0
    expect(oneSidedLowerBound(0, 0, 0.95)).toBeNull();
    expect(() => oneSidedLowerBound(5, 4, 0.95)).toThrow("trust: need integers 0 ≤ outside ≤ n");
  });
});

describe("moreCheckpointsNeeded", () => {
  it("moreCheckpointsNeeded -- zero-failure sample sizes of the success-run formula n = ⌈ln(1 − C) / ln R⌉", () => {
    // Collins, ARL-TR-5214 (2010), success-run: 95 %/95 % → 59; 90 %/90 % → 22; 99 %/95 % → 299
    expect(moreCheckpointsNeeded(0, 0, P95C95)).toBe(59);
    expect(moreCheckpointsNeeded(0, 0, { requiredShare: 0.9, confidence: 0.9 })).toBe(22);
    expect(moreCheckpointsNeeded(0, 0, { requiredShare: 0.99, confidence: 0.95 })).toBe(299);
    expect(moreCheckpointsNeeded(20, 0, P95C95)).toBe(39);
    expect(moreCheckpointsNeeded(59, 0, P95C95)).toBe(0);
  });

  it("moreCheckpointsNeeded -- one and two failures: 93 and 124 checkpoints for 95 %/95 %", () => {
    // from memory (attribute sampling tables, c = 1 → 93, c = 2 → 124); checked with jstat as independent oracle
    expect(1 + moreCheckpointsNeeded(1, 1, P95C95)!).toBe(93);
    expect(moreCheckpointsNeeded(10, 1, P95C95)).toBe(83);
    expect(jStat.beta.inv(0.05, 92, 2)).toBeGreaterThanOrEqual(0.95); // jstat as independent oracle
    expect(jStat.beta.inv(0.05, 91, 2)).toBeLessThan(0.95); // jstat as independent oracle
    expect(2 + moreCheckpointsNeeded(2, 2, P95C95)!).toBe(124);
    expect(jStat.beta.inv(0.05, 122, 3)).toBeGreaterThanOrEqual(0.95); // jstat as independent oracle
    expect(jStat.beta.inv(0.05, 121, 3)).toBeLessThan(0.95); // jstat as independent oracle
  });

  it("moreCheckpointsNeeded -- a required share of 100 % can never be shown", () => {
    expect(moreCheckpointsNeeded(500, 0, { requiredShare: 1, confidence: 0.95 })).toBeNull();
  });
});

describe("shareTrust", () => {
  it("shareTrust -- 59 within meets 95 %/95 %; 58 within is not enough evidence yet, one more settles it", () => {
    const a = shareTrust({ n: 59, outside: 0 }, P95C95);
    expect(a).toMatchObject({ n: 59, outside: 0, share: 1, word: "meets", moreNeeded: null });
    expect(a.lowerBound).toBeCloseTo(0.05 ** (1 / 59), 14); // Turpin et al., α^(1/n)
    expect(a.interval!.lower).toBeCloseTo(0.025 ** (1 / 59), 12); // Clopper & Pearson (1934), two-sided, description
    const b = shareTrust({ n: 58, outside: 0 }, P95C95);
    expect(b).toMatchObject({ word: "not enough evidence yet", moreNeeded: 1 });
  });

  it("shareTrust -- an observed share below the required share does not meet", () => {
    // 3 of 20 outside: 85 % < 95 % observed (common practice, no source)
    const t = shareTrust({ n: 20, outside: 3 }, P95C95);
    expect(t).toMatchObject({ share: 0.85, word: "does not meet", moreNeeded: null });
  });

  it("shareTrust -- 374 of 375 meets 95 % at 95 % with a bound of 98.7 %", () => {
    const t = shareTrust({ n: 375, outside: 1 }, P95C95);
    expect(t.word).toBe("meets");
    expect(t.lowerBound).toBeCloseTo(jStat.beta.inv(0.05, 374, 2), 8); // jstat as independent oracle
    expect(t.lowerBound).toBeCloseTo(0.9874, 4); // jstat as independent oracle: beta.inv(0.05, 374, 2)
    expect(t.lowerBound!).toBeGreaterThan(t.interval!.lower); // one-sided bound is tighter than the α/2 end
  });

  it("shareTrust -- no checkpoints: not enough evidence yet, the zero-failure number settles it", () => {
    const t = shareTrust({ n: 0, outside: 0 }, P95C95);
    expect(t).toMatchObject({ share: null, lowerBound: null, interval: null, word: "not enough evidence yet" });
    expect(t.moreNeeded).toBe(59); // success-run, Collins ARL-TR-5214
  });

  it("shareTrust -- bad input throws greppable messages", () => {
    expect(() => shareTrust({ n: 3, outside: 4 }, P95C95)).toThrow("trust: need integers");
    expect(() => shareTrust({ n: 3, outside: 0 }, { requiredShare: 0, confidence: 0.95 })).toThrow(
      "trust: required share",
    );
    expect(() => shareTrust({ n: 3, outside: 0 }, { requiredShare: 0.9, confidence: 1 })).toThrow("trust: confidence");
  });
});

describe("groupTrust", () => {
  const profile = { ...P95C95, radialM: 0.01, crossM: 0.008, alongM: null };
  it("groupTrust -- a 95th percentile over its limit does not meet, worst limit first", () => {
    const t = groupTrust({ n: 80, outside: 0, p95Radial: 0.011, p95Cross: 0.016, p95Along: 0.5 }, profile);
    expect(t.word).toBe("does not meet");
    expect(t.exceeded.map((e) => e.limit)).toEqual(["cross", "radial"]); // along has no limit
    expect(t.moreNeeded).toBeNull();
  });

  it("groupTrust -- within every limit, the share test decides", () => {
    const ok = { p95Radial: 0.004, p95Cross: 0.003, p95Along: null };
    expect(groupTrust({ n: 80, outside: 0, ...ok }, profile).word).toBe("meets");
    expect(groupTrust({ n: 30, outside: 0, ...ok }, profile)).toMatchObject({
      word: "not enough evidence yet",
      moreNeeded: 29,
    });
  });
});
