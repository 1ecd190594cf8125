import { describe, expect, it } from "vitest";
import { clopperPearson } from "@/lib/audit/intervals";
import {
  bedGuidance,
  bedStats,
  checkpointsNeeded,
  listWords,
  overallGuidance,
  RECORD_ACCURACY_REMINDER,
} from "./guidance";
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
    const none = s[2];
    expect(none).toMatchObject({ bed: "", n: 1, known: 0, share: null, lower: null });
    expect(s[1].p95Cross).toBeNull();
  });
});

describe("checkpointsNeeded", () => {
  it("checkpointsNeeded -- closed form (α/2)^(1/n) of the Clopper–Pearson bound for k = n", () => {
    // ln(0.025) / ln(0.95) = 71.92 → 72.
    expect(checkpointsNeeded(0.95, 0.95)).toBe(72);
    expect(clopperPearson(72, 72, 0.95)!.lower).toBeGreaterThanOrEqual(0.95);
    expect(clopperPearson(71, 71, 0.95)!.lower).toBeLessThan(0.95);
    // ln(0.025) / ln(0.9) = 35.01 → 36.
    expect(checkpointsNeeded(0.9, 0.95)).toBe(36);
    expect(() => checkpointsNeeded(1, 0.95)).toThrow(/checkpointsNeeded/);
  });
});

describe("bedGuidance", () => {
  it("bedGuidance -- relied on when the lower bound reaches the required share and every 95th percentile is within its limit", () => {
    const g = bedGuidance(stats("2", 80, 0), IN_ROW);
    expect(g.state).toBe("relied-on");
    expect(g.line).toBe(
      "Bed 2: the records can be relied on for in-row weeding around plants — 80 of 80 checkpoints within tolerance, at least 95.5 % with 95 % confidence.",
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
    const g = bedGuidance(stats("1", 63, 0), IN_ROW);
    expect(g.state).toBe("not-shown");
    expect(g.line).toBe(
      "Bed 1: all 63 checkpoints within tolerance, but too few to show 95 % with 95 % confidence — survey at least 72 here before relying on it for in-row weeding around plants.",
    );
    expect(bedGuidance(stats("5", 120, 3), IN_ROW).state).toBe("not-shown"); // 97.5 % observed, lower bound 0.929
  });

  it("bedGuidance -- beds without checkpoints and profiles without limits say so", () => {
    expect(
      bedGuidance({ ...stats("6", 1, 0), n: 0, known: 0, within: 0, share: null, lower: null, upper: null }, IN_ROW)
        .state,
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
      bedGuidance(stats("1", 63, 0), IN_ROW),
      bedGuidance(stats("2", 80, 0), IN_ROW),
      bedGuidance(stats("3", 60, 12, { p95Radial: 0.04 }), IN_ROW),
      bedGuidance(stats("4", 64, 0), IN_ROW),
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
