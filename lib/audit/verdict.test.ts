import { describe, expect, it } from "vitest";
import type { ToleranceProfile } from "./profile";
import { evaluateVerdict } from "./verdict";
import { clopperPearson } from "./intervals";
import { oneSidedLowerBound } from "./trust";

// Thresholds are the user's: NSSDA sets none (FGDC-STD-007.3-1998 §3.1). The criteria themselves
// (minimum checkpoints, share within limits tested on the lower bound, 95th percentile ≤ limit) are
// common practice, no source.
const profile: ToleranceProfile = {
  name: "In-row weeding",
  radialM: 0.01,
  crossM: 0.008,
  alongM: null,
  requiredShare: 0.95,
  confidence: 0.95,
  minCheckpoints: 20,
};

describe("verdict", () => {
  it("verdict -- 20 of 20 within passes only if the one-sided lower bound reaches the required share", () => {
    const radial = new Float64Array(20).fill(0.004);
    const cross = new Float64Array(20).fill(0.003);
    // Was pinned to the two-sided lower end 0.025^(1/20) = 0.8316 (Newcombe 1998); the claim is one-sided, so the
    // decision bound is 0.05^(1/20) = 0.8609 (Turpin et al., one-sided exact bound α^(1/n); Clopper & Pearson 1934).
    expect(clopperPearson(20, 20, 0.95)!.lower).toBeCloseTo(0.8316, 4);
    expect(oneSidedLowerBound(20, 20, 0.95)).toBeCloseTo(0.8609, 4);
    const v = evaluateVerdict(profile, {
      pairs: 20,
      radial,
      cross,
      along: null,
      within: { n: 20, within: 20 },
    });
    expect(v.criteria.map((c) => [c.id, c.passed])).toEqual([
      ["checkpoints", true],
      ["radial", true],
      ["cross", true],
      ["share", false],
    ]);
    expect(v.passed).toBe(false);
    const share = v.criteria.find((c) => c.id === "share")!;
    expect(share.text).toContain("at least 86.1 % (one-sided bound)");
    // success-run n = ⌈ln 0.05 / ln 0.95⌉ = 59 checkpoints (Collins, ARL-TR-5214), so 39 more settle it
    expect(share.text).toContain("not enough evidence yet: 39 more checkpoints, all within tolerance, would settle it");
    expect(share.trust).toMatchObject({ word: "not enough evidence yet", moreNeeded: 39 });
    expect(share.observed).toBeCloseTo(0.05 ** (1 / 20), 12);
  });

  it("verdict -- too few checkpoints fails with the counts in words", () => {
    const v = evaluateVerdict(
      { ...profile, minCheckpoints: 300 },
      {
        pairs: 212,
        radial: new Float64Array(212).fill(0.001),
        cross: new Float64Array(212),
        along: null,
        within: { n: 212, within: 212 },
      },
    );
    const c = v.criteria.find((x) => x.id === "checkpoints")!;
    expect(c.passed).toBe(false);
    expect(c.text).toBe("only 212 checkpoints paired; the profile asks for 300");
  });

  it("verdict -- the 95th percentile of |cross-row error| is compared with the limit (type 7 quantile)", () => {
    // |cross| = 1..100 mm → type-7 95th percentile = 1 + 0.95·99 = 95.05 mm (Hyndman & Fan 1996, definition 7).
    const cross = Float64Array.from({ length: 100 }, (_, i) => ((i % 2 ? -1 : 1) * (i + 1)) / 1000);
    const v = evaluateVerdict(
      { ...profile, radialM: null, crossM: 0.096 },
      {
        pairs: 100,
        radial: Float64Array.from(cross, Math.abs),
        cross,
        along: null,
        within: { n: 100, within: 96 },
      },
    );
    const c = v.criteria.find((x) => x.id === "cross")!;
    expect(c.observed).toBeCloseTo(0.09505, 10);
    expect(c.passed).toBe(true);
    expect(c.text).toMatch(/^95 % of cross-row errors within 95\.[01] mm; limit 96\.0 mm$/);
  });

  it("verdict -- a cross-row limit without a row bearing cannot pass", () => {
    const v = evaluateVerdict(profile, {
      pairs: 30,
      radial: new Float64Array(30),
      cross: null,
      along: null,
      within: null,
    });
    expect(v.criteria.find((x) => x.id === "cross")!.passed).toBe(false);
    expect(v.passed).toBe(false);
  });

  it("verdict -- an observed share below the required share does not meet", () => {
    // 360 of 375 = 96 % observed against a required 97 % (common practice, no source)
    const v = evaluateVerdict(
      { ...profile, requiredShare: 0.97 },
      {
        pairs: 375,
        radial: new Float64Array(375),
        cross: new Float64Array(375),
        along: null,
        within: { n: 375, within: 360 },
      },
    );
    const share = v.criteria.find((c) => c.id === "share")!;
    expect(share.passed).toBe(false);
    expect(share.trust!.word).toBe("does not meet");
    expect(share.text).toMatch(/— does not meet$/);
  });

  it("verdict -- inputs are not changed", () => {
    const radial = Float64Array.of(0.003, 0.001, 0.002);
    const copy = Float64Array.from(radial);
    evaluateVerdict(profile, { pairs: 3, radial, cross: null, along: null, within: null });
    expect(radial).toEqual(copy);
  });
});
