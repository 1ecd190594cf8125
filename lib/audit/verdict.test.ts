import { describe, expect, it } from "vitest";
import type { ToleranceProfile } from "./profile";
import { evaluateVerdict } from "./verdict";
import { clopperPearson } from "./intervals";

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
  it("verdict -- 20 of 20 within passes only if the lower bound reaches the required share", () => {
    const radial = new Float64Array(20).fill(0.004);
    const cross = new Float64Array(20).fill(0.003);
    // Newcombe 1998 / closed form: 20/20 gives a Clopper–Pearson lower bound of 0.025^(1/20) = 0.8316.
    const cp = clopperPearson(20, 20, 0.95)!;
    expect(cp.lower).toBeCloseTo(0.8316, 4);
    const v = evaluateVerdict(profile, {
      pairs: 20,
      radial,
      cross,
      along: null,
      within: { share: 1, lower95: cp.lower },
    });
    expect(v.criteria.map((c) => [c.id, c.passed])).toEqual([
      ["checkpoints", true],
      ["radial", true],
      ["cross", true],
      ["share", false],
    ]);
    expect(v.passed).toBe(false);
    expect(v.criteria.find((c) => c.id === "share")!.text).toContain("at least 83.2 %");
  });

  it("verdict -- too few checkpoints fails with the counts in words", () => {
    const v = evaluateVerdict(
      { ...profile, minCheckpoints: 300 },
      {
        pairs: 212,
        radial: new Float64Array(212).fill(0.001),
        cross: new Float64Array(212),
        along: null,
        within: { share: 1, lower95: 0.9828 },
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
        within: { share: 0.96, lower95: 0.9 },
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

  it("verdict -- inputs are not changed", () => {
    const radial = Float64Array.of(0.003, 0.001, 0.002);
    const copy = Float64Array.from(radial);
    evaluateVerdict(profile, { pairs: 3, radial, cross: null, along: null, within: null });
    expect(radial).toEqual(copy);
  });
});
