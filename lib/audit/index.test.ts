/**
 * Sources: FGDC-STD-007.3-1998 Appendix 3-A (RMSE, RMSE_r, NSSDA cases, ≥ 20 checkpoints);
 * simple-statistics 7.12.1 (mean, sampleStandardDeviation, rootMeanSquare, quantile type 7) and
 * jstat 1.9.6 (jStat.studentt.inv) as independent oracles; Rayleigh CDF 1 − exp(−k²/2) (scipy.stats.rayleigh.ppf) k = 1.177410 / 2.447747
 * (computed); Clopper & Pearson 1934. Simulated fields use our own seeded PRNG (mulberry32 + Box–Muller).
 * Example data is a fictional farm ("Hollow Brook").
 */
import fc from "fast-check";
import jStat from "jstat";
import { readFileSync } from "node:fs";
import path from "node:path";
import * as ss from "simple-statistics";
import { describe, expect, it } from "vitest";
import { PAIRED_BY_POSITION, type Pairing, type ProjectedTable } from "@/geo/types";
import { applySimilarity, computeAudit, type AuditSummary } from "./index";
import { identityPairing, makePairing, makeTable, simulateField, snapshot } from "./test-helpers";

const E0 = 612_000;
const N0 = 5_812_000;

/** Four plants of the fictional Hollow Brook farm, bed 1, and their survey points. */
function handField() {
  const dE = [0.01, -0.02, 0.03, 0.0];
  const dN = [0.02, 0.01, -0.01, 0.0];
  const px = [E0, E0 + 0.5, E0 + 1.0, E0 + 1.5];
  const py = [N0, N0 + 0.3, N0 + 0.6, N0 + 0.9];
  const planted = makeTable({
    role: "planted",
    x: px,
    y: py,
    id: ["HB-001", "HB-002", "HB-003", "HB-004"],
    attrs: { arm: ["L", "R", "L", "R"], crop: ["leek", "leek", "leek", "leek"], bed: ["1", "1", "1", "1"] },
  });
  const survey = makeTable({
    role: "survey",
    x: px.map((v, i) => v + dE[i]),
    y: py.map((v, i) => v + dN[i]),
    id: ["HB-001", "HB-002", "HB-003", "HB-004"],
  });
  return { planted, survey, dE, dN };
}

/** Every number in a value is finite (no NaN, no Infinity). */
function allFinite(value: unknown): boolean {
  if (typeof value === "number") return Number.isFinite(value);
  if (value === null || typeof value !== "object") return true;
  return Object.values(value as Record<string, unknown>).every(allFinite);
}

/** Compares two summaries number by number within `tol`, skipping paths for which `skip` is true. */
function expectSummariesClose(a: unknown, b: unknown, tol: number, skip: (p: string) => boolean, at = ""): void {
  if (skip(at)) return;
  if (typeof a === "number" && typeof b === "number") {
    expect(Math.abs(a - b), at).toBeLessThanOrEqual(tol * Math.max(1, Math.abs(a)));
    return;
  }
  if (a === null || typeof a !== "object") {
    if (typeof a === "string" && at.endsWith("nssdaNote")) return; // wording may carry a rounded ratio
    expect(b, at).toEqual(a);
    return;
  }
  expect(Object.keys(b as object).sort(), at).toEqual(Object.keys(a as object).sort());
  for (const k of Object.keys(a as object)) {
    expectSummariesClose((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k], tol, skip, `${at}.${k}`);
  }
}

describe("computeAudit", () => {
  it("computeAudit -- hand-made field against simple-statistics", () => {
    const { planted, survey, dE, dN } = handField();
    const pairing = makePairing(
      [
        [0, 0],
        [1, 1],
        [2, 2],
        [3, 3],
      ],
      { unmatchedPlanted: [], unmatchedSurvey: [], ambiguousSurvey: [] },
    );
    const { summary, residuals } = computeAudit({ planted, survey, pairing, options: { toleranceRadial: 0.025 } });
    const radial = dE.map((v, i) => Math.hypot(v, dN[i]));
    expect(summary.status).toBe("ok");
    expect(summary.pairs).toBe(4);
    // simple-statistics as independent oracle; tolerance 1e-9 m because coordinates near 6e6 m round at ~1e-9
    expect(summary.meanDE).toBeCloseTo(ss.mean(dE), 9);
    expect(summary.meanDN).toBeCloseTo(ss.mean(dN), 9);
    expect(summary.sdDE).toBeCloseTo(ss.sampleStandardDeviation(dE), 9);
    expect(summary.sdDN).toBeCloseTo(ss.sampleStandardDeviation(dN), 9);
    // FGDC-STD-007.3-1998 Appendix 3-A: RMSE_r = sqrt(RMSE_x² + RMSE_y²)
    expect(summary.rmseE).toBeCloseTo(ss.rootMeanSquare(dE), 9);
    expect(summary.rmseN).toBeCloseTo(ss.rootMeanSquare(dN), 9);
    expect(summary.rmseR).toBeCloseTo(Math.hypot(ss.rootMeanSquare(dE), ss.rootMeanSquare(dN)), 9);
    expect(summary.cep50).toBeCloseTo(ss.quantile(radial, 0.5), 9);
    expect(summary.r95).toBeCloseTo(ss.quantile(radial, 0.95), 9);
    // scipy.stats.rayleigh.ppf(0.5 / 0.95): k = 1.177410 (CEP) and 2.447747 (R95) times σ_c = RMSE_r/√2
    expect(summary.cep50Model).toBeCloseTo((1.17741 * summary.rmseR!) / Math.SQRT2, 6);
    expect(summary.r95Model).toBeCloseTo((2.447747 * summary.rmseR!) / Math.SQRT2, 6);
    // jstat.studentt.inv as oracle for the bias interval
    const half = (jStat.studentt.inv(0.975, 3) * ss.sampleStandardDeviation(dE)) / 2;
    expect(summary.meanDECi!.lower).toBeCloseTo(ss.mean(dE) - half, 9);
    expect(summary.meanDECi!.upper).toBeCloseTo(ss.mean(dE) + half, 9);
    // RMSE_N/RMSE_E = 0.0122/0.0187 = 0.65 → FGDC Case 2
    expect(summary.nssdaCase).toBe("case2");
    expect(summary.nssda95).toBeCloseTo(2.4477 * 0.5 * (summary.rmseE! + summary.rmseN!), 12);
    // within 2.5 cm radially: 0.0224 yes, 0.0224 yes, 0.0316 no, 0 yes
    expect(summary.withinTolerance).toMatchObject({ within: 3, n: 4, share: 0.75, confidence: 0.95 });
    expect(summary.meanAlong).toBeNull();
    expect(summary.rowBearingSource).toBe("none");
    expect(summary.notes.map((n) => n.code)).toContain("few-checkpoints");
    expect(Array.from(residuals.dE).map((v) => Math.round(v * 1e6) / 1e6)).toEqual(dE);
    expect(Array.from(residuals.withinTolerance!)).toEqual([1, 1, 0, 1]);
    expect(residuals.along).toBeNull();
    expect(summary.helmert!.pairs).toBe(4);
  });

  it("computeAudit -- no pairs gives nulls, never NaN, and a flag", () => {
    const { planted, survey } = handField();
    const pairing = makePairing([], { unmatchedPlanted: [0, 1, 2, 3], unmatchedSurvey: [0, 1, 2, 3] });
    const { summary, residuals } = computeAudit({
      planted,
      survey,
      pairing,
      options: { toleranceRadial: 0.03, rowBearingDeg: 0, groupBy: ["arm"] },
    });
    expect(summary.status).toBe("no-pairs");
    expect(summary.pairs).toBe(0);
    expect(summary.unmatchedPlanted).toBe(4);
    expect(summary.unmatchedSurvey).toBe(4);
    for (const key of [
      "meanDE",
      "sdDE",
      "rmseR",
      "cep50",
      "r95",
      "cep50Model",
      "nssda95",
      "nssdaCase",
      "meanCross",
      "rmseAlong",
    ] as const) {
      expect(summary[key], key).toBeNull();
    }
    expect(summary.withinTolerance).toMatchObject({ share: null, lower95: null, upper95: null, within: 0, n: 0 });
    expect(summary.helmert).toBeNull();
    expect(summary.withoutOutliers).toBeNull();
    expect(summary.outliers.threshold).toBeNull();
    expect(summary.groups.arm).toEqual([]);
    expect(summary.notes.map((n) => n.code)).toEqual(["no-pairs"]);
    expect(allFinite(summary)).toBe(true);
    expect(JSON.stringify(summary)).not.toContain("NaN");
    expect(residuals.dE.length).toBe(0);
  });

  it("computeAudit -- one pair: no SD, no interval, no fit", () => {
    const { planted, survey, dE, dN } = handField();
    const { summary } = computeAudit({
      planted,
      survey,
      pairing: makePairing([[2, 2]]),
      options: { rowBearingDeg: 0 },
    });
    const r = Math.hypot(dE[2], dN[2]);
    expect(summary.pairs).toBe(1);
    expect(summary.sdDE).toBeNull();
    expect(summary.sdCross).toBeNull();
    expect(summary.meanDECi).toBeNull();
    expect(summary.helmert).toBeNull();
    expect(summary.cep50).toBeCloseTo(r, 9);
    expect(summary.r95).toBeCloseTo(r, 9);
    expect(summary.rmseR).toBeCloseTo(r, 9);
    expect(summary.notes.map((n) => n.code)).toContain("single-pair");
    expect(allFinite(summary)).toBe(true);
  });

  it("computeAudit -- all errors identical", () => {
    const n = 30;
    const x = Array.from({ length: n }, (_, i) => i * 0.25);
    const planted = makeTable({ role: "planted", x, y: x.map(() => 0) });
    const survey = makeTable({ role: "survey", x: x.map((v) => v + 0.01), y: x.map(() => 0) });
    const { summary } = computeAudit({ planted, survey, pairing: identityPairing(n) });
    expect(summary.meanDE).toBeCloseTo(0.01, 12);
    expect(summary.sdDE).toBeCloseTo(0, 12);
    expect(summary.meanDECi!.upper - summary.meanDECi!.lower).toBeCloseTo(0, 12);
    expect(summary.outliers.count).toBe(0);
    // RMSE_N = 0: ratio 0 → the NSSDA formula does not apply; the empirical r95 is reported (FGDC Appendix 3-A)
    expect(summary.nssdaCase).toBe("not-applicable");
    expect(summary.nssda95).toBeCloseTo(0.01, 12);
    expect(summary.notes.map((x) => x.code)).toContain("nssda-not-applicable");
    expect(summary.helmert!.scale).toBeCloseTo(1, 12);
    expect(summary.helmert!.tE).toBeCloseTo(0.01, 9);
    expect(allFinite(summary)).toBe(true);
  });

  it("computeAudit -- simulated field recovers bias within its interval and sigma", () => {
    // rows run north, so along = dN and cross = dE
    const biasE = 0.012;
    const biasN = -0.008;
    const field = simulateField({ n: 5000, seed: 42, biasE, biasN, sigmaE: 0.01, sigmaN: 0.015 });
    const { summary } = computeAudit({ ...field, options: { rowBearingDeg: 0, toleranceCross: 0.03 } });
    expect(summary.meanDECi!.lower).toBeLessThanOrEqual(biasE);
    expect(summary.meanDECi!.upper).toBeGreaterThanOrEqual(biasE);
    expect(summary.meanDNCi!.lower).toBeLessThanOrEqual(biasN);
    expect(summary.meanDNCi!.upper).toBeGreaterThanOrEqual(biasN);
    // sample SD of n = 5000 normals has a relative standard error of 1/sqrt(2n) = 1 %; allow 4 %
    expect(summary.sdDE! / 0.01).toBeGreaterThan(0.96);
    expect(summary.sdDE! / 0.01).toBeLessThan(1.04);
    expect(summary.sdDN! / 0.015).toBeGreaterThan(0.96);
    expect(summary.sdDN! / 0.015).toBeLessThan(1.04);
    expect(summary.meanCross).toBeCloseTo(summary.meanDE!, 12);
    expect(summary.meanAlong).toBeCloseTo(summary.meanDN!, 12);
    // expected RMSE_E² = bias² + σ²
    expect(summary.rmseE! / Math.hypot(biasE, 0.01)).toBeCloseTo(1, 1);
    // |cross| ≤ 3 cm: P(|N(0.012, 0.01)| ≤ 0.03) ≈ 0.964
    expect(summary.withinTolerance!.lower95!).toBeLessThan(0.964);
    expect(summary.withinTolerance!.upper95!).toBeGreaterThan(0.964);
    // Helmert fit of a pure shift: scale ≈ 1, rotation ≈ 0 (noise 1 cm over a ~40 m field: a few arc-seconds),
    // and the fitted transformation moves the centroid of the planted points by the mean error
    const h = summary.helmert!;
    expect(Math.abs(h.scale - 1)).toBeLessThan(1e-4);
    expect(Math.abs(h.rotationArcsec)).toBeLessThan(20);
    const cx = ss.mean(Array.from(field.planted.x));
    const cy = ss.mean(Array.from(field.planted.y));
    const moved = applySimilarity(h, cx, cy);
    expect(moved.e - cx).toBeCloseTo(summary.meanDE!, 6);
    expect(moved.n - cy).toBeCloseTo(summary.meanDN!, 6);
  });

  it("computeAudit -- bias intervals cover the true bias about as often as the confidence says", () => {
    // 400 simulated fields of 25 checkpoints; coverage must be near 95 % (binomial sd 1.1 %: allow 91.5–98 %)
    let covered = 0;
    const fields = 400;
    for (let s = 0; s < fields; s++) {
      const field = simulateField({ n: 25, seed: 1000 + s, biasE: 0.01, biasN: 0, sigmaE: 0.02, sigmaN: 0.02 });
      const ci = computeAudit(field).summary.meanDECi!;
      if (ci.lower <= 0.01 && 0.01 <= ci.upper) covered++;
    }
    expect(covered / fields).toBeGreaterThan(0.915);
    expect(covered / fields).toBeLessThan(0.98);
  });

  it("computeAudit -- statistics invariant to translating both files", () => {
    const field = simulateField({ n: 300, seed: 7, biasE: 0.005, biasN: 0.01, sigmaE: 0.01, sigmaN: 0.012 });
    field.survey.x[10] += 0.4; // a gross error, so the outlier block is exercised
    const options = { rowBearingDeg: 33, toleranceRadial: 0.03, toleranceAlong: 0.05, groupBy: ["arm" as const] };
    const base = computeAudit({ ...field, options }).summary;
    fc.assert(
      fc.property(
        fc.double({ min: -2e5, max: 2e5, noNaN: true }),
        fc.double({ min: -2e5, max: 2e5, noNaN: true }),
        (dx, dy) => {
          const move = (t: ProjectedTable): ProjectedTable => ({
            ...t,
            x: t.x.map((v) => v + dx),
            y: t.y.map((v) => v + dy),
          });
          const moved = computeAudit({
            planted: move(field.planted),
            survey: move(field.survey),
            pairing: field.pairing,
            options,
          }).summary;
          // shifts of the un-centred Helmert formula depend on the origin by definition; all else must not
          expectSummariesClose(base, moved, 1e-7, (p) => p === ".helmert.tE" || p === ".helmert.tN");
        },
      ),
      { numRuns: 25 },
    );
  });

  it("computeAudit -- statistics do not depend on the order of the pairs", () => {
    const field = simulateField({ n: 200, seed: 9, biasE: 0.002, biasN: 0.004, sigmaE: 0.01, sigmaN: 0.01 });
    const options = { rowBearingDeg: 90, toleranceRadial: 0.02, groupBy: ["arm" as const] };
    const base = computeAudit({ ...field, options }).summary;
    const order = Array.from({ length: 200 }, (_, i) => (i * 37) % 200);
    const shuffled = makePairing(order.map((i) => [i, i] as [number, number]));
    const again = computeAudit({ ...field, pairing: shuffled, options }).summary;
    expectSummariesClose(base, again, 1e-9, () => false);
  });

  it("computeAudit -- raw GNSS positions show the gain of camera correction", () => {
    const field = simulateField({ n: 400, seed: 5, biasE: 0.001, biasN: 0.001, sigmaE: 0.004, sigmaN: 0.004 });
    // raw GNSS about 3 cm worse than the corrected position, one plant without a raw fix
    const rawX = field.planted.x.map((v, i) => v + 0.03 * Math.cos(i));
    const rawY = field.planted.y.map((v, i) => v + 0.03 * Math.sin(i * 1.7));
    rawX[17] = Number.NaN;
    const planted = { ...field.planted, rawX, rawY };
    const { summary, residuals } = computeAudit({
      planted,
      survey: field.survey,
      pairing: field.pairing,
      options: { toleranceRadial: 0.02 },
    });
    expect(summary.raw).not.toBeNull();
    expect(summary.raw!.pairs).toBe(399);
    expect(summary.raw!.missingRaw).toBe(1);
    expect(summary.raw!.rmseR!).toBeGreaterThan(summary.rmseR! * 3);
    expect(summary.notes.map((n) => n.code)).toContain("raw-partial");
    expect(residuals.rawDE![17]).toBeNaN();
    // the raw block equals an audit run on the raw positions themselves (minus the plant without raw position)
    const keep = Array.from({ length: 400 }, (_, i) => i).filter((i) => i !== 17);
    const asCorrected = {
      ...field.planted,
      x: rawX.map((v) => (Number.isNaN(v) ? 0 : v)),
      y: rawY,
      rawX: null,
      rawY: null,
    };
    const direct = computeAudit({
      planted: asCorrected,
      survey: field.survey,
      pairing: makePairing(keep.map((i) => [i, i] as [number, number])),
      options: { toleranceRadial: 0.02 },
    }).summary;
    for (const key of ["meanDE", "meanDN", "sdDE", "rmseE", "rmseN", "rmseR", "cep50", "r95", "nssda95"] as const) {
      expect(summary.raw![key], key).toBeCloseTo(direct[key] as number, 12);
    }
    expect(summary.raw!.withinTolerance).toEqual(direct.withinTolerance);
  });

  it("computeAudit -- no raw columns gives raw null", () => {
    const { planted, survey } = handField();
    const r = computeAudit({ planted, survey, pairing: identityPairing(4) });
    expect(r.summary.raw).toBeNull();
    expect(r.residuals.rawDE).toBeNull();
  });

  it("computeAudit -- groups by tool arm and by local planting day", () => {
    const { planted, survey } = handField();
    const time = Float64Array.of(
      Date.UTC(2025, 4, 12, 9, 0),
      Date.UTC(2025, 4, 12, 23, 30), // 01:30 on 13 May in Amsterdam (UTC+2)
      Date.UTC(2025, 4, 13, 8, 0),
      Number.NaN,
    );
    const { summary } = computeAudit({
      planted: { ...planted, time },
      survey,
      pairing: identityPairing(4),
      options: { groupBy: ["arm", "day"], timeZone: "Europe/Amsterdam", toleranceRadial: 0.025 },
    });
    expect(summary.groups.arm!.map((g) => [g.key, g.pairs])).toEqual([
      ["L", 2],
      ["R", 2],
    ]);
    expect(summary.groups.day!.map((g) => [g.key, g.pairs])).toEqual([
      ["2025-05-12", 1],
      ["2025-05-13", 2],
      [null, 1],
    ]);
    const armL = summary.groups.arm![0];
    expect(armL.meanDE).toBeCloseTo((0.01 + 0.03) / 2, 9);
    expect(armL.withinShare).toBe(0.5);
    // the same plants in UTC days would split 2 + 1
    const utc = computeAudit({
      planted: { ...planted, time },
      survey,
      pairing: identityPairing(4),
      options: { groupBy: ["day"], timeZone: "UTC" },
    });
    expect(utc.summary.groups.day!.map((g) => g.pairs)).toEqual([2, 1, 1]);
  });

  it("computeAudit -- groups by an attribute only the survey has", () => {
    const { planted, survey } = handField();
    const surveyed = {
      ...survey,
      attrs: { method: { codes: Int32Array.of(0, 0, 1, 1), values: ["rtk-rover", "total-station"] } },
    };
    const { summary } = computeAudit({
      planted,
      survey: surveyed,
      pairing: identityPairing(4),
      options: { groupBy: ["method"] },
    });
    expect(summary.groups.method!.map((g) => g.key)).toEqual(["rtk-rover", "total-station"]);
  });

  it("computeAudit -- along/cross tolerance and bearing", () => {
    const { planted, survey } = handField();
    // rows running east (90°): along = dE, cross = −dN
    const { summary, residuals } = computeAudit({
      planted,
      survey,
      pairing: identityPairing(4),
      options: { rowBearingDeg: 450, toleranceCross: 0.015 },
    });
    expect(summary.rowBearingDeg).toBe(90);
    expect(summary.rowBearingSource).toBe("given");
    expect(Array.from(residuals.cross!).map((v) => Math.round(v * 1e6) / 1e6)).toEqual([-0.02, -0.01, 0.01, 0]);
    expect(Array.from(residuals.withinTolerance!)).toEqual([0, 1, 1, 1]);
    expect(summary.withinTolerance!.limits).toEqual({ radial: null, cross: 0.015, along: null });
  });

  it("computeAudit -- outliers excluded statistics", () => {
    const field = simulateField({ n: 100, seed: 3, biasE: 0, biasN: 0, sigmaE: 0.01, sigmaN: 0.01 });
    field.survey.x[5] += 0.5;
    field.survey.y[60] -= 0.8;
    const { summary, residuals } = computeAudit(field);
    expect(residuals.outlier[5]).toBe(1);
    expect(residuals.outlier[60]).toBe(1);
    const keep = Array.from(residuals.outlier.keys()).filter((i) => residuals.outlier[i] === 0);
    const e = keep.map((i) => residuals.dE[i]);
    const n = keep.map((i) => residuals.dN[i]);
    expect(summary.withoutOutliers!.pairs).toBe(keep.length);
    expect(summary.withoutOutliers!.rmseE).toBeCloseTo(ss.rootMeanSquare(e), 12);
    expect(summary.withoutOutliers!.rmseR).toBeCloseTo(Math.hypot(ss.rootMeanSquare(e), ss.rootMeanSquare(n)), 12);
    expect(summary.withoutOutliers!.r95).toBeCloseTo(
      ss.quantile(
        keep.map((i) => residuals.radial[i]),
        0.95,
      ),
      12,
    );
    expect(summary.withoutOutliers!.rmseR!).toBeLessThan(summary.rmseR!);
    expect(summary.outliers.count).toBe(residuals.outlier.reduce((s, v) => s + v, 0));
  });

  it("computeAudit -- counts of pairing kinds", () => {
    const { planted, survey } = handField();
    const pairing: Pairing = {
      ...makePairing(
        [
          [0, 0],
          [1, 2],
        ],
        { beyond: [1], unmatchedPlanted: [2, 3], unmatchedSurvey: [1], ambiguousSurvey: [3] },
      ),
      method: Uint8Array.of(0, PAIRED_BY_POSITION),
    };
    const { summary } = computeAudit({ planted, survey, pairing });
    expect(summary).toMatchObject({
      pairs: 2,
      unmatchedPlanted: 2,
      unmatchedSurvey: 1,
      ambiguousSurvey: 1,
      pairedBeyondMaxDistance: 1,
      pairedById: 1,
      pairedByPosition: 1,
    });
    expect(summary.notes.map((n) => n.code)).toContain("beyond-max-distance");
  });

  it("computeAudit -- rejects inconsistent input with greppable messages", () => {
    const { planted, survey } = handField();
    expect(() =>
      computeAudit({ planted, survey: { ...survey, crs: "EPSG:32632" }, pairing: identityPairing(4) }),
    ).toThrow("audit: planted (EPSG:32631) and survey (EPSG:32632) tables are not in the same work CRS");
    expect(() => computeAudit({ planted, survey, pairing: makePairing([[0, 9]]) })).toThrow(
      "audit: pair 0 refers to survey row 9",
    );
    const broken = { ...survey, x: survey.x.map((v, i) => (i === 1 ? Number.NaN : v)) };
    expect(() => computeAudit({ planted, survey: broken, pairing: identityPairing(4) })).toThrow(
      "audit: pair 1 (planted row 1, survey row 1) has a non-finite coordinate",
    );
    expect(() =>
      computeAudit({ planted, survey, pairing: identityPairing(4), options: { groupBy: ["cell"] } }),
    ).toThrow('audit: cannot group by "cell": neither planted.csv nor survey.csv has that column');
    expect(() =>
      computeAudit({ planted, survey, pairing: identityPairing(4), options: { groupBy: ["day"], timeZone: "UTC" } }),
    ).toThrow("audit: cannot group by day: planted.csv has no planting time column");
    expect(() =>
      computeAudit({ planted, survey, pairing: identityPairing(4), options: { toleranceAlong: 0.02 } }),
    ).toThrow("audit: invalid options");
    const short = { ...identityPairing(4), method: new Uint8Array(3) };
    expect(() => computeAudit({ planted, survey, pairing: short })).toThrow("audit: pairing arrays differ in length");
  });

  it("computeAudit -- inputs not mutated; residual arrays are copies", () => {
    const field = simulateField({ n: 50, seed: 8, biasE: 0.01, biasN: 0, sigmaE: 0.01, sigmaN: 0.01 });
    const time = Float64Array.from({ length: 50 }, (_, i) => Date.UTC(2025, 4, 12, 20 + (i % 6), 0));
    const planted = {
      ...field.planted,
      time,
      rawX: field.planted.x.map((v) => v + 0.02),
      rawY: field.planted.y.slice(),
    };
    const options = {
      toleranceRadial: 0.03,
      rowBearingDeg: 12,
      groupBy: ["arm" as const, "day" as const],
      timeZone: "Europe/Amsterdam",
    };
    const before = snapshot({ planted, survey: field.survey, pairing: field.pairing, options });
    const { residuals } = computeAudit({ planted, survey: field.survey, pairing: field.pairing, options });
    expect({ planted, survey: field.survey, pairing: field.pairing, options }).toEqual(before);
    residuals.plantedIndex[0] = 99;
    residuals.method[0] = 7;
    expect(field.pairing.plantedIndex[0]).toBe(0);
    expect(field.pairing.method[0]).toBe(before.pairing.method[0]);
  });

  it("computeAudit -- every summary key is documented in SUMMARY.md", () => {
    const field = simulateField({ n: 60, seed: 4, biasE: 0.01, biasN: 0, sigmaE: 0.01, sigmaN: 0.01 });
    const planted = { ...field.planted, rawX: field.planted.x.slice(), rawY: field.planted.y.slice() };
    const { summary } = computeAudit({
      planted,
      survey: field.survey,
      pairing: field.pairing,
      options: { toleranceRadial: 0.03, rowBearingDeg: 0, groupBy: ["arm"] },
    });
    const doc = readFileSync(path.join(import.meta.dirname, "SUMMARY.md"), "utf8");
    const keys = new Set<string>();
    const walk = (v: unknown) => {
      if (v === null || typeof v !== "object") return;
      if (Array.isArray(v)) return v.forEach(walk);
      for (const [k, child] of Object.entries(v)) {
        keys.add(k);
        walk(child);
      }
    };
    walk(summary satisfies AuditSummary);
    for (const k of keys) expect(doc, `SUMMARY.md lacks \`${k}\``).toContain(`\`${k}\``);
  });
});
