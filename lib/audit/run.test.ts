/**
 * Sources: Clopper & Pearson 1934 (closed form of the lower bound when every trial succeeds:
 * (α/2)^(1/n)); Hyndman & Fan 1996 (type 7 percentile); the stage order and the wiring of settings and profile are our own contract
 * (common practice, no source).
 */
import { describe, expect, it } from "vitest";
import type { ToleranceProfile } from "./profile";
import { availableGroups, auditReports, runAudit, type AuditStage } from "./run";
import type { AuditSettings } from "./settings";
import { makeTable } from "./test-helpers";

// Invented positions (demo only): four plants 0.3 m apart along a row running east, surveyed a few millimetres off.
const plantedXY = { x: [500000, 500000.3, 500000.6, 500000.9], y: [5800000, 5800000, 5800000, 5800000] };
const survey = makeTable({
  role: "survey",
  x: [500000.002, 500000.301, 500000.598, 500000.903],
  y: [5800000.001, 5799999.998, 5800000.002, 5800000],
});
const settings: AuditSettings = {
  match: "nearest",
  maxDistanceM: 0.1,
  rowBearingDeg: 90,
  timeZone: "Europe/Amsterdam",
  workCrs: "EPSG:32631",
};
const profile: ToleranceProfile = {
  name: "test",
  radialM: 0.01,
  crossM: null,
  alongM: null,
  requiredShare: 0.5,
  confidence: 0.95,
  minCheckpoints: 1,
};
const planted = makeTable({ role: "planted", ...plantedXY, attrs: { bed: ["1", "1", "1", "1"] } });
const input = (over: Partial<Parameters<typeof runAudit>[0]> = {}) => ({
  planted: { table: planted, crs: "EPSG:32631" },
  survey: { table: survey, crs: "EPSG:32631" },
  settings,
  profile,
  ...over,
});

describe("audit run", () => {
  it("availableGroups -- only breakdowns the files can give", () => {
    const bare = makeTable({ role: "planted", ...plantedXY });
    expect(availableGroups(bare, survey)).toEqual([]);
    const rich = makeTable({
      role: "planted",
      ...plantedXY,
      attrs: { arm: ["L", "L", "R", "R"], fix: ["rtk-fixed", "rtk-fixed", "rtk-fixed", "rtk-float"] },
      time: [0, 1, 2, 3],
    });
    expect(
      availableGroups(rich, makeTable({ role: "survey", ...plantedXY, attrs: { crop: ["a", "a", "a", "a"] } })),
    ).toEqual(["arm", "crop", "fix", "day"]);
  });

  it("runAudit -- files without times, arms or crops still give a result, without those breakdowns", () => {
    const out = runAudit(input());
    expect(out.ok).toBe(true);
    if (!out.ok) return;
    expect(out.result.summary.pairs).toBe(4);
    expect(Object.keys(out.result.summary.groups ?? {})).toEqual(["bed"]);
    // The settings as used: the given bearing (normalised to [0, 180)) and the work CRS's code.
    expect(out.settings).toEqual({ ...settings, rowBearingDeg: 90 });
    expect(out.rowBearing).toMatchObject({ deg: 90, source: "given", method: "given" });
  });

  it("runAudit -- the profile's limit feeds the share within tolerance, and the verdict judges its lower bound", () => {
    const out = runAudit(input());
    if (!out.ok) throw new Error("expected a computed audit");
    const wt = out.result.summary.withinTolerance!;
    expect(wt.share).toBe(1); // every error is a few millimetres, the limit 10 mm
    // Clopper & Pearson 1934: 4 of 4 within gives a lower bound of 0.025^(1/4) = 0.3976 at 95 %.
    expect(wt.lower95).toBeCloseTo(0.025 ** (1 / 4), 4);
    // The decision bound is one-sided: α^(1/n) = 0.05^(1/4) = 0.4729 (Turpin et al., one-sided rule of three).
    expect(wt.lowerOneSided).toBeCloseTo(0.05 ** (1 / 4), 12);
    const share = out.verdict!.criteria.find((c) => c.id === "share")!;
    expect(share.passed).toBe(false); // 0.4729 < the required 0.5
    expect(share.trust).toMatchObject({ word: "not enough evidence yet", moreNeeded: 1 }); // 0.05^(1/5) = 0.549
    expect(out.verdict!.passed).toBe(false);
    const looser = runAudit(input({ profile: { ...profile, requiredShare: 0.3 } }));
    if (!looser.ok) throw new Error("expected a computed audit");
    expect(looser.verdict!.passed).toBe(true);
  });

  it("runAudit -- without a profile: no limits, no verdict", () => {
    const out = runAudit(input({ profile: null }));
    if (!out.ok) throw new Error("expected a computed audit");
    expect(out.verdict).toBeNull();
    expect(out.result.summary.withinTolerance).toBeNull();
  });

  it("runAudit -- with a row bearing, a cross-row limit is judged on the 95th percentile of |cross-row error|", () => {
    // Row runs east (90°), so |cross| = |dN| = 1, 2, 2, 0 mm; Hyndman & Fan 1996 type 7 p95 of [0, 1, 2, 2] mm = 2 mm.
    const tight = runAudit(input({ profile: { ...profile, crossM: 0.0015 } }));
    const loose = runAudit(input({ profile: { ...profile, crossM: 0.0025 } }));
    if (!tight.ok || !loose.ok) throw new Error("expected computed audits");
    const cross = (v: typeof tight.verdict) => v!.criteria.find((c) => c.id === "cross")!;
    expect(cross(tight.verdict).observed).toBeCloseTo(0.002, 9);
    expect(cross(tight.verdict).passed).toBe(false);
    expect(cross(loose.verdict).passed).toBe(true);
  });

  it("runAudit -- pairing nothing stops at the pairing stage with the issue", () => {
    const stages: AuditStage[] = [];
    const out = runAudit(input({ settings: { ...settings, maxDistanceM: 0.0001 }, onStage: (s) => stages.push(s) }));
    expect(out.ok).toBe(false);
    expect(out.issues.map((i) => i.code)).toContain("no-pairs");
    expect(stages).toEqual(["validate", "project", "check-files", "pair"]);
  });

  it("runAudit -- reports every stage in order and leaves its inputs unchanged", () => {
    const stages: AuditStage[] = [];
    const before = [Float64Array.from(planted.x), Float64Array.from(survey.y)];
    runAudit(input({ onStage: (s) => stages.push(s) }));
    expect(stages).toEqual(["validate", "project", "check-files", "pair", "row-bearing", "statistics"]);
    expect(planted.x).toEqual(before[0]);
    expect(survey.y).toEqual(before[1]);
  });

  it("auditReports -- residuals, unpaired and summary CSVs, one residual row per pair", () => {
    const out = runAudit(input());
    if (!out.ok) throw new Error("expected a computed audit");
    const reports = auditReports(out);
    expect(reports.map((r) => r.kind)).toEqual(["residuals", "unpaired", "summary"]);
    const residuals = new TextDecoder().decode(reports[0].bytes).trim().split("\n");
    expect(residuals[0]).toMatch(/^plant_id,/);
    expect(residuals).toHaveLength(1 + 4);
  });
});
