/**
 * Sources: Clopper & Pearson, Biometrika 26 (1934) 404–413 (one-sided exact bound); Collins, ARL-TR-5214 (2010)
 * (zero-failure sample size: the smallest n with p^n ≤ α); Wilks, Ann. Math. Statist. 12 (1941) 91–96 (one-sided
 * 95 %/95 % sample sizes 59, 93, 124 for 0, 1, 2 failures — from memory, each checked here with jstat);
 * jstat 1.9.6 jStat.binomial.cdf as independent oracle; FGDC-STD-007.3-1998 §3.2.2 (20 checkpoints);
 * ASPRS Positional Accuracy Standards Ed. 2 v1.0 (2023), summary of changes (minimum raised from 20 to 30).
 */
import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { checkpointsForShare, planSampleSize, STANDARD_MINIMUMS } from "./sample-size";

/** Smallest n with P(failures ≤ c | n, 1 − p) ≤ α, by brute force with jstat (independent of our Beta inverse). */
function oracle(p: number, confidence: number, c: number): number {
  for (let n = c + 1; n < 5000; n++) if (jStat.binomial.cdf(c, n, 1 - p) <= 1 - confidence) return n;
  throw new Error("no n");
}

describe("checkpointsForShare", () => {
  it("checkpointsForShare -- zero failures at 95 %/95 %: 59", () => {
    // Collins, ARL-TR-5214: n = ⌈ln α / ln p⌉ = ⌈ln 0.05 / ln 0.95⌉ = 59
    expect(checkpointsForShare({ requiredShare: 0.95, confidence: 0.95 }, 0)).toBe(59);
    expect(Math.ceil(Math.log(0.05) / Math.log(0.95))).toBe(59);
  });

  it("checkpointsForShare -- one and two failures at 95 %/95 %: 93 and 124", () => {
    // Wilks (1941) second- and third-order one-sided 95/95 (from memory); jstat binomial cdf as oracle
    expect(checkpointsForShare({ requiredShare: 0.95, confidence: 0.95 }, 1)).toBe(93);
    expect(checkpointsForShare({ requiredShare: 0.95, confidence: 0.95 }, 2)).toBe(124);
    expect(oracle(0.95, 0.95, 1)).toBe(93);
    expect(oracle(0.95, 0.95, 2)).toBe(124);
  });

  it("checkpointsForShare -- agrees with the jstat binomial oracle over shares, confidences and allowances", () => {
    const cases: [number, number, number][] = [];
    for (const p of [0.8, 0.9, 0.95, 0.98, 0.99])
      for (const conf of [0.9, 0.95, 0.99]) for (const c of [0, 1, 3]) cases.push([p, conf, c]);
    for (const [p, conf, c] of cases) {
      const expected = oracle(p, conf, c); // jstat 1.9.6 binomial cdf as independent oracle
      expect(checkpointsForShare({ requiredShare: p, confidence: conf }, c), `${p} ${conf} ${c}`).toBe(expected);
    }
  });

  it("checkpointsForShare -- 90 %/90 % with no failure allowed: 22", () => {
    // Collins, ARL-TR-5214: ⌈ln 0.1 / ln 0.9⌉ = 22
    expect(checkpointsForShare({ requiredShare: 0.9, confidence: 0.9 }, 0)).toBe(22);
  });

  it("checkpointsForShare -- refuses a negative or fractional allowance", () => {
    expect(() => checkpointsForShare({ requiredShare: 0.95, confidence: 0.95 }, -1)).toThrow(/whole number from 0/);
    expect(() => checkpointsForShare({ requiredShare: 0.95, confidence: 0.95 }, 1.5)).toThrow(/whole number from 0/);
  });

  it("checkpointsForShare -- a required share of 1 can never be shown", () => {
    expect(checkpointsForShare({ requiredShare: 1, confidence: 0.95 }, 0)).toBeNull();
  });
});

describe("planSampleSize", () => {
  it("planSampleSize -- the standards' minimums", () => {
    expect(STANDARD_MINIMUMS.nssda).toBe(20); // FGDC-STD-007.3-1998 §3.2.2
    expect(STANDARD_MINIMUMS.asprs2023).toBe(30); // ASPRS Positional Accuracy Standards Ed. 2 (2023)
  });

  it("planSampleSize -- a loose profile is raised to the ASPRS minimum of 30", () => {
    // 80 %/80 %: ⌈ln 0.2 / ln 0.8⌉ = 8 (Collins, ARL-TR-5214); ASPRS Ed. 2 (2023) minimum 30
    const s = planSampleSize({
      requiredShare: 0.8,
      confidence: 0.8,
      allowedFailures: 0,
      profileMinimum: 10,
      standards: ["nssda", "asprs2023"],
    });
    expect(s.byShare).toBe(8);
    expect(s.standardMinimum).toEqual({ standard: "asprs2023", count: 30 });
    expect(s.required).toBe(30);
    expect(s.decidedBy).toBe("standard");
  });

  it("planSampleSize -- NSSDA alone gives 20 when the share needs fewer", () => {
    // FGDC-STD-007.3-1998 §3.2.2: a minimum of 20
    const s = planSampleSize({
      requiredShare: 0.8,
      confidence: 0.8,
      allowedFailures: 0,
      profileMinimum: 0,
      standards: ["nssda"],
    });
    expect(s.required).toBe(20);
  });

  it("planSampleSize -- the share decides for a strict profile; the profile minimum when it is larger", () => {
    const strict = planSampleSize({
      requiredShare: 0.95,
      confidence: 0.95,
      allowedFailures: 1,
      profileMinimum: 40,
      standards: ["asprs2023"],
    });
    expect(strict.required).toBe(93); // Wilks (1941) 95/95 second order (from memory), jstat-checked above
    expect(strict.decidedBy).toBe("share");
    const byProfile = planSampleSize({
      requiredShare: 0.95,
      confidence: 0.95,
      allowedFailures: 0,
      profileMinimum: 72,
      standards: [],
    });
    expect(byProfile.required).toBe(72);
    expect(byProfile.decidedBy).toBe("profile");
  });

  it("planSampleSize -- a required share of 1 gets a clear message", () => {
    expect(() =>
      planSampleSize({ requiredShare: 1, confidence: 0.95, allowedFailures: 0, profileMinimum: 0, standards: [] }),
    ).toThrow(/required share of 1 can never be shown/);
  });
});
