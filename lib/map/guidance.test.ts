import jStat from "jstat";
import { describe, expect, it } from "vitest";
import { clopperPearson } from "@/lib/audit/intervals";
import { oneSidedLowerBound } from "@/lib/audit/trust";
import { bedGuidance, bedStats, bedTrust, listWords, overallGuidance, RECORD_ACCURACY_REMINDER } from "./guidance";
import type { BedStats, MapProfile } from "./types";

const IN_ROW: MapProfile = {
  name: "In-row weeding around plants",
  operation: null,
  radialM: 0.01,
  crossM: 0.008,
  alongM: 0.01,
  requiredShare: 0.95,
  confidence: 0.95,
  minCheckpoints: 50,
};

function stats(bed: string, n: number, out: number, o: Partial<BedStats> = {}): BedStats {
  const ci = clopperPearson(n - out, n, 0.95)!;
  return {
    bed,
    n,
    known: n,
    within: n - out,
    out,
    share: (n - out) / n,
    lower: ci.lower,
    upper: ci.upper,
    lowerOneSided: oneSidedLowerBound(n - out, n, 0.95),
    p95Radial: 0.004,
    p95Cross: 0.003,
    p95Along: 0.003,
    meanRadial: 0.003,
    ...o,
  };
}

describe("bedStats", () => {
  it("bedStats -- counts, shares and type-7 95th percentiles per bed, beds in natural order", () => {
    const bed = ["10", "2", "2", "2", "2", ""];
    const radial = [0.001, 0.001, 0.002, 0.003, 0.004, 0.05];
    const s = bedStats({
      bed,
      radial,
      cross: [NaN, -0.004, 0.001, 0.002, 0.003, 0.01],
      along: radial,
      within: [1, 1, 1, 1, 0, -1],
      confidence: 0.95,
    });
    expect(s.map((b) => b.bed)).toEqual(["2", "10", ""]);
    const b2 = s[0];
    expect(b2).toMatchObject({ n: 4, known: 4, within: 3, out: 1, share: 0.75 });
    // Hyndman & Fan (1996) type 7 on 1, 2, 3, 4 mm: h = 3·0.95 = 2.85 → 3 + 0.85·1 = 3.85 mm.
    expect(b2.p95Radial).toBeCloseTo(0.00385, 12);
    expect(b2.p95Cross).toBeCloseTo(0.00385, 12); // |cross| = 4, 1, 2, 3 mm sorts to the same values
    expect(b2.meanRadial).toBeCloseTo(0.0025, 12);
    // Clopper & Pearson (1934) 3 of 4 at 95 %: lower 0.1941, upper 0.9937 (Newcombe 1998 Table I method 5 style).
    expect(b2.lower).toBeCloseTo(0.1941, 4);
    expect(b2.upper).toBeCloseTo(0.9937, 4);
    // one-sided decision bound Beta⁻¹(0.05; 3, 2) (jstat as independent oracle)
    expect(b2.lowerOneSided).toBeCloseTo(jStat.beta.inv(0.05, 3, 2), 8);
    const none = s[2];
    expect(none).toMatchObject({ bed: "", n: 1, known: 0, share: null, lower: null });
    expect(s[1].p95Cross).toBeNull();
  });
});

describe("bedTrust", () => {
  it("bedTrust -- zero failures: 59 checkpoints of a bed meet 95 %/95 %, 58 need one more", () => {
    // success-run: 0.95^59 ≤ 0.05 < 0.95^58 (Collins, ARL-TR-5214; Clopper & Pearson 1934, one-sided bound α^(1/n))
    expect(bedTrust(stats("1", 59, 0), IN_ROW)).toMatchObject({ word: "meets" });
    expect(bedTrust(stats("1", 58, 0), IN_ROW)).toMatchObject({ word: "not enough evidence yet", moreNeeded: 1 });
    // the per-bed test no longer asks for the two-sided 72 (0.025^(1/72) ≥ 0.95)
    expect(bedGuidance(stats("1", 63, 0), IN_ROW).state).toBe("relied-on");
  });
});

describe("bedGuidance", () => {
  it("bedGuidance -- relied on when the lower bound reaches the required share and every 95th percentile is within its limit", () => {
    const g = bedGuidance(stats("2", 80, 0), IN_ROW);
    expect(g.state).toBe("relied-on");
    expect(g.line).toBe(
      "Bed 2: the records can be relied on for in-row weeding around plants — 80 of 80 checkpoints within tolerance, at least 96.3 % with 95 % confidence.",
    );
  });

  it("bedGuidance -- not relied on when too many plants are out, naming the limit that fails worst", () => {
    const g = bedGuidance(stats("3", 60, 12, { p95Radial: 0.0406, p95Along: 0.0381, p95Cross: 0.012 }), IN_ROW);
    expect(g.state).toBe("not-relied-on");
    expect(g.line).toBe(
      "Bed 3: do not rely on the records for in-row weeding around plants — 12 of 60 checkpoints out of tolerance; 95 % of radial errors within 40.6 mm, limit 10.0 mm.",
    );
  });

  it("bedGuidance -- not relied on when a 95th percentile exceeds its limit although the share looks fine", () => {
    const g = bedGuidance(stats("4", 100, 2, { p95Cross: 0.0085 }), IN_ROW);
    expect(g.state).toBe("not-relied-on");
    expect(g.line).toContain("95 % of cross-row errors within 8.5 mm, limit 8.0 mm");
  });

  it("bedGuidance -- not yet shown when every checkpoint is within but there are too few", () => {
    const g = bedGuidance(stats("1", 40, 0), IN_ROW);
    expect(g.state).toBe("not-shown");
    expect(g.word).toBe("not enough evidence yet");
    // success-run n = 59 for 95 %/95 % (Collins, ARL-TR-5214), so 19 more
    expect(g.line).toBe(
      "Bed 1: all 40 checkpoints within tolerance, but too few to show 95 % with 95 % confidence — survey 19 more here, all within tolerance, before relying on it for in-row weeding around plants.",
    );
    // 97.5 % observed, one-sided lower bound Beta⁻¹(0.05; 117, 4) = 0.9367 (jstat as independent oracle)
    expect(bedGuidance(stats("5", 120, 3), IN_ROW).state).toBe("not-shown");
  });

  it("bedGuidance -- beds without checkpoints and profiles without limits say so", () => {
    expect(
      bedGuidance(
        { ...stats("6", 1, 0), n: 0, known: 0, within: 0, share: null, lower: null, upper: null, lowerOneSided: null },
        IN_ROW,
      ).state,
    ).toBe("no-checkpoints");
    expect(bedGuidance(stats("6", 10, 0), { ...IN_ROW, radialM: null, crossM: null, alongM: null }).state).toBe(
      "no-limits",
    );
    expect(bedGuidance(stats("6", 10, 0), null).state).toBe("no-limits");
  });
});

describe("overallGuidance", () => {
  it("overallGuidance -- one line over all beds that ends with the record-accuracy reminder", () => {
    const g = [
      bedGuidance(stats("1", 40, 0), IN_ROW),
      bedGuidance(stats("2", 80, 0), IN_ROW),
      bedGuidance(stats("3", 60, 12, { p95Radial: 0.04 }), IN_ROW),
      bedGuidance(stats("4", 50, 0), IN_ROW),
    ];
    const line = overallGuidance(g, IN_ROW);
    expect(line).toBe(
      `At the tolerance “In-row weeding around plants”, the records can be relied on in bed 2; not in bed 3; not yet shown in beds 1 and 4. ${RECORD_ACCURACY_REMINDER}`,
    );
    expect(line.endsWith("not whether a machine is safe to run.")).toBe(true);
  });

  it("overallGuidance -- without bed labels or limits there is no per-bed guidance, but the reminder stays", () => {
    expect(overallGuidance([bedGuidance(stats("", 20, 0), IN_ROW)], IN_ROW)).toBe(
      `The records carry no bed labels, so there is no guidance per bed. ${RECORD_ACCURACY_REMINDER}`,
    );
    expect(overallGuidance([], null)).toMatch(/sets no tolerance limits.*safe to run\.$/);
  });

  it("listWords -- English list", () => {
    expect(listWords(["1"])).toBe("1");
    expect(listWords(["1", "2"])).toBe("1 and 2");
    expect(listWords(["1", "2", "5"])).toBe("1, 2 and 5");
  });
});
