/**
 * One group gets the same word everywhere: the verdict's share criterion, the breakdown row, the map guidance of a
 * bed and the report data all call the one trust rule (lib/audit/trust.ts). Sources of the thresholds: the one-sided
 * exact bound of Clopper & Pearson (1934), success-run n = 59 for 95 %/95 % (Collins, ARL-TR-5214 (2010)).
 * Example data is a fictional field ("Long Acre"): one crop in one bed, so every view judges the same plants.
 */
import { describe, expect, it } from "vitest";
import { auditTrust } from "@/lib/audit/audit-trust";
import { groupRowTrust } from "@/lib/audit/groups";
import { computeAudit } from "@/lib/audit/index";
import type { ToleranceProfile } from "@/lib/audit/profile";
import { identityPairing, makeTable } from "@/lib/audit/test-helpers";
import { evaluateVerdict } from "@/lib/audit/verdict";
import { bedGuidance, bedStats } from "./guidance";

const PROFILE: ToleranceProfile & { operation: string | null } = {
  name: "Inter-row hoeing",
  operation: null,
  radialM: 0.03,
  crossM: null,
  alongM: null,
  requiredShare: 0.95,
  confidence: 0.95,
  minCheckpoints: 20,
};

/** n plants in bed 1, all lettuce; the first `outside` are 50 mm off, the rest 2–5 mm. */
function field(n: number, outside: number) {
  const x = Array.from({ length: n }, (_, i) => 600_000 + (i % 50) * 0.3);
  const y = Array.from({ length: n }, (_, i) => 5_800_000 + Math.floor(i / 50) * 0.75);
  const err = Array.from({ length: n }, (_, i) => (i < outside ? 0.05 : 0.002 + (i % 4) * 0.001));
  const attrs = { crop: Array(n).fill("lettuce"), bed: Array(n).fill("1") };
  const planted = makeTable({ role: "planted", x, y, attrs });
  const survey = makeTable({ role: "survey", x: x.map((v, i) => v + err[i]), y });
  return { planted, survey, pairing: identityPairing(n) };
}

function wordsFor(n: number, outside: number) {
  const { planted, survey, pairing } = field(n, outside);
  const { summary, residuals } = computeAudit({
    planted,
    survey,
    pairing,
    options: { toleranceRadial: PROFILE.radialM!, confidence: PROFILE.confidence, groupBy: ["crop"] },
  });
  const wt = summary.withinTolerance!;
  const verdict = evaluateVerdict(PROFILE, {
    pairs: summary.pairs,
    radial: residuals.radial,
    cross: residuals.cross,
    along: residuals.along,
    within: { n: wt.n, within: wt.within },
  });
  const row = summary.groups.crop![0];
  const m = residuals.radial.length;
  const beds = bedStats({
    bed: Array(m).fill("1"),
    radial: residuals.radial,
    cross: new Float64Array(m).fill(Number.NaN),
    along: new Float64Array(m).fill(Number.NaN),
    within: residuals.withinTolerance!,
    confidence: PROFILE.confidence,
  });
  const report = auditTrust(summary, verdict, PROFILE);
  return {
    verdict: verdict.criteria.find((c) => c.id === "share")!.trust!.word,
    breakdown: groupRowTrust(row, PROFILE)!.word,
    map: bedGuidance(beds[0], PROFILE).word,
    reportAll: report.all!.word,
    reportRow: report.groups.crop![0].trust!.word,
  };
}

describe("trust rule everywhere", () => {
  it("trust rule everywhere -- 40 of 40 within: not enough evidence yet in verdict, breakdown, map and report", () => {
    // 0.05^(1/40) = 0.928 < 0.95 (one-sided exact bound, Clopper & Pearson 1934)
    const w = wordsFor(40, 0);
    expect(new Set(Object.values(w))).toEqual(new Set(["not enough evidence yet"]));
  });

  it("trust rule everywhere -- 374 of 375 within: meets everywhere", () => {
    // Beta⁻¹(0.05; 374, 2) = 0.9874 ≥ 0.95 (one-sided exact bound; jstat gives the same, see trust.test.ts)
    const w = wordsFor(375, 1);
    expect(new Set(Object.values(w))).toEqual(new Set(["meets"]));
  });

  it("trust rule everywhere -- 345 of 375 within (92 %): does not meet everywhere", () => {
    // observed 92 % < required 95 % (common practice, no source)
    const w = wordsFor(375, 30);
    expect(new Set(Object.values(w))).toEqual(new Set(["does not meet"]));
  });

  it("trust rule everywhere -- a row stored before the rule (no within count) gets the same word", () => {
    const { planted, survey, pairing } = field(60, 0);
    const { summary } = computeAudit({
      planted,
      survey,
      pairing,
      options: { toleranceRadial: 0.03, confidence: 0.95, groupBy: ["crop"] },
    });
    const row = summary.groups.crop![0];
    expect(row.within).toBe(60);
    const old = { ...row, within: undefined, lowerOneSided: undefined, p95Cross: undefined, p95Along: undefined };
    expect(groupRowTrust(old, PROFILE)!.word).toBe(groupRowTrust(summary.groups.crop![0], PROFILE)!.word);
    expect(groupRowTrust(old, PROFILE)!.word).toBe("meets"); // 0.05^(1/60) = 0.9513 ≥ 0.95
  });
});
